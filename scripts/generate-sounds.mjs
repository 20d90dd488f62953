#!/usr/bin/env node
/**
 * Synthesises the rest clock's two cues (original sounds, no samples) and writes them as
 * 22,050 Hz mono 16-bit PCM WAV files to public/sounds/:
 *   rest-over.wav  "rest is over": a two-tone chime, 880 Hz then 1320 Hz, about 0.5 s
 *   rest-soon.wav  "10 s left":    one soft 660 Hz blip, about 0.15 s
 * Each tone has a short fade in and a longer fade out, so nothing clicks. Plain Node, no dependencies.
 * Run: node scripts/generate-sounds.mjs
 */
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

const RATE = 22050
const OUT = join(dirname(fileURLToPath(import.meta.url)), '..', 'public', 'sounds')

/** One tone: sine with a quieter octave overtone, linear fade in, exponential-ish fade out. */
function tone(freq, seconds, { gain = 0.6, fadeIn = 0.008, fadeOut = 0.12 } = {}) {
  const n = Math.round(seconds * RATE)
  const out = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const t = i / RATE
    const attack = Math.min(1, t / fadeIn)
    const release = Math.min(1, (seconds - t) / fadeOut)
    const envelope = attack * release * release
    out[i] = gain * envelope * (Math.sin(2 * Math.PI * freq * t) + 0.25 * Math.sin(4 * Math.PI * freq * t)) / 1.25
  }
  return out
}

function concat(...parts) {
  const out = new Float64Array(parts.reduce((n, p) => n + p.length, 0))
  let offset = 0
  for (const p of parts) {
    out.set(p, offset)
    offset += p.length
  }
  return out
}

const silence = (seconds) => new Float64Array(Math.round(seconds * RATE))

function wav(samples) {
  const data = Buffer.alloc(samples.length * 2)
  samples.forEach((s, i) => data.writeInt16LE(Math.round(Math.max(-1, Math.min(1, s)) * 32767), i * 2))
  const header = Buffer.alloc(44)
  header.write('RIFF', 0)
  header.writeUInt32LE(36 + data.length, 4)
  header.write('WAVE', 8)
  header.write('fmt ', 12)
  header.writeUInt32LE(16, 16) // fmt chunk size
  header.writeUInt16LE(1, 20) // PCM
  header.writeUInt16LE(1, 22) // mono
  header.writeUInt32LE(RATE, 24)
  header.writeUInt32LE(RATE * 2, 28) // byte rate
  header.writeUInt16LE(2, 32) // block align
  header.writeUInt16LE(16, 34) // bits per sample
  header.write('data', 36)
  header.writeUInt32LE(data.length, 40)
  return Buffer.concat([header, data])
}

mkdirSync(OUT, { recursive: true })
const restOver = concat(tone(880, 0.22, { gain: 0.7 }), silence(0.03), tone(1320, 0.27, { gain: 0.7, fadeOut: 0.18 }))
const restSoon = tone(660, 0.15, { gain: 0.35, fadeIn: 0.01, fadeOut: 0.08 })
writeFileSync(join(OUT, 'rest-over.wav'), wav(restOver))
writeFileSync(join(OUT, 'rest-soon.wav'), wav(restSoon))
console.log(`Wrote rest-over.wav (${restOver.length} samples) and rest-soon.wav (${restSoon.length} samples) to ${OUT}`)
