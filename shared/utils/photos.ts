/** Where a photo's two sizes live in the photo storage (unstorage keys use ':' as the separator). */
export function photoKeys(organisationId: string, photoId: string): { display: string, thumb: string } {
  return {
    display: `${organisationId}:${photoId}:display.jpg`,
    thumb: `${organisationId}:${photoId}:thumb.jpg`,
  }
}

/** Long edge of the two sizes the server keeps. */
export const photoSizes = { display: 1600, thumb: 400 } as const
