/** Where a photo's two sizes live in the photo storage (unstorage keys use ':' as the separator). */
export function photoKeys(organisationId: string, photoId: string): { display: string, thumb: string } {
  return {
    display: `${organisationId}:${photoId}:display.jpg`,
    thumb: `${organisationId}:${photoId}:thumb.jpg`,
  }
}

/** Long edge of the two sizes the server keeps. */
export const photoSizes = { display: 1600, thumb: 400 } as const

/** Where the app fetches a photo's two sizes (server/api/photos/[id]/[size].get.ts). */
export function photoUrls(photoId: string): { thumbUrl: string, displayUrl: string } {
  return { thumbUrl: `/api/photos/${photoId}/thumb`, displayUrl: `/api/photos/${photoId}/display` }
}
