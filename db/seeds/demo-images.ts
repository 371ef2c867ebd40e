// Demo pictures drawn with sharp from SVG: no real photos are shipped or used.
import sharp from 'sharp'
import { photoSizes } from '../../shared/utils/photos'

const scenes = {
  lift: { ground: '#8d8576', band: '#6f6a60', label: 'Compacted base lift' },
  ticket: { ground: '#e9e4d6', band: '#c9c1ad', label: 'Delivery ticket' },
} as const

export type DemoScene = keyof typeof scenes

export async function demoImage(scene: DemoScene, caption: string): Promise<{ display: Buffer, thumb: Buffer, width: number, height: number }> {
  const { ground, band, label } = scenes[scene]
  const width = photoSizes.display
  const height = 1200
  const stones = Array.from({ length: 60 }, (_, i) => {
    const x = (i * 137) % width
    const y = 500 + ((i * 89) % 650)
    return `<circle cx="${x}" cy="${y}" r="${6 + (i % 5) * 3}" fill="${band}" />`
  }).join('')
  const escaped = caption.replace(/[<>&]/g, c => ({ '<': '&lt;', '>': '&gt;', '&': '&amp;' })[c] ?? c)
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}">
    <rect width="100%" height="100%" fill="${ground}" />
    <rect y="420" width="100%" height="40" fill="${band}" />
    ${stones}
    <text x="60" y="160" font-size="72" font-family="sans-serif" font-weight="bold" fill="#1f3a2e">${label}</text>
    <text x="60" y="260" font-size="52" font-family="sans-serif" fill="#24211d">${escaped}</text>
    <text x="60" y="1140" font-size="36" font-family="sans-serif" fill="#24211d">Demo image, drawn by Tamp</text>
  </svg>`
  const display = await sharp(Buffer.from(svg)).jpeg({ quality: 80 }).toBuffer()
  const thumb = await sharp(display).resize({ width: photoSizes.thumb }).jpeg({ quality: 75 }).toBuffer()
  return { display, thumb, width, height }
}
