import { z } from 'zod'
import { chartFromRows, KnittingInputError } from '#shared/engine'
import { MAX_IMPORT_CHARS, MOTIF_LIMITS, motifSorts } from '#shared/motif/limits'
import { editVersion, idParam, nameSchema } from './common'

// Counts come from queries and form fields as text too: coerced, unlike common's `count`.
const count = (min: number, max: number) => z.coerce.number('must be a number').int('must be a whole number')
  .min(min, `must be at least ${min}`).max(max, `must be at most ${max}`)

/** true/false, also as the text a form field sends ("true", "false", "on", "1", "0"). */
const flag = z.preprocess(v => (typeof v === 'boolean' ? String(v) : v), z.stringbool({ error: 'must be true or false' }))

/**
 * A chart in chartFromRows format: rows[0] is the first row knitted; '.' or '0' main colour,
 * 'x', 'X', '#' or '1' contrast colour; 1–200 stitches wide and 1–500 rows high.
 * A bad cell is an issue at `rows.<i>` whose message names the row and column
 * ("row 4, column 7: unexpected character "2" …"), counted from 1.
 */
export const chartRows = z.array(z.string('must be text'), 'must be a list of rows')
  .min(1, 'must have at least one row')
  .max(MOTIF_LIMITS.maxHeight, `must have at most ${MOTIF_LIMITS.maxHeight} rows`)
  .superRefine((rows, ctx) => {
    const width = Array.from(rows[0] ?? '').length
    if (width > MOTIF_LIMITS.maxWidth) {
      ctx.addIssue({ code: 'custom', path: [0], message: `row 1: ${width} stitches, at most ${MOTIF_LIMITS.maxWidth} allowed` })
      return
    }
    try { chartFromRows(rows) }
    catch (e) {
      if (!(e instanceof KnittingInputError)) throw e
      ctx.addIssue({ code: 'custom', path: e.row ? [e.row - 1] : [], message: e.message.replace(/^chart /, ''), params: { row: e.row, col: e.col } })
    }
  })

/** `GET /api/motifs`: a page of a studio's library. `longest` sorts by the longer float of either yarn. */
export const motifListQuery = z.object({
  studioId: idParam,
  page: count(1, 100_000).default(1),
  pageSize: count(1, 200).default(24),
  sort: z.enum(motifSorts, `must be one of ${motifSorts.join(', ')}`).default('name'),
  dir: z.enum(['asc', 'desc'], 'must be asc or desc').default('asc'),
  verdict: z.enum(['tidy', 'moderate', 'long'], 'must be tidy, moderate or long').optional(),
  q: z.string().trim().max(120, 'must be at most 120 characters').optional(),
  maxWidth: count(1, 10_000).optional(),
  maxHeight: count(1, 10_000).optional(),
  /** Designers and owners may narrow to drafts (false) or published (true); knitters only ever see published. */
  published: flag.optional(),
})
export type MotifListQuery = z.infer<typeof motifListQuery>

export const motifCreateBody = z.object({
  studioId: idParam,
  name: nameSchema,
  rows: chartRows,
  published: z.boolean('must be true or false').optional(),
})
export type MotifCreateBody = z.infer<typeof motifCreateBody>

export const motifPatchBody = z.object({
  name: nameSchema.optional(),
  rows: chartRows.optional(),
  published: z.boolean('must be true or false').optional(),
  /** The version the change was made from: a 409 with the current motif when it has moved on. */
  version: editVersion.optional(),
}).refine(b => b.name !== undefined || b.rows !== undefined || b.published !== undefined, { message: 'nothing to change: send name, rows or published' })
export type MotifPatchBody = z.infer<typeof motifPatchBody>

/** The body may be left out: the copy is then named "<name> (copy)". */
export const motifDuplicateBody = z.object({ name: nameSchema.optional() }).optional()

export const motifExportQuery = z.object({
  format: z.enum(['json', 'csv', 'png'], 'must be json, csv or png').default('json'),
})
export type MotifExportFormat = z.infer<typeof motifExportQuery>['format']

export const motifImportBody = z.object({
  studioId: idParam,
  /** Overrides the name in the file (a CSV file may carry none). */
  name: nameSchema.optional(),
  format: z.enum(['json', 'csv'], 'must be json or csv'),
  content: z.string('must be text').min(1, 'is empty').max(MAX_IMPORT_CHARS, `must be at most ${MAX_IMPORT_CHARS} characters`),
})
export type MotifImportBody = z.infer<typeof motifImportBody>

/** Empty form fields count as not given. */
const optionalField = <T extends z.ZodType>(schema: T) => z.preprocess(v => (v === '' || v === null ? undefined : v), schema.optional())

/**
 * The text fields of `POST /api/motifs/picture-preview` (multipart/form-data, with the
 * `picture` file beside them). `width` × `height` is the chart size in stitches × rows;
 * `threshold` 0–255 (grey levels at or below it are dark), Otsu's when left out;
 * `invert` makes dark cells main colour instead of contrast.
 */
export const picturePreviewFields = z.object({
  studioId: idParam,
  width: count(1, MOTIF_LIMITS.maxWidth),
  height: count(1, MOTIF_LIMITS.maxHeight),
  threshold: optionalField(count(0, 255)),
  invert: optionalField(flag),
})
export type PicturePreviewFields = z.infer<typeof picturePreviewFields>

/** `POST /api/motifs/from-picture`: the preview fields plus the new motif's name. */
export const pictureMotifFields = picturePreviewFields.extend({ name: nameSchema })
export type PictureMotifFields = z.infer<typeof pictureMotifFields>
