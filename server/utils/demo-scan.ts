import { fitLattice } from '#shared/lattice/fit'
import { latticeFromSurface, siteAt } from '#shared/lattice/lattice'
import { mulberry32, syntheticScan } from '#shared/scan/synthetic'

// The demo's topograph (invented data for the demo only): cobalt adatoms scattered over fcc
// hollows of Ag(111), imaged 30.7 × 30.7 nm with noise, a slight tilt and line offsets, as a
// night's starting scan might look. Fixed seed: the same picture on every fresh database.
export function demoTopograph() {
  const rand = mulberry32(2026)
  const lattice = latticeFromSurface('Ag(111)', 'fcc', { origin: [15.32, 15.41], rotation_deg: 7.5 })
  const size_nm = 30.72
  const taken = new Set<string>()
  const atoms: { x_nm: number, y_nm: number, height_nm: number }[] = []
  while (atoms.length < 64) {
    const i = Math.round((rand() - 0.5) * 110)
    const j = Math.round((rand() - 0.5) * 110)
    const [x, y] = siteAt(lattice, i, j)
    if (x < 1.5 || y < 1.5 || x > size_nm - 1.5 || y > size_nm - 1.5) continue
    if (atoms.some(a => Math.hypot(a.x_nm - x, a.y_nm - y) < 1.6) || taken.has(`${i},${j}`)) continue
    taken.add(`${i},${j}`)
    atoms.push({ x_nm: x, y_nm: y, height_nm: 0.075 + 0.01 * rand() })
  }
  const scan = syntheticScan({
    width: 512, height: 512, pixel_nm: size_nm / 512, atoms, fwhm_nm: 0.85,
    noise_nm: 0.003, tilt: { dz_dx: 0.004, dz_dy: -0.002 }, line_offset_nm: 0.006, seed: 7,
  })
  // Marks as a detection would give them: each within a few pm of its adatom.
  const marks = atoms.map(a => ({ ...a, x_nm: a.x_nm + 0.008 * (rand() - 0.5), y_nm: a.y_nm + 0.008 * (rand() - 0.5) }))
  const fit = fitLattice({ surface: 'Ag(111)', site: 'fcc', marks: marks.map(a => [a.x_nm, a.y_nm]), affine: true })
  return { scan, atoms, marks, fit, size_nm }
}

/** The morning after-scan of the demo: the adatoms where the night left them, imaged the same way. */
export function demoAfterScan(positions: [number, number][], size_nm: number) {
  const atoms = positions.map(([x, y], k) => ({ x_nm: x, y_nm: y, height_nm: 0.075 + 0.01 * ((k * 7919) % 11) / 11 }))
  const scan = syntheticScan({
    width: 512, height: 512, pixel_nm: size_nm / 512, atoms, fwhm_nm: 0.85,
    noise_nm: 0.003, tilt: { dz_dx: -0.003, dz_dy: 0.002 }, line_offset_nm: 0.006, seed: 8,
  })
  const fit = fitLattice({ surface: 'Ag(111)', site: 'fcc', marks: positions, affine: true })
  return { scan, atoms, fit }
}
