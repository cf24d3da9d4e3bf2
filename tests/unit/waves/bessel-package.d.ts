// Types for the npm `bessel` package (SheetJS, 1.0.2), used only as an independent cross-check.
declare module 'bessel' {
  export function besselj(x: number, n: number): number
  export function bessely(x: number, n: number): number
  export function besseli(x: number, n: number): number
  export function besselk(x: number, n: number): number
}
