import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'

// WCAG 2.2, 1.4.3 Contrast (Minimum): 4.5:1 for normal text.
// Vitest runs from the repository root.
const css = readFileSync(resolve(process.cwd(), 'src/styles/theme.css'), 'utf8')
// Relative luminance and contrast ratio as defined in WCAG 2.2 ("relative luminance").

function declarations(block: string): Record<string, string> {
  const vars: Record<string, string> = {}
  for (const match of block.matchAll(/(--[\w-]+)\s*:\s*([^;]+);/g)) vars[match[1]] = match[2].trim()
  return vars
}

const darkStart = css.indexOf('@media (prefers-color-scheme: dark)')
const light = declarations(css.slice(0, darkStart))
const dark = { ...light, ...declarations(css.slice(darkStart)) }

function resolveVar(vars: Record<string, string>, name: string): string {
  const value = vars[name]
  if (value === undefined) throw new Error(`${name} is not set in theme.css`)
  const reference = /^var\((--[\w-]+)\)$/.exec(value)
  return reference ? resolveVar(vars, reference[1]) : value
}

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const channel = parseInt(hex.slice(i, i + 2), 16) / 255
    return channel <= 0.04045 ? channel / 12.92 : ((channel + 0.055) / 1.055) ** 2.4
  })
  return 0.2126 * r + 0.7152 * g + 0.0722 * b
}

function contrast(a: string, b: string): number {
  const [high, low] = [luminance(a), luminance(b)].sort((x, y) => y - x)
  return (high + 0.05) / (low + 0.05)
}

const TEXT_PAIRS: [foreground: string, background: string][] = [
  ['--van-text-color', '--van-background'],
  ['--van-text-color', '--van-background-2'],
  ['--van-text-color-2', '--van-background'],
  ['--van-text-color-2', '--van-background-2'],
  ['--van-text-color-3', '--van-background-2'],
  ['--van-button-primary-color', '--van-primary-color'],
  ['--van-button-warning-color', '--van-warning-color'],
  ['--van-button-danger-color', '--van-button-danger-background'],
  ['--van-field-error-message-color', '--van-background-2'],
  ['--chalkline-error-text', '--chalkline-card-background'],
  ['--chalkline-muted-text', '--van-background'],
  ['--van-tabbar-item-text-color', '--van-tabbar-background'],
  ['--van-tabbar-item-active-color', '--van-tabbar-item-active-background'],
]

describe('theme.css text contrast', () => {
  it('keeps the palette colours the product asked for', () => {
    expect(light['--van-primary-color']).toBe('#12343b')
    expect(light['--van-background']).toBe('#f2efe6')
    expect(light['--van-warning-color']).toBe('#f2a541')
    expect(light['--van-danger-color']).toBe('#c8553d')
    expect(light['--van-success-color']).toBe('#4f7942')
    expect(dark['--van-background']).toBe('#12343b')
    expect(dark['--van-text-color']).toBe('#f2efe6')
  })

  for (const [themeName, vars] of [
    ['light', light],
    ['dark', dark],
  ] as const) {
    it.each(TEXT_PAIRS)(`${themeName}: %s on %s reaches 4.5:1`, (foreground, background) => {
      expect(contrast(resolveVar(vars, foreground), resolveVar(vars, background))).toBeGreaterThanOrEqual(4.5)
    })
  }
})
