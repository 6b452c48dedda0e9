// Motif limits and list sorts, kept apart from the zod schemas so the app can read them
// without loading zod (validation runs on the server).

/** Size limits of a stored motif (the same as a chart made from a picture). */
export const MOTIF_LIMITS = Object.freeze({ maxWidth: 200, maxHeight: 500 })

/** Picture uploads: at most 5 MB, at most 4096 × 4096 pixels, PNG, JPEG or WebP (checked by the bytes). */
export const PICTURE_UPLOAD = Object.freeze({
  maxBytes: 5 * 1024 * 1024,
  maxSide: 4096,
  types: ['image/png', 'image/jpeg', 'image/webp'] as const,
})

/** The most text an import may carry (a 200 × 500 chart as CSV is about 200 KB). */
export const MAX_IMPORT_CHARS = 512 * 1024

/** How the motif library may be sorted. */
export const motifSorts = ['name', 'updatedAt', 'width', 'height', 'longest'] as const
export type MotifSort = typeof motifSorts[number]
