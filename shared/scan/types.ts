// Plain data shapes of the scan core: a row-major height grid (row 0 is the top scan line) and
// what a decoder reports about the file it read.

/** A row-major grid of samples; `data[r * width + c]` is column c of scan line r (row 0 at the top). */
export interface Grid {
  width: number
  height: number
  data: Float32Array
}

/** Like Grid, but accepts any numeric array (e.g. a JSON number[] or a Float64Array). */
export interface GridLike {
  width: number
  height: number
  data: ArrayLike<number>
}

export type ScanFormat = 'png' | 'tiff' | 'jpeg' | 'text'

/**
 * A decoded scan before any height scale is applied. Integer images carry raw grey levels
 * (`valueUnit: 'level'`); float TIFFs and numeric text grids carry heights in nm (`'nm'`).
 */
export interface RawScan extends Grid {
  format: ScanFormat
  /** Bits per stored sample (8/16/32 for images; 32 for text, which is stored as Float32). */
  bitDepth: number
  sampleType: 'uint' | 'int' | 'float'
  valueUnit: 'level' | 'nm'
  /** How colour channels became one value: 'none' for grey files, 'luma-bt601' for RGB(A). */
  reduction: 'none' | 'luma-bt601'
  /** Smallest and largest level the format can hold (integer images only). */
  levelRange?: [number, number]
}

/** Pixel size in nm: one number for square pixels, or [px, py]. */
export type PixelSize = number | readonly [number, number]
