// Answers of 1 KB or more (JSON, pages) go compressed, brotli or gzip as the phone accepts: a crew
// lead on one bar of signal downloads a fraction of the bytes. The maintained `compression`
// middleware decides by Accept-Encoding and content type, so photos (JPEG) go as they are. The
// build's own files are precompressed at build time and served by Nitro before this runs
// (nitro.compressPublicAssets in nuxt.config.ts).
import compression from 'compression'
import { constants } from 'node:zlib'

// Brotli at quality 4 costs about what gzip's default does, and compresses JSON better. An error page
// is rendered by Nuxt through an internal request to /__nuxt_error whose body it copies as text: that
// inner answer must stay plain (compressed, the page arrived empty); the outer one is compressed.
const compress = compression({
  threshold: 1024,
  brotli: { params: { [constants.BROTLI_PARAM_QUALITY]: 4 } },
  filter: (req, res) => !req.url?.startsWith('/__nuxt_error') && compression.filter(req, res),
})

// Its types name Express's request and response; it uses only what Node's own have.
type CompressArgs = Parameters<typeof compress>
export default fromNodeMiddleware((req, res, next) =>
  compress(req as unknown as CompressArgs[0], res as unknown as CompressArgs[1], error => next(error instanceof Error ? error : undefined)))
