// Luma from gamma-encoded R′G′B′: Y′ = 0.299 R′ + 0.587 G′ + 0.114 B′ (ITU-R BT.601, also the
// JPEG/JFIF definition). For grey pixels stored as RGB (R = G = B) it returns the grey value.

export function lumaBt601(r: number, g: number, b: number): number {
  return 0.299 * r + 0.587 * g + 0.114 * b
}
