/*
 * Chart colours come from the theme's CSS variables at draw time, so a dark system theme
 * (ink background, chalk text) gets light lines and grid. Fallbacks are the light palette.
 */
export interface ChartColors {
  /** Lines and text: --van-text-color (ink in light, chalk in dark). */
  ink: string
  amber: string
  moss: string
  brick: string
  grid: string
  muted: string
}

const FALLBACK: ChartColors = {
  ink: '#12343b',
  amber: '#f2a541',
  moss: '#4f7942',
  brick: '#c8553d',
  grid: '#ddd7c7',
  muted: '#5a676a',
}

export function readChartColors(root: Element = document.documentElement): ChartColors {
  const style = getComputedStyle(root)
  const read = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback
  return {
    ink: read('--van-text-color', FALLBACK.ink),
    amber: read('--amber', FALLBACK.amber),
    moss: read('--moss', FALLBACK.moss),
    brick: read('--brick', FALLBACK.brick),
    grid: read('--van-border-color', FALLBACK.grid),
    muted: read('--chalkline-muted-text', FALLBACK.muted),
  }
}

/** The series colours in order: ink, amber, moss, brick, then round again. */
export function seriesColor(colors: ChartColors, index: number): string {
  const order = [colors.ink, colors.amber, colors.moss, colors.brick]
  return order[index % order.length]!
}

/** "#12343b" at an opacity, as rgba(); other colour forms are returned unchanged. */
export function withAlpha(color: string, alpha: number): string {
  const hex = /^#([0-9a-f]{6})$/i.exec(color.trim())?.[1]
  if (!hex) return color
  const [r, g, b] = [0, 2, 4].map((i) => parseInt(hex.slice(i, i + 2), 16))
  return `rgba(${r}, ${g}, ${b}, ${alpha})`
}

/**
 * The axes every dated line chart shares: time along x (short dates), a load along y with its
 * unit in the title, grid and ticks in the theme's colours.
 */
export function datedLoadScales(colors: ChartColors, yTitle: string, formatDate: (ms: number) => string) {
  return {
    x: {
      type: 'linear' as const,
      grid: { color: colors.grid },
      ticks: { color: colors.muted, maxTicksLimit: 6, callback: (value: string | number) => formatDate(Number(value)) },
    },
    y: {
      grid: { color: colors.grid },
      ticks: { color: colors.muted },
      title: { display: true, text: yTitle, color: colors.muted },
    },
  }
}
