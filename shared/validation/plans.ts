import { z } from 'zod'
import { MAX_PLAN_ROWS } from '#shared/engine/rows'
import { copySuffix, longestPieceName } from '#shared/piece/copies'
import { shapeMeasurements, type ShapeMeasurement } from '#shared/types/plan'
import { mayBeZero, PLAN_SIZES_MAX, SHAPE_EASE_MAX, SHAPE_VALUE_MAX, shapeNeeds, SIZE_NAME_MAX } from '#shared/types/pieceShape'
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

/**
 * A plan's sizes, smallest first, in the designer's own names ("XS" … "3XL", "chest 86"):
 * 1–12 of them, each 1–20 characters once trimmed, no two alike ignoring capitals ("m" and "M"
 * would be the same size on a sheet).
 */
export const planSizes = z.array(
  z.string('must be text').trim().min(1, 'is required').max(SIZE_NAME_MAX, `must be at most ${SIZE_NAME_MAX} characters`),
  'must be a list of size names',
).min(1, 'at least one size').max(PLAN_SIZES_MAX, `at most ${PLAN_SIZES_MAX} sizes`).superRefine((list, ctx) => {
  const seen = new Map<string, number>()
  list.forEach((name, i) => {
    const key = name.toLowerCase()
    const first = seen.get(key)
    if (first === undefined) seen.set(key, i)
    else ctx.addIssue({ code: 'custom', path: [i], message: `"${name}" is already size ${first + 1} ("${list[first]}"): each size needs its own name` })
  })
})
/** The sizes of a plan created without any. */
export const DEFAULT_PLAN_SIZES = ['One size']

// A shaped piece (PieceShape): choices, then one value per size for each measurement they call for.
const shapeValue = (key: ShapeMeasurement) => (mayBeZero.has(key)
  ? z.number('must be a number').min(0, 'must be 0 or more')
  : z.number('must be a number').positive('must be more than 0')).max(SHAPE_VALUE_MAX, `must be at most ${SHAPE_VALUE_MAX}`)
const shapeValues = Object.fromEntries(shapeMeasurements.map(key => [key, z.array(shapeValue(key), 'must be a list with a number for each size')
  .min(1, 'needs a number for each size').max(PLAN_SIZES_MAX, `at most ${PLAN_SIZES_MAX} numbers (one per size)`).optional()])) as
  Record<ShapeMeasurement, z.ZodOptional<z.ZodArray<z.ZodNumber>>>
const shapeEase = Object.fromEntries(shapeMeasurements.map(key => [key, z.number('must be a number')
  .min(-SHAPE_EASE_MAX, `must be at least -${SHAPE_EASE_MAX}`).max(SHAPE_EASE_MAX, `must be at most ${SHAPE_EASE_MAX}`).optional()])) as
  Record<ShapeMeasurement, z.ZodOptional<z.ZodNumber>>

/** What a measurement belongs to, for the messages ("is needed for a neckline"). */
const measurementFor: Record<ShapeMeasurement, string> = {
  hemWidth: 'every shaped piece', width: 'every shaped piece', lengthToUnderarm: 'every shaped piece',
  armholeCastOff: 'a set-in armhole', armholeDecrease: 'a set-in armhole', armholeDepth: 'a set-in armhole',
  shoulderWidth: 'shaped shoulders', shoulderDrop: 'shaped shoulders',
  neckWidth: 'a neckline', neckDepth: 'a neckline',
  capCastOff: 'a sleeve cap', capHeight: 'a sleeve cap', capTopWidth: 'a sleeve cap',
}

export const pieceShapeSchema = z.object({
  kind: z.enum(['body', 'sleeve'], 'must be "body" or "sleeve"'),
  carriageStart: z.enum(['left', 'right'], 'must be "left" or "right"').default('right'),
  armhole: z.boolean('must be true or false').default(false),
  shoulder: z.enum(['cast-off', 'hold'], 'must be "cast-off", "hold" or null').nullable().default(null),
  neck: z.enum(['round', 'v', 'square'], 'must be "round", "v", "square" or null').nullable().default(null),
  cap: z.boolean('must be true or false').default(false),
  measurements: z.object(shapeValues, 'must be the measurements, each a list with a number per size'),
  ease: z.object(shapeEase, 'must be the ease of each measurement').default({}),
}).superRefine((s, ctx) => {
  // The kind decides the choices: a sleeve's top is its cap, a body's is armholes, shoulders and neck.
  if (s.kind === 'sleeve') {
    if (s.armhole) ctx.addIssue({ code: 'custom', path: ['armhole'], message: 'a sleeve has no armhole (give it a cap for a set-in sleeve)' })
    if (s.shoulder) ctx.addIssue({ code: 'custom', path: ['shoulder'], message: 'a sleeve has no shoulders' })
    if (s.neck) ctx.addIssue({ code: 'custom', path: ['neck'], message: 'a sleeve has no neckline' })
  }
  else if (s.cap) ctx.addIssue({ code: 'custom', path: ['cap'], message: 'a body has no cap (the cap is the top of a sleeve)' })
  const { required, optional } = shapeNeeds(s)
  for (const key of required) {
    if (!s.measurements[key]) ctx.addIssue({ code: 'custom', path: ['measurements', key], message: `is needed for ${measurementFor[key]}` })
  }
  // A measurement the choices do not use would be kept and never knitted: refused, so the table is what the sheet shows.
  for (const key of shapeMeasurements) {
    if (required.includes(key) || optional.includes(key)) continue
    for (const where of ['measurements', 'ease'] as const) {
      if (s[where][key] !== undefined) ctx.addIssue({ code: 'custom', path: [where, key], message: `is not used by a piece without ${measurementFor[key]}` })
    }
  }
})

/**
 * Each measurement of each shaped piece must have a number for every size of the plan. The
 * schemas check it when one body carries both; for a patch carrying only one of them the
 * route checks the other against the stored plan with this.
 */
export function shapeSizeIssues(pieces: { shape?: { measurements: Partial<Record<ShapeMeasurement, number[]>> } | null }[], sizes: string[]) {
  const issues: { path: (string | number)[]; message: string }[] = []
  pieces.forEach((piece, i) => {
    for (const key of shapeMeasurements) {
      const values = piece.shape?.measurements[key]
      if (values && values.length !== sizes.length) {
        issues.push({
          path: ['pieces', i, 'shape', 'measurements', key],
          message: `has ${values.length} number${values.length === 1 ? '' : 's'} but the plan has ${sizes.length} size${sizes.length === 1 ? '' : 's'} (${sizes.join(', ')})`,
        })
      }
    }
  })
  return issues
}
const sizesMatchShapes = (plan: { pieces?: Parameters<typeof shapeSizeIssues>[0]; sizes?: string[] }, ctx: z.RefinementCtx) => {
  if (!plan.pieces || !plan.sizes) return
  for (const issue of shapeSizeIssues(plan.pieces, plan.sizes)) ctx.addIssue({ code: 'custom', ...issue })
}

export const planPieceSchema = z.object({
  name: nameSchema,
  copies: count(1, 10).default(1),
  targetWidth: stored(1000, 2),
  targetLength: stored(1000, 2),
  unit: lengthUnit.default('cm'),
  ease: z.number('must be a number').min(-100, 'must be at least -100').max(100, 'must be at most 100').default(0),
  sections: z.array(planSectionSchema, 'must be a list of sections').min(1, 'at least one section').max(100, 'at most 100 sections'),
  shape: pieceShapeSchema.nullable().optional(),
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
  sizes: planSizes,
  machineId: id.nullable(),
  swatchId: id.nullable(),
  yarns: z.array(z.object({ slot, yarnId: id }), 'must be a list of { slot, yarnId }').max(6, 'at most 6 yarns')
    .refine(list => new Set(list.map(y => y.slot)).size === list.length, 'each slot at most once'),
  floatLimit: count(1, 50),
  published: z.boolean('must be true or false'),
  notes,
  pieces: z.array(planPieceSchema, 'must be a list of pieces').min(1, 'at least one piece').max(12, 'at most 12 pieces'),
}
// A plan created without sizes has one, DEFAULT_PLAN_SIZES: the default is applied here, by the
// schema, so the route, the database and every answer see the list the shapes were checked against.
export const planBody = z.object({
  studioId: id,
  ...planFields,
  sizes: planFields.sizes.default(() => [...DEFAULT_PLAN_SIZES]),
  machineId: planFields.machineId.default(null),
  swatchId: planFields.swatchId.default(null),
  yarns: planFields.yarns.default([]),
  floatLimit: planFields.floatLimit.default(5),
  published: planFields.published.default(false),
  notes: notes.default(''),
}).superRefine(sizesMatchShapes)
/**
 * A patch replaces whole fields: `pieces` given replaces every piece, `sizes` every size (the
 * shapes' numbers are checked against the sizes when both come; shapeSizeIssues for one alone). `version` is the one the
 * change was made from: a 409 with the current plan when it has moved on.
 */
export const planPatch = z.object(planFields).partial().extend({ version: editVersion.optional() }).superRefine(sizesMatchShapes)
export type PlanBody = z.infer<typeof planBody>
export type PlanPatch = z.infer<typeof planPatch>

/** POST /api/plans/:id/projects: which pieces (by index; default all) and a name (default the plan's). */
export const planProjectBody = z.object({
  name: nameSchema.optional(),
  pieces: z.array(count(0, 11), 'must be a list of piece indexes').min(1, 'at least one piece').optional(),
  notes: notes.optional(),
})
export type PlanProjectBody = z.infer<typeof planProjectBody>
