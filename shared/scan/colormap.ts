// Colour maps as 256-entry sRGB lookup tables. Besides plain grey, two maps of our own built in
// OKLCH (Ottosson's OKLab in polar form): lightness L rises linearly with the index, hue turns
// monotonically, chroma follows a smooth arch scaled to stay inside the sRGB gamut at every L.
import { InputError } from '../errors'
import { linearToSrgb, oklabToLinearSrgb, oklchToOklab } from './oklab'

export type ColormapName = 'grey' | 'kiln' | 'fjord'

export interface OklchRamp {
  /** Lightness at index 0 and at index 255. */
  L0: number
  L1: number
  /** Hue in degrees at index 0 and at 255 (may run past 360; the turn is monotonic). */
  h0_deg: number
  h1_deg: number
  label: string
}

export const COLORMAP_RAMPS: Readonly<Record<Exclude<ColormapName, 'grey'>, OklchRamp>> = {
  // Warm: deep plum through crimson and orange to pale cream.
  kiln: { L0: 0.2, L1: 0.96, h0_deg: 300, h1_deg: 460, label: 'Kiln (plum → cream)' },
  // Cool: midnight blue through teal to pale mint.
  fjord: { L0: 0.2, L1: 0.96, h0_deg: 280, h1_deg: 150, label: 'Fjord (midnight → mint)' },
}

export const COLORMAP_NAMES: readonly ColormapName[] = ['grey', 'kiln', 'fjord']

const N = 256

// Chroma arch: never zero at the ends so the darkest and lightest entries keep a tint.
function chromaShape(t: number): number {
  return Math.sin(Math.PI * (0.08 + 0.84 * t)) ** 0.9
}

function inGamut(L: number, C: number, h: number): boolean {
  const rgb = oklabToLinearSrgb(oklchToOklab(L, C, h))
  return rgb[0] >= -1e-9 && rgb[0] <= 1 + 1e-9 && rgb[1] >= -1e-9 && rgb[1] <= 1 + 1e-9 && rgb[2] >= -1e-9 && rgb[2] <= 1 + 1e-9
}

/** Largest chroma at (L, h) that sRGB can show, by bisection. */
export function maxChroma(L: number, h_deg: number): number {
  let lo = 0
  let hi = 0.5
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2
    if (inGamut(L, mid, h_deg)) lo = mid
    else hi = mid
  }
  return lo
}

/** Builds the 256 × RGB table of an OKLCH ramp. */
export function buildOklchLut(ramp: OklchRamp): Uint8Array {
  const at = (i: number) => {
    const t = i / (N - 1)
    return { t, L: ramp.L0 + (ramp.L1 - ramp.L0) * t, h: ramp.h0_deg + (ramp.h1_deg - ramp.h0_deg) * t }
  }
  // One scale for the whole arch (3 % margin) keeps chroma smooth instead of clipping per entry.
  let scale = Number.POSITIVE_INFINITY
  for (let i = 0; i < N; i++) {
    const { t, L, h } = at(i)
    scale = Math.min(scale, (0.97 * maxChroma(L, h)) / chromaShape(t))
  }
  const lut = new Uint8Array(N * 3)
  for (let i = 0; i < N; i++) {
    const { t, L, h } = at(i)
    const rgb = oklabToLinearSrgb(oklchToOklab(L, scale * chromaShape(t), h))
    for (let k = 0; k < 3; k++) lut[i * 3 + k] = Math.round(255 * linearToSrgb(Math.min(1, Math.max(0, rgb[k]!))))
  }
  return lut
}

function greyLut(): Uint8Array {
  const lut = new Uint8Array(N * 3)
  for (let i = 0; i < N; i++) lut.fill(i, i * 3, i * 3 + 3)
  return lut
}

// Built once at load (a few hundred bisections, well under a millisecond each) and never mutated.
const LUTS: Readonly<Record<ColormapName, Uint8Array>> = {
  grey: greyLut(),
  kiln: buildOklchLut(COLORMAP_RAMPS.kiln),
  fjord: buildOklchLut(COLORMAP_RAMPS.fjord),
}

export function isColormapName(name: unknown): name is ColormapName {
  return typeof name === 'string' && (COLORMAP_NAMES as readonly string[]).includes(name)
}

/** The shared table (read-only by convention; use colormapLut for a copy you may change). */
export function lutFor(name: ColormapName): Uint8Array {
  if (!isColormapName(name)) throw new InputError('colormap', `unknown colour map "${String(name)}"; choose one of ${COLORMAP_NAMES.join(', ')}`)
  return LUTS[name]
}

/** A copy of the 256 × RGB table (index·3 + channel) of a colour map. */
export function colormapLut(name: ColormapName): Uint8Array {
  return lutFor(name).slice()
}
