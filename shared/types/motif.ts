import type { FloatVerdict } from '#shared/engine'

/** What a stored motif keeps about its floats, recomputed whenever its cells change. */
export interface MotifFloatReport {
  maxFloat: [number, number]
  verdict: FloatVerdict
  longRows: number[]
  unusedRows: [number[], number[]] // per yarn: chart rows where it knits no stitch
}

/** Someone named on a motif (who made it, who changed it last). */
export interface MotifPerson { id: number; name: string }

/**
 * A motif in the library list (`GET /api/motifs`).
 * `thumbnail` is a `data:image/png;base64,…` URL with one pixel per stitch, top row of the
 * picture = last row knitted (as a drawn chart is read); scale it up with
 * `image-rendering: pixelated`. Main colour is light, contrast colour dark.
 */
export interface MotifListItem {
  id: number
  name: string
  width: number
  height: number
  published: boolean
  verdict: FloatVerdict | null
  maxFloat: [number, number] | null
  thumbnail: string
  updatedBy: MotifPerson | null
  updatedAt: string
}

/** One page of the library: `total` counts every motif matching the filters. */
export interface MotifPage {
  items: MotifListItem[]
  total: number
  page: number
  pageSize: number
}

/** A whole motif (`GET /api/motifs/:id`, and the answer of every route that makes or changes one). */
export interface MotifDetail {
  id: number
  studioId: number
  name: string
  width: number
  height: number
  /** chartToRows format: rows[0] is the first row knitted, '.' main and 'x' contrast. */
  rows: string[]
  published: boolean
  floatReport: MotifFloatReport | null
  /** The original picture the motif was made from, if any (`GET /api/motifs/:id/picture`). */
  picture: { url: string } | null
  createdBy: MotifPerson | null
  updatedBy: MotifPerson | null
  createdAt: string
  updatedAt: string
  /**
   * Bumped by every change. Send it back with a change (`version` in the PATCH body or
   * `If-Match: "<version>"`): if the motif has moved on since, the answer is a 409 whose
   * `data.current` is the motif as it is now, and nothing is saved.
   */
  version: number
}

/** `POST /api/motifs/picture-preview`: the chart a picture would make, nothing stored. */
export interface PicturePreview {
  width: number
  height: number
  /** The threshold used: the one asked for, or Otsu's. */
  threshold: number
  /** Otsu's threshold for this picture at this size, whatever was asked for. */
  otsu: number
  rows: string[]
}

/** Our own motif file (`GET /api/motifs/:id/export?format=json`, `POST /api/motifs/import`). */
export interface MotifFile {
  format: 'floatwise-motif'
  version: 1
  name: string
  width: number
  height: number
  /** rows[0] is the first row knitted; '0' or '.' main, '1' or 'x' contrast (we write '0'/'1'). */
  rows: string[]
}
