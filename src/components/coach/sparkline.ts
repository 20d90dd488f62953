export interface SparklineBox {
  width: number
  height: number
  /** Room kept free around the line so the stroke and end dot are not clipped. */
  padding: number
}

export const SPARKLINE_BOX: SparklineBox = { width: 96, height: 28, padding: 3 }

/**
 * Screen coordinates of a series of values, oldest first: x spread evenly, the largest value at
 * the top (SVG y grows downwards). A flat series sits in the middle; a single value too.
 */
export function sparklinePoints(values: readonly number[], box: SparklineBox = SPARKLINE_BOX): Array<{ x: number; y: number }> {
  if (values.length === 0) return []
  const min = Math.min(...values)
  const max = Math.max(...values)
  const innerW = box.width - 2 * box.padding
  const innerH = box.height - 2 * box.padding
  const step = values.length > 1 ? innerW / (values.length - 1) : 0
  const round = (n: number) => Math.round(n * 100) / 100
  return values.map((value, i) => ({
    x: round(values.length > 1 ? box.padding + i * step : box.width / 2),
    y: round(max === min ? box.height / 2 : box.padding + ((max - value) / (max - min)) * innerH),
  }))
}

/** An SVG path "M x y L x y ..." through the points; empty for no values. */
export function sparklinePath(values: readonly number[], box: SparklineBox = SPARKLINE_BOX): string {
  return sparklinePoints(values, box)
    .map((p, i) => `${i === 0 ? 'M' : 'L'}${p.x} ${p.y}`)
    .join(' ')
}
