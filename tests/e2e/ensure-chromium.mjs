// Runs before `npm test`: the browser tests need Debian's Chromium (never a downloaded browser).
// Installs it with apt-get when we are root, otherwise stops with the exact command to run.
import { execSync, spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'
const installCommand = 'sudo apt-get update && sudo apt-get install -y chromium'

if (existsSync(chromium)) process.exit(0)

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0
const hasAptGet = spawnSync('sh', ['-c', 'command -v apt-get'], { stdio: 'ignore' }).status === 0
if (isRoot && hasAptGet) {
  console.log(`Chromium is missing at ${chromium}: installing Debian's chromium package for the browser tests (about a minute)...`)
  execSync('apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium', { stdio: 'inherit' })
  if (existsSync(chromium)) process.exit(0)
}
console.error(
  `The browser tests need Chromium at ${chromium} and it is not there.\n` +
    `Install it with:\n\n  ${installCommand}\n\n` +
    'or point CHROMIUM_PATH at a Chromium binary. The browser tests are never skipped.',
)
process.exit(1)
