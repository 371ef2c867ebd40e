// Images like the ones phones send, and the bad ones they sometimes send, made with sharp in memory.
import sharp from 'sharp'

export interface PhoneJpegOptions {
  /** Stored pixel size, before the EXIF orientation turns it. */
  width: number
  height: number
  /** EXIF orientation: 6 is a phone held upright (the sensor's landscape pixels turned 90° clockwise). */
  orientation?: number
  /** EXIF DateTimeOriginal, 'YYYY:MM:DD HH:MM:SS' in the phone's local time. */
  dateTimeOriginal?: string
  /** EXIF OffsetTimeOriginal, e.g. '-05:00'. */
  offsetTimeOriginal?: string
}

/**
 * A phone JPEG: the top half red and the bottom half blue as stored, so that the side each ends up on
 * shows which way the server turned it; with an orientation, a capture time and a GPS position in EXIF.
 */
export async function phoneJpeg(options: PhoneJpegOptions): Promise<Buffer> {
  const { width, height } = options
  const blue = await sharp({ create: { width, height: Math.ceil(height / 2), channels: 3, background: '#0000ff' } }).png().toBuffer()
  const exif = {
    IFD0: { Make: 'Fixture', Model: 'Phone' },
    IFD2: {
      ...(options.dateTimeOriginal ? { DateTimeOriginal: options.dateTimeOriginal } : {}),
      ...(options.offsetTimeOriginal ? { OffsetTimeOriginal: options.offsetTimeOriginal } : {}),
    },
    // Where the crew stood: what must never leave the server with the photo.
    IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '40/1 26/1 4600/100', GPSLongitudeRef: 'W', GPSLongitude: '79/1 58/1 5600/100' },
  }
  return await sharp({ create: { width, height, channels: 3, background: '#ff0000' } })
    .composite([{ input: blue, top: Math.floor(height / 2), left: 0 }])
    .jpeg({ quality: 85 })
    .withMetadata({ orientation: options.orientation ?? 1 })
    .withExifMerge(exif)
    .toBuffer()
}

/** A JPEG cut off halfway, as when a phone loses signal mid-upload and sends what it had. */
export async function truncatedJpeg(): Promise<Buffer> {
  const whole = await phoneJpeg({ width: 800, height: 600 })
  return whole.subarray(0, Math.floor(whole.length / 2))
}

/** A small PNG (e.g. a screenshot of a delivery ticket), with transparency. */
export async function screenshotPng(width = 600, height = 900): Promise<Buffer> {
  return await sharp({ create: { width, height, channels: 4, background: { r: 20, g: 120, b: 40, alpha: 0.5 } } }).png().toBuffer()
}

/** The start of a PDF: what a "ticket.jpg" picked from the files app can really be. */
export function pdfBytes(): Buffer {
  return Buffer.from('%PDF-1.7\n1 0 obj\n<< /Type /Catalog /Pages 2 0 R >>\nendobj\n2 0 obj\n<< /Type /Pages /Kids [] /Count 0 >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n', 'latin1')
}

/**
 * A JPEG of a few hundred bytes whose header declares 30000 × 30000 pixels (900 megapixels): the
 * server must refuse it by its declared size, as decoding it would take gigabytes.
 */
export async function hugeDeclaredJpeg(width = 30000, height = 30000): Promise<Buffer> {
  const bytes = Buffer.from(await sharp({ create: { width: 64, height: 48, channels: 3, background: '#888888' } }).jpeg().toBuffer())
  // Walk the marker segments to the frame header (SOF0–SOF2): FF Cn, length, precision, height, width.
  for (let at = 2; at + 9 <= bytes.length && bytes[at] === 0xFF;) {
    const marker = bytes[at + 1] ?? 0
    if (marker >= 0xC0 && marker <= 0xC2) {
      bytes.writeUInt16BE(height, at + 5)
      bytes.writeUInt16BE(width, at + 7)
      return bytes
    }
    at += 2 + bytes.readUInt16BE(at + 2)
  }
  throw new Error('no frame header found in the JPEG sharp made')
}
