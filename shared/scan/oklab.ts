// OKLab colour space (B. Ottosson, "A perceptual color space for image processing", 2020,
// bottosson.github.io/posts/oklab — matrices as published there) and the sRGB transfer function
// of IEC 61966-2-1:1999. Channels in [0, 1]; L in [0, 1]; hue in degrees.

export type Vec3 = [number, number, number]

/** sRGB-encoded component → linear light. */
export function srgbToLinear(v: number): number {
  return v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4
}

/** Linear light → sRGB-encoded component. */
export function linearToSrgb(v: number): number {
  return v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055
}

export function linearSrgbToOklab([r, g, b]: Vec3): Vec3 {
  const l = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b)
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b)
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b)
  return [
    0.2104542553 * l + 0.7936177850 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.4285922050 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.8086757660 * s,
  ]
}

export function oklabToLinearSrgb([L, a, b]: Vec3): Vec3 {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3
  const s = (L - 0.0894841775 * a - 1.2914855480 * b) ** 3
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.7076147010 * s,
  ]
}

/** OKLCH (polar OKLab): chroma C and hue h in degrees. */
export function oklchToOklab(L: number, C: number, h_deg: number): Vec3 {
  const h = (h_deg * Math.PI) / 180
  return [L, C * Math.cos(h), C * Math.sin(h)]
}

/** sRGB-encoded [0, 1] triple → OKLab. */
export function srgbToOklab([r, g, b]: Vec3): Vec3 {
  return linearSrgbToOklab([srgbToLinear(r), srgbToLinear(g), srgbToLinear(b)])
}
