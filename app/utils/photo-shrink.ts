// Phone photos are downscaled on the phone before they are queued: a 12-megapixel JPEG becomes a few
// hundred kilobytes, which is what a crew lead's data plan and IndexedDB can carry.
export interface ShrunkPhoto { bytes: ArrayBuffer, type: string, width: number, height: number }

export async function shrinkPhoto(file: File, longEdge = 2048): Promise<ShrunkPhoto> {
  let bitmap: ImageBitmap
  try {
    // 'from-image' turns a portrait photo upright by its EXIF orientation before it is redrawn.
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' })
  }
  catch {
    // A format this browser cannot decode: queue it as it is, and the server says whether it can read it.
    return { bytes: await file.arrayBuffer(), type: file.type || 'application/octet-stream', width: 0, height: 0 }
  }
  const scale = Math.min(1, longEdge / Math.max(bitmap.width, bitmap.height))
  const width = Math.round(bitmap.width * scale)
  const height = Math.round(bitmap.height * scale)
  const canvas = document.createElement('canvas')
  canvas.width = width
  canvas.height = height
  canvas.getContext('2d')?.drawImage(bitmap, 0, 0, width, height)
  bitmap.close()
  const blob = await new Promise<Blob | null>(resolve => canvas.toBlob(resolve, 'image/jpeg', 0.85))
  if (!blob) return { bytes: await file.arrayBuffer(), type: file.type, width: 0, height: 0 }
  return { bytes: await blob.arrayBuffer(), type: 'image/jpeg', width, height }
}

/** PUT with upload progress (fetch cannot report it). */
export function uploadWithProgress(url: string, bytes: ArrayBuffer, type: string, onProgress: (sent: number) => void): Promise<{ status: number, retryAfter?: number, message?: string }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest()
    xhr.open('PUT', url)
    xhr.setRequestHeader('content-type', type)
    xhr.upload.onprogress = event => onProgress(event.loaded)
    xhr.onerror = () => reject(new Error('network'))
    xhr.ontimeout = () => reject(new Error('timeout'))
    xhr.onload = () => {
      let message: string | undefined
      try {
        message = (JSON.parse(xhr.responseText) as { statusMessage?: string }).statusMessage
      }
      catch { /* not JSON */ }
      resolve({ status: xhr.status, retryAfter: Number(xhr.getResponseHeader('retry-after')) || undefined, message })
    }
    xhr.send(bytes)
  })
}

/** One sender across tabs where Web Locks exist; elsewhere this tab just sends. */
export async function exclusively(work: () => Promise<void>): Promise<void> {
  if (!navigator.locks) return await work()
  await navigator.locks.request('tamp-outbox-sender', { ifAvailable: true }, async (lock) => {
    if (lock) await work()
  })
}
