// CRC-32 (ISO 3309 / ITU-T V.42 polynomial 0xEDB88320, reflected), as used by PNG chunks
// (PNG specification, 2nd ed., ISO/IEC 15948, annex D). Table-driven, browser-safe.

const TABLE = (() => {
  const t = new Uint32Array(256)
  for (let n = 0; n < 256; n++) {
    let c = n
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xEDB88320 ^ (c >>> 1) : c >>> 1
    t[n] = c >>> 0
  }
  return t
})()

export function crc32(bytes: Uint8Array, start = 0, end = bytes.length): number {
  let c = 0xFFFFFFFF
  for (let i = start; i < end; i++) c = TABLE[(c ^ bytes[i]!) & 0xFF]! ^ (c >>> 8)
  return (c ^ 0xFFFFFFFF) >>> 0
}
