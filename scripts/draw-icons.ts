// Draws Tamp's app icons from one SVG mark into public/: a plate compactor standing on three
// compacted base lifts, in Tamp's moss, stone and amber. Run it after changing the mark:
//   npx tsx scripts/draw-icons.ts
// The PNGs are committed, so neither the build nor a clone needs sharp's SVG renderer.
import { mkdirSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import sharp from 'sharp'
import { root } from './config'

const moss = '#1f3a2e'
const stone = '#e9e6df'
const stoneDeep = '#c4beb1'
const amber = '#d99a06'

/**
 * The mark in a 320 × 280 box: the machine (engine housing, base plate with its curved nose, handle) in amber on three
 * lifts, each a little wider than the one above, the way a base is built up and compacted.
 */
const mark = `
  <path d="M226 58 L284 14" stroke="${amber}" stroke-width="14" stroke-linecap="round"/>
  <path d="M274 8 L298 26" stroke="${amber}" stroke-width="14" stroke-linecap="round"/>
  <rect x="84" y="4" width="118" height="40" rx="8" fill="${amber}"/>
  <rect x="133" y="44" width="20" height="14" fill="${amber}"/>
  <path d="M58 56 H262 a10 10 0 0 1 10 10 V98 a8 8 0 0 1 -8 8 H58 a30 30 0 0 1 -30 -30 V76 a20 20 0 0 1 20 -20 Z" fill="${amber}"/>
  <rect x="24" y="124" width="272" height="42" rx="6" fill="${stone}"/>
  <rect x="12" y="180" width="296" height="42" rx="6" fill="${stone}" fill-opacity="0.86"/>
  <rect x="0" y="236" width="320" height="44" rx="6" fill="${stoneDeep}"/>
`
const markWidth = 320
const markHeight = 280

interface IconSpec {
  file: string
  size: number
  /** How wide the mark is, as a share of the icon. */
  markShare: number
  /** Rounded corners (a share of the size) for icons shown as they are; 0 for full-bleed ones that the platform masks. */
  cornerShare: number
}

function svg({ size, markShare, cornerShare }: IconSpec): string {
  const scale = (size * markShare) / markWidth
  const x = (size - markWidth * scale) / 2
  const y = (size - markHeight * scale) / 2
  const corner = size * cornerShare
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${size}" height="${size}" viewBox="0 0 ${size} ${size}">
  <rect width="${size}" height="${size}" rx="${corner}" fill="${moss}"/>
  <g transform="translate(${x} ${y}) scale(${scale})">${mark}</g>
</svg>`
}

// The maskable icon's safe zone is a centred circle 40 % of the size in radius
// (https://w3c.github.io/manifest/#icon-masks). The mark's half-diagonal is
// share / 2 × √(1 + (280/320)²) ≈ 0.664 × share, so 0.58 keeps every corner at 38.5 %.
const maskableShare = 0.58

const icons: IconSpec[] = [
  { file: 'icons/tamp-192.png', size: 192, markShare: 0.7, cornerShare: 0.18 },
  { file: 'icons/tamp-512.png', size: 512, markShare: 0.7, cornerShare: 0.18 },
  { file: 'icons/tamp-maskable-512.png', size: 512, markShare: maskableShare, cornerShare: 0 },
  // iOS fills transparency with black and rounds the corners itself: full bleed.
  { file: 'icons/tamp-apple-touch-180.png', size: 180, markShare: 0.66, cornerShare: 0 },
  { file: 'icons/tamp-32.png', size: 32, markShare: 0.78, cornerShare: 0.12 },
]

async function png(spec: IconSpec): Promise<Buffer> {
  // density: render the SVG at its own pixel size, with no resampling afterwards.
  return await sharp(Buffer.from(svg(spec)), { density: 72 }).png({ compressionLevel: 9 }).toBuffer()
}

/** An .ico holding PNG images (allowed since Windows Vista and read by every current browser). */
function ico(images: { size: number, data: Buffer }[]): Buffer {
  const header = Buffer.alloc(6)
  header.writeUInt16LE(0, 0)
  header.writeUInt16LE(1, 2)
  header.writeUInt16LE(images.length, 4)
  const entries: Buffer[] = []
  let offset = 6 + 16 * images.length
  for (const { size, data } of images) {
    const entry = Buffer.alloc(16)
    entry.writeUInt8(size >= 256 ? 0 : size, 0)
    entry.writeUInt8(size >= 256 ? 0 : size, 1)
    entry.writeUInt8(0, 2)
    entry.writeUInt8(0, 3)
    entry.writeUInt16LE(1, 4)
    entry.writeUInt16LE(32, 6)
    entry.writeUInt32LE(data.length, 8)
    entry.writeUInt32LE(offset, 12)
    offset += data.length
    entries.push(entry)
  }
  return Buffer.concat([header, ...entries, ...images.map(i => i.data)])
}

async function main(): Promise<void> {
  const publicDir = resolve(root, 'public')
  mkdirSync(resolve(publicDir, 'icons'), { recursive: true })
  for (const spec of icons) {
    writeFileSync(resolve(publicDir, spec.file), await png(spec))
    console.log(`Tamp: drew public/${spec.file} (${spec.size} px)`)
  }
  const favicon = await Promise.all([16, 32, 48].map(async size => ({
    size,
    data: await png({ file: '', size, markShare: 0.8, cornerShare: 0.12 }),
  })))
  writeFileSync(resolve(publicDir, 'favicon.ico'), ico(favicon))
  console.log('Tamp: drew public/favicon.ico (16, 32 and 48 px)')
}

await main()
