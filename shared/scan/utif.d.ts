// Minimal typings for utif 3.1.0 (photopea/UTIF.js), which the tests use as an independent
// reference TIFF decoder (the app's own decoder is tiff.ts; see there why).
declare module 'utif' {
  /** An image file directory: tags as "t<number>" arrays, plus what decodeImage adds. */
  export interface IFD {
    [tag: `t${number}`]: number[] | undefined
    width?: number
    height?: number
    isLE?: boolean
    data?: Uint8Array
  }
  export function decode(buffer: ArrayBuffer): IFD[]
  export function decodeImage(buffer: ArrayBuffer, ifd: IFD, ifds?: IFD[]): void
  const UTIF: { decode: typeof decode, decodeImage: typeof decodeImage }
  export default UTIF
}
