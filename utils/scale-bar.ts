// A scale bar of a round length (1, 2 or 5 × 10^k nm) close to the wanted on-screen size.
export function niceScaleBar(scale_px_per_nm: number, target_px = 120): { length_nm: number, px: number, label: string } {
  const raw = target_px / scale_px_per_nm
  const pow = 10 ** Math.floor(Math.log10(raw))
  const step = [1, 2, 5, 10].find(m => m * pow >= raw * 0.7) ?? 10
  const length_nm = step * pow
  const label = length_nm >= 1000 ? `${+(length_nm / 1000).toPrecision(3)} µm` : length_nm < 1 ? `${+(length_nm * 10).toPrecision(3)} Å` : `${+length_nm.toPrecision(3)} nm`
  return { length_nm, px: length_nm * scale_px_per_nm, label }
}
