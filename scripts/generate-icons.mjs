// Draws the app icons (our own barbell-and-chalk-line mark) and renders them to PNG with
// Debian's Chromium through playwright-core. Run once after changing the drawing:
//   node scripts/generate-icons.mjs
import { writeFileSync } from 'node:fs'
import { chromium } from 'playwright-core'

/** The mark on a full-bleed square; `padding` keeps it inside the safe zone of maskable icons. */
const mark = (padding) => `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 64 64">
  <rect width="64" height="64" ${padding ? '' : 'rx="14"'} fill="#12343B"/>
  <g transform="translate(${padding} ${padding}) scale(${(64 - 2 * padding) / 64})">
    <rect x="8" y="29" width="48" height="6" rx="3" fill="#F2EFE6"/>
    <rect x="14" y="18" width="7" height="28" rx="2" fill="#F2A541"/>
    <rect x="43" y="18" width="7" height="28" rx="2" fill="#F2A541"/>
    <path d="M10 54c10-3 34-3 44 0" stroke="#F2EFE6" stroke-width="3" stroke-linecap="round" fill="none"/>
  </g>
</svg>`

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
  args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--no-first-run'],
})
const page = await browser.newPage()
for (const [name, size, padding] of [['icon-192.png', 192, 0], ['icon-512.png', 512, 0], ['icon-maskable-512.png', 512, 9]]) {
  await page.setViewportSize({ width: size, height: size })
  await page.setContent(`<html><body style="margin:0">${mark(padding).replace('<svg ', `<svg width="${size}" height="${size}" `)}</body></html>`)
  writeFileSync(`public/icons/${name}`, await page.screenshot({ omitBackground: true }))
}
writeFileSync('public/icons/apple-touch-icon.png', await (async () => {
  await page.setViewportSize({ width: 180, height: 180 })
  await page.setContent(`<html><body style="margin:0">${mark(0).replace('<svg ', '<svg width="180" height="180" ')}</body></html>`)
  return page.screenshot()
})())
await browser.close()
console.log('wrote public/icons/*.png')
