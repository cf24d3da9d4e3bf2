// Block averaging (binning) of a grid by integer factors bx × by: each output sample is the mean of
// a bx × by block. A remainder narrower than one block at the right or bottom edge is dropped.

export function binGrid(src: ArrayLike<number>, w: number, h: number, bx: number, by: number): { data: Float32Array, width: number, height: number } {
  const wb = Math.floor(w / bx)
  const hb = Math.floor(h / by)
  const out = new Float32Array(wb * hb)
  if (bx === 1 && by === 1) {
    for (let i = 0; i < out.length; i++) out[i] = src[i]!
    return { data: out, width: wb, height: hb }
  }
  const row = new Float64Array(wb)
  const inv = 1 / (bx * by)
  for (let R = 0; R < hb; R++) {
    row.fill(0)
    for (let j = 0; j < by; j++) {
      const base = (R * by + j) * w
      for (let C = 0; C < wb; C++) {
        let s = 0
        const b0 = base + C * bx
        for (let i = 0; i < bx; i++) s += src[b0 + i]!
        row[C]! += s
      }
    }
    const ob = R * wb
    for (let C = 0; C < wb; C++) out[ob + C] = row[C]! * inv
  }
  return { data: out, width: wb, height: hb }
}
