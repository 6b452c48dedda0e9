#!/usr/bin/env node
// Makes the knit view's cue sounds (our own, synthesised here) as small WAV files in
// public/sounds/. Run again after changing a tone: `node scripts/make-sounds.mjs`.
import { mkdirSync, writeFileSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

const rate = 22050
const out = join(dirname(fileURLToPath(import.meta.url)), '../public/sounds')

/** A soft bell-like note: a sine with one overtone and a fast attack, slow decay. */
function note(freq, seconds, gain = 0.6) {
  const n = Math.round(seconds * rate)
  const samples = new Float32Array(n)
  for (let i = 0; i < n; i++) {
    const t = i / rate
    const envelope = Math.min(1, t / 0.008) * Math.exp(-t * 5)
    samples[i] = gain * envelope * (Math.sin(2 * Math.PI * freq * t) + 0.3 * Math.sin(4 * Math.PI * freq * t)) / 1.3
  }
  return samples
}

const silence = seconds => new Float32Array(Math.round(seconds * rate))

function join2(...parts) {
  const total = parts.reduce((s, p) => s + p.length, 0)
  const all = new Float32Array(total)
  let o = 0
  for (const p of parts) { all.set(p, o); o += p.length }
  return all
}

function wav(samples) {
  const data = Buffer.alloc(samples.length * 2)
  samples.forEach((s, i) => data.writeInt16LE(Math.round(Math.max(-1, Math.min(1, s)) * 32767), i * 2))
  const header = Buffer.alloc(44)
  header.write('RIFF', 0); header.writeUInt32LE(36 + data.length, 4); header.write('WAVE', 8)
  header.write('fmt ', 12); header.writeUInt32LE(16, 16); header.writeUInt16LE(1, 20); header.writeUInt16LE(1, 22)
  header.writeUInt32LE(rate, 24); header.writeUInt32LE(rate * 2, 28); header.writeUInt16LE(2, 32); header.writeUInt16LE(16, 34)
  header.write('data', 36); header.writeUInt32LE(data.length, 40)
  return Buffer.concat([header, data])
}

const sounds = {
  // Colour change coming: two rising notes, easy to tell from the others.
  'change.wav': join2(note(660, 0.22), note(880, 0.45)),
  // A section starts: three short even notes.
  'section.wav': join2(note(523, 0.12), silence(0.06), note(523, 0.12), silence(0.06), note(523, 0.3)),
  // The piece is done: a falling three-note figure.
  'end.wav': join2(note(880, 0.2), note(698, 0.2), note(523, 0.7)),
}

mkdirSync(out, { recursive: true })
for (const [name, samples] of Object.entries(sounds)) {
  writeFileSync(join(out, name), wav(samples))
  console.log(`public/sounds/${name}: ${(samples.length / rate).toFixed(2)} s`)
}
