// Motif limits and list sorts, kept apart from the zod schemas so the app can read them
// without loading zod (validation runs on the server).

/** Size limits of a stored motif (the same as a chart made from a picture). */
export const MOTIF_LIMITS = Object.freeze({ maxWidth: 200, maxHeight: 500 })

/**
 * Picture uploads: at most 5 MB, at most 4096 pixels a side and 4 megapixels in all, PNG, JPEG
 * or WebP (checked by the bytes). The largest chart is 200 × 500 stitches: 4 megapixels still
 * give each of its 100,000 cells 40 pixels to average, and the cap bounds what one upload may
 * cost to decode (a 30-byte WebP may declare 4096 × 4096, 64 MB of pixels).
 */
export const PICTURE_UPLOAD = Object.freeze({
  maxBytes: 5 * 1024 * 1024,
  maxSide: 4096,
  maxPixels: 4_000_000,
  types: ['image/png', 'image/jpeg', 'image/webp'] as const,
})

/** The most text an import may carry (a 200 × 500 chart as CSV is about 200 KB). */
export const MAX_IMPORT_CHARS = 512 * 1024

/** How the motif library may be sorted. */
export const motifSorts = ['name', 'updatedAt', 'width', 'height', 'longest'] as const
export type MotifSort = typeof motifSorts[number]
