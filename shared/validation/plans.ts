import { z } from 'zod'
import { MAX_PLAN_ROWS } from '#shared/engine/rows'
import { copySuffix, longestPieceName } from '#shared/piece/copies'
import { count, editVersion, id, lengthUnit, nameSchema, notes, stored } from './common'

// Plans: a create body carries studioId; a patch body is the same fields, all optional (studioId never moves).

const positive = (max: number) => z.number('must be a number').positive('must be more than 0').max(max, `must be at most ${max}`)
const slot = z.string('must be a slot letter').regex(/^[A-F]$/, 'must be a slot letter A–F')
const label = z.string('must be text').trim().max(120, 'must be at most 120 characters').optional()
const rows = count(1, MAX_PLAN_ROWS)
const lengthCm = positive(1000)

const noteSection = z.object({
  kind: z.enum(['cast-on-note', 'setting-note', 'cast-off-note']),
  text: z.string('must be text').trim().min(1, 'is required').max(1000, 'must be at most 1000 characters'),
})
const plainSection = z.object({
  kind: z.literal('plain'), label, rows: rows.optional(), lengthCm: lengthCm.optional(), yarn: slot,
  stitchSize: z.string('must be text').trim().max(60, 'must be at most 60 characters').optional(),
})
const motifSection = z.object({
  kind: z.literal('motif'), label, motifId: id,
  placement: z.union([z.literal('centred'), z.object({ offset: count(0, 1000) })], 'must be "centred" or { offset }'),
  chartRows: rows.optional(), lengthCm: lengthCm.optional(), main: slot, contrast: slot,
})
const shapingSection = z.object({
  kind: z.literal('shaping'), label,
  change: z.enum(['increase', 'decrease'], 'must be "increase" or "decrease"'),
  stitchesEachSide: count(1, 500),
  rows: count(1, 100000),
})

/** Exactly one of the two ways to say how long a section is. */
function oneLength<T extends { rows?: number; chartRows?: number; lengthCm?: number }>(key: 'rows' | 'chartRows') {
  return (s: T, ctx: z.RefinementCtx) => {
    const given = (s[key] !== undefined ? 1 : 0) + (s.lengthCm !== undefined ? 1 : 0)
    if (given !== 1) ctx.addIssue({ code: 'custom', path: [key], message: `give either ${key} or lengthCm` })
  }
}

export const planSectionSchema = z.discriminatedUnion('kind', [
  noteSection,
  plainSection.superRefine(oneLength('rows')),
  motifSection.superRefine(oneLength('chartRows')).refine(s => s.main !== s.contrast, { path: ['contrast'], message: 'must be a different slot from main' }),
  shapingSection,
], 'must be a section with a kind: plain, motif, shaping or a note')

export const planPieceSchema = z.object({
  name: nameSchema,
  copies: count(1, 10).default(1),
  targetWidth: stored(1000, 2),
  targetLength: stored(1000, 2),
  unit: lengthUnit.default('cm'),
  ease: z.number('must be a number').min(-100, 'must be at least -100').max(100, 'must be at most 100').default(0),
  sections: z.array(planSectionSchema, 'must be a list of sections').min(1, 'at least one section').max(100, 'at most 100 sections'),
}).superRefine((p, ctx) => {
  // Each copy becomes a project piece named "<name> 2 of 2", which must fit the same column.
  const longest = longestPieceName(p.copies)
  if (p.name.length > longest) {
    ctx.addIssue({
      code: 'custom',
      path: ['name'],
      message: `must be at most ${longest} characters with ${p.copies} copies (each copy is named "…${copySuffix(p.copies, p.copies)}")`,
    })
  }
})

const planFields = {
  name: nameSchema,
  machineId: id.nullable(),
  swatchId: id.nullable(),
  yarns: z.array(z.object({ slot, yarnId: id }), 'must be a list of { slot, yarnId }').max(6, 'at most 6 yarns')
    .refine(list => new Set(list.map(y => y.slot)).size === list.length, 'each slot at most once'),
  floatLimit: count(1, 50),
  published: z.boolean('must be true or false'),
  notes,
  pieces: z.array(planPieceSchema, 'must be a list of pieces').min(1, 'at least one piece').max(12, 'at most 12 pieces'),
}
export const planBody = z.object({
  studioId: id,
  ...planFields,
  machineId: planFields.machineId.default(null),
  swatchId: planFields.swatchId.default(null),
  yarns: planFields.yarns.default([]),
  floatLimit: planFields.floatLimit.default(5),
  published: planFields.published.default(false),
  notes: notes.default(''),
})
/**
 * A patch replaces whole fields: `pieces` given replaces every piece. `version` is the one the
 * change was made from: a 409 with the current plan when it has moved on.
 */
export const planPatch = z.object(planFields).partial().extend({ version: editVersion.optional() })
export type PlanBody = z.infer<typeof planBody>
export type PlanPatch = z.infer<typeof planPatch>

/** POST /api/plans/:id/projects: which pieces (by index; default all) and a name (default the plan's). */
export const planProjectBody = z.object({
  name: nameSchema.optional(),
  pieces: z.array(count(0, 11), 'must be a list of piece indexes').min(1, 'at least one piece').optional(),
  notes: notes.optional(),
  /** Which of the plan's sizes to knit (index into its sizes; the first by default). */
  size: count(0, 11).optional(),
})
export type PlanProjectBody = z.infer<typeof planProjectBody>

/** GET /api/plans/:id?size=k: the size (index into the plan's sizes) the numbers are worked out for. */
export const planSizeQuery = z.object({
  size: z.preprocess(v => (typeof v === 'string' && /^\d{1,2}$/.test(v) ? Number(v) : v), count(0, 11)).optional(),
})
