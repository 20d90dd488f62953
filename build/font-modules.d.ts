/* Types for the two font tools the build and its tests use; neither package ships its own. */

declare module 'subset-font' {
  interface SubsetFontOptions {
    targetFormat?: 'sfnt' | 'truetype' | 'woff' | 'woff2'
    preserveNameIds?: number[]
    keepFeatures?: string[]
    noLayoutClosure?: boolean
  }
  /** A font cut down to the glyphs of `text`, in `targetFormat` (default: the input's). */
  export default function subsetFont(font: Buffer, text: string, options?: SubsetFontOptions): Promise<Buffer>
}

declare module 'fontverter' {
  type Format = 'sfnt' | 'truetype' | 'woff' | 'woff2'
  export function detectFormat(font: Buffer): Exclude<Format, 'truetype'>
  export function convert(font: Buffer, to: Format, from?: Format): Promise<Buffer>
}
