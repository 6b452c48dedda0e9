import type { H3Event } from 'h3'
import type { Transaction } from 'sequelize'
import { distinguishable, estimateRowsYarn, estimateYarn, KnittingInputError, type YarnEstimate } from '#shared/engine'
import { timelineCard } from '#shared/piece/cardRow'
import { compilePieceTimeline, pieceTimelinePlan } from '#shared/piece/timeline'
import { motifSectionName, planSlotYarns, type PlanMotif, type WorkedPlanPiece } from '#shared/planner/planPiece'
import { shapedKnittedRows, shapeSizeCounts } from '#shared/planner/shapedPiece'
import { workPiece } from '#shared/planner/workPiece'
import { copySuffix } from '#shared/piece/copies'
import { nameWithSuffix } from '#shared/text/nameWithSuffix'
import type { PlanDetail, PlanPerson, PlanPiece as PlanPieceView, PlanSummary, PlanWarning, PlanYarnNeed } from '#shared/types/plan'
import { roleAtLeast, type StudioRole } from '#shared/types/studio'
import type { PlanBody, PlanPatch, PlanProjectBody } from '#shared/validation/plans'
import { Machine, Motif, Plan, PlanPiece, Swatch, User, Yarn } from '../db/models'
import { insertProject } from '../db/projects'

// Plans: owners and designers see and write every plan of their studio; knitters see the
// published ones (and start projects from them). Anything else is a 404.

const people = [
  { model: User, as: 'creator', attributes: ['id', 'name'] },
  { model: User, as: 'editor', attributes: ['id', 'name'] },
]
/** A plan with its people and pieces, as every plan answer loads it. */
export const planWithPieces = [...people, { model: PlanPiece, as: 'pieces' }]

/** A plan the caller may see (knitters: published ones), with at least `least` role in its studio, or 404/403. */
export async function requirePlan(event: H3Event, id: number, least: StudioRole = 'knitter') {
  const plan = await Plan.findByPk(id, { include: planWithPieces })
  const { user, role } = await studioMember(event, plan?.studioId, least, { what: 'Plan', sees: role => role !== 'knitter' || !!plan!.published })
  return { user, plan: plan!, role } // no plan: studioMember answered 404
}

const person = (u: User | null | undefined): PlanPerson | null => (u ? { id: u.id, name: u.name } : null)
const iso = (d: Date) => new Date(d).toISOString()
const sortedPieces = (plan: Plan) => [...(plan.pieces ?? [])].sort((a, b) => a.position - b.position || a.id - b.id)

export function planSummary(plan: Plan): PlanSummary {
  return {
    id: plan.id, studioId: plan.studioId, name: plan.name, machineId: plan.machineId, swatchId: plan.swatchId,
    yarns: plan.yarns, sizes: plan.sizes, floatLimit: plan.floatLimit, published: !!plan.published, pieceCount: plan.pieces?.length ?? 0,
    createdBy: person(plan.creator), updatedBy: person(plan.editor), createdAt: iso(plan.createdAt), updatedAt: iso(plan.updatedAt),
  }
}

export async function listPlans(studioId: number, role: StudioRole): Promise<PlanSummary[]> {
  const where = role === 'knitter' ? { studioId, published: true } : { studioId }
  const plans = await Plan.findAll({
    where,
    include: [...people, { model: PlanPiece, as: 'pieces', attributes: ['id'] }],
    order: [
      ['updatedAt', 'DESC'],
      ['id', 'DESC'],
    ],
  })
  return plans.map(planSummary)
}

/** Machine, swatch, yarns and motifs a plan names must be its studio's: a 400 naming the field otherwise. */
export async function checkPlanRefs(studioId: number, body: PlanPatch) {
  await requireInStudio(studioId, [
    { field: 'machineId', model: Machine as never, id: body.machineId },
    { field: 'swatchId', model: Swatch as never, id: body.swatchId },
    ...(body.yarns ?? []).map((y, i) => ({ field: `yarns.${i}.yarnId`, model: Yarn as never, id: y.yarnId })),
    ...(body.pieces ?? []).flatMap((p, i) => p.sections.map((s, j) => ({
      field: `pieces.${i}.sections.${j}.motifId`, model: Motif as never, id: s.kind === 'motif' ? s.motifId : null,
    }))),
  ])
}

async function writePieces(planId: number, pieces: PlanBody['pieces'], transaction: Transaction) {
  await PlanPiece.destroy({ where: { planId }, transaction })
  for (const [i, p] of pieces.entries()) await PlanPiece.create({ planId, position: i + 1, ...p }, { transaction })
}

export async function createPlan(body: PlanBody, userId: number): Promise<number> {
  const { pieces, ...fields } = body
  return useDb().transaction(async (transaction) => {
    const plan = await Plan.create({ ...fields, createdBy: userId, updatedBy: userId }, { transaction })
    await writePieces(plan.id, pieces, transaction)
    return plan.id
  })
}

/**
 * Applies a change made from version `expected` (undefined: from whatever the plan is now) and
 * answers the plan exactly as this change left it, as its designers see it. A plan that has
 * moved on since is a 409 carrying the current copy; nothing is saved.
 */
export async function updatePlan(id: number, body: Omit<PlanPatch, 'version'>, userId: number, expected: number | undefined): Promise<PlanDetail> {
  const { pieces, ...fields } = body
  const saved = await useDb().transaction(async (transaction) => {
    // The plan row first: it stays locked until the pieces are written and read back.
    if (!(await updateAtVersion(Plan, id, expected, { ...fields, updatedBy: userId }, transaction))) return null
    if (pieces) await writePieces(id, pieces, transaction)
    return Plan.findByPk(id, { include: planWithPieces, transaction, rejectOnEmpty: true })
  })
  if (saved) return planDetail(saved, 'designer')
  const current = await Plan.findByPk(id, { include: planWithPieces })
  if (!current) throw createError({ statusCode: 404, message: 'Plan not found' })
  throw changedElsewhere('plan', await planDetail(current, 'designer'))
}

/**
 * Everything the plan's numbers need, loaded once, as `viewer` may see it: a knitter gets the
 * chart of a motif still in draft (it is what they knit) but not its library name.
 */
async function planInputs(plan: Plan, viewer: StudioRole) {
  const pieces = sortedPieces(plan)
  const motifIds = [...new Set(pieces.flatMap(p => p.sections.flatMap(s => (s.kind === 'motif' ? [s.motifId] : []))))]
  const [machine, swatch, yarns, motifs] = await Promise.all([
    plan.machineId ? Machine.findByPk(plan.machineId) : null,
    plan.swatchId ? Swatch.findByPk(plan.swatchId) : null,
    Yarn.findAll({ where: { id: plan.yarns.map(y => y.yarnId), studioId: plan.studioId } }),
    Motif.findAll({ where: { id: motifIds, studioId: plan.studioId } }),
  ])
  const stock = new Map(yarns.map(y => [y.id, y]))
  const slots = plan.yarns.flatMap(y => (stock.has(y.yarnId) ? [{ ...y, yarn: stock.get(y.yarnId)! }] : []))
  const hideDrafts = !roleAtLeast(viewer, 'designer')
  const motifMap = new Map<number, PlanMotif>(motifs.map(m => [m.id, { name: hideDrafts && !m.published ? null : m.name, chart: motifChartRows(m) }]))
  return { pieces, machine, swatch, slots, motifMap }
}

type Inputs = Awaited<ReturnType<typeof planInputs>>

/** Every piece worked out for the size at `size` in the plan's sizes. */
function workPieces(plan: Plan, inp: Inputs, warnings: PlanWarning[], size: number) {
  if (!inp.swatch) warnings.push({ kind: 'no-gauge', message: 'Choose a swatch: needles and rows come from its gauge' })
  const gauge = inp.swatch ? swatchEngineGauge(inp.swatch) : null
  return inp.pieces.map((p, i): WorkedPlanPiece | null => {
    if (!gauge) return null
    try {
      return workPiece(p, {
        gauge, technique: inp.machine?.technique ?? 'together', passesPerColour: inp.machine?.passesPerColour ?? 2,
        yarns: inp.slots.map(s => ({ slot: s.slot, name: s.yarn.name, hex: s.yarn.hex })), motifs: inp.motifMap, floatLimit: plan.floatLimit,
        card: inp.machine ? timelineCard({ patterningWidth: inp.machine.patterningWidth, card: machineCard(inp.machine) }, inp.machine.technique) : undefined,
      }, { index: size, name: plan.sizes[size]! })
    }
    catch (e) {
      if (!(e instanceof KnittingInputError)) throw e
      warnings.push({ kind: 'section', piece: i, message: `${p.name}: ${e.message}` })
      return null
    }
  })
}

function pieceWarnings(plan: Plan, inp: Inputs, worked: (WorkedPlanPiece | null)[], warnings: PlanWarning[]) {
  const hex = new Map(inp.slots.map(s => [s.slot, s.yarn.hex]))
  const pairsSeen = new Set<string>()
  worked.forEach((w, i) => {
    const piece = inp.pieces[i]!
    if (!w) return
    const widest = w.shape?.widest ?? Math.max(w.needles, ...w.sections.map(s => s.shaping?.stitchesAfter ?? 0))
    if (inp.machine && widest > inp.machine.needles) {
      warnings.push({ kind: 'needles-over-bed', piece: i, message: `${piece.name}: ${widest} needles, ${inp.machine.name} has ${inp.machine.needles}` })
    }
    piece.sections.forEach((s, j) => {
      if (s.kind !== 'motif') return
      const n = w.sections[j]!
      const longest = Math.max(...(n.maxFloat ?? [0, 0]))
      if (longest > plan.floatLimit) {
        warnings.push({
          kind: 'long-floats',
          piece: i,
          section: j,
          message: `${piece.name}: floats of ${longest} stitches, over the plan's limit of ${plan.floatLimit}`,
        })
      }
      if (inp.machine && n.placement && n.placement.chartWidth > inp.machine.patterningWidth) {
        warnings.push({
          kind: 'repeat-over-patterning-width',
          piece: i,
          section: j,
          message: `${piece.name}: the motif is ${n.placement.chartWidth} stitches wide, ${inp.machine.name} patterns ${inp.machine.patterningWidth}`,
        })
      }
      const key = `${s.main}${s.contrast}`
      const a = hex.get(s.main)
      const b = hex.get(s.contrast)
      if (a && b && !pairsSeen.has(key)) {
        pairsSeen.add(key)
        const d = distinguishable(a, b)
        if (d.verdict !== 'clear') warnings.push({ kind: 'colours-close', piece: i, section: j, message: `Slots ${s.main} and ${s.contrast}: ${d.reason}` })
      }
    })
  })
}

/** Yarn per slot over every piece × copies (estimateYarn per section, each with its own offset). */
function planEstimate(inp: Inputs, worked: (WorkedPlanPiece | null)[], warnings: PlanWarning[]): PlanDetail['estimate'] {
  const sw = inp.swatch
  if (!sw || !inp.machine || sw.grams == null) {
    warnings.push({ kind: 'no-estimate', message: 'The yarn estimate needs a machine and a weighed swatch' })
    return null
  }
  if (worked.some(w => !w)) return null
  const grist = Object.fromEntries(inp.slots.map(s => [s.slot, { metresPer100g: Number(s.yarn.metresPer100g) }]))
  const totals = new Map<string, { grams: number; metres: number; floatGrams: number }>()
  const models = { rectangle: '', shaped: '' }
  const common = { swatch: { stitches: sw.stitches * sw.rows, grams: Number(sw.grams) }, needlePitchMm: Number(inp.machine!.needlePitchMm), yarns: grist }
  const addUp = (e: YarnEstimate, copies: number, kind: keyof typeof models) => {
    models[kind] = e.model
    for (const y of e.yarns) {
      const t = totals.get(y.yarn) ?? { grams: 0, metres: 0, floatGrams: 0 }
      totals.set(y.yarn, { grams: t.grams + y.grams * copies, metres: t.metres + y.metres * copies, floatGrams: t.floatGrams + y.floatGrams * copies })
    }
  }
  let legacyShaping = false
  worked.forEach((w, i) => {
    const copies = inp.pieces[i]!.copies
    if (w!.timeline.shape) {
      addUp(estimateRowsYarn({ ...common, rows: shapedKnittedRows(w!.timeline, compilePieceTimeline(w!.timeline), w!.offsets) }), copies, 'shaped')
      return
    }
    legacyShaping ||= w!.shaping.some(Boolean)
    const engine = pieceTimelinePlan(w!.timeline)
    engine.sections.forEach((section, j) => {
      addUp(estimateYarn({ ...common, plan: { ...engine, sections: [section] }, placement: { needles: w!.needles, offset: w!.offsets[j] } }), copies, 'rectangle')
    })
  })
  const yarns: PlanYarnNeed[] = inp.slots.filter(s => totals.has(s.slot)).map((s) => {
    const t = totals.get(s.slot)!
    const onHand = Number(s.yarn.gramsOnHand)
    if (t.grams > onHand)
      warnings.push({ kind: 'low-stock', message: `${s.yarn.name} (slot ${s.slot}): about ${Math.ceil(t.grams)} g needed, ${onHand} g on hand` })
    return { slot: s.slot, yarnId: s.yarnId, name: s.yarn.name, hex: s.yarn.hex, ...t, gramsOnHand: onHand, low: t.grams > onHand }
  })
  // The shaped model's words cover a rectangle too (a row at its real width is the cast-on width).
  const words = [
    models.shaped || models.rectangle,
    ...(models.shaped && models.rectangle ? ['Rectangle pieces keep their cast-on width on every row.'] : []),
    ...(legacyShaping ? ['Rows of a shaping section are counted at the cast-on width.'] : []),
    'Each piece is counted once per copy.',
  ]
  return { model: words.join(' '), yarns }
}

/** The plan worked out for the size at `size` (0 when out of range: the plan may have lost sizes since). */
export async function planDetail(plan: Plan, viewer: StudioRole, size = 0): Promise<PlanDetail> {
  const inp = await planInputs(plan, viewer)
  const warnings: PlanWarning[] = []
  if (size >= plan.sizes.length) size = 0
  const worked = workPieces(plan, inp, warnings, size)
  const gauge = inp.swatch ? swatchEngineGauge(inp.swatch) : null
  pieceWarnings(plan, inp, worked, warnings)
  const estimate = planEstimate(inp, worked, warnings)
  const main = inp.slots.find(s => s.slot === 'A')
  const pieces: PlanPieceView[] = inp.pieces.map((p, i) => {
    const w = worked[i]
    return {
      id: p.id,
      position: p.position,
      name: p.name,
      copies: p.copies,
      targetWidth: Number(p.targetWidth),
      targetLength: Number(p.targetLength),
      unit: p.unit,
      ease: Number(p.ease),
      sections: p.sections,
      shape: p.shape,
      sizeCounts: p.shape && gauge ? shapeSizeCounts(p.shape, plan.sizes, p.unit, gauge) : null,
      numbers: w
        ? {
            needles: w.needles,
            targetRows: w.targetRows,
            plannedRows: w.plannedRows,
            machineRows: w.machineRows,
            colourChanges: w.colourChanges,
            sections: w.sections,
            preview: { timeline: w.timeline, offsets: w.offsets, shaping: w.shaping },
            shape: w.shape,
          }
        : null,
    }
  })
  return {
    ...planSummary(plan),
    size,
    version: plan.version,
    notes: plan.notes,
    pieces,
    gauge: inp.swatch ? swatchGauge(inp.swatch) : null,
    warnings,
    contrast: main
      ? inp.slots.filter(s => s !== main).map(s => ({ slots: [main.slot, s.slot] as [string, string], ...distinguishable(main.yarn.hex, s.yarn.hex) }))
      : [],
    estimate,
  }
}

/** The plan as its designers see it, for the answer to their own create or change. */
export async function loadPlanDetail(id: number) {
  return planDetail((await Plan.findByPk(id, { include: planWithPieces }))!, 'designer')
}

/** A project's default name: the plan's, with the size when the plan has more than one ("… · size M"). */
const projectName = (plan: Plan, size: number) => (plan.sizes.length > 1 ? nameWithSuffix(plan.name, ` · size ${plan.sizes[size]}`) : plan.name)

/**
 * A project from a published plan: each chosen piece (× its copies) gets the timeline worked out
 * now, frozen in the project, so later plan edits move nobody's row. Returns the project id.
 */
export async function startProjectFromPlan(plan: Plan, body: PlanProjectBody, knitterId: number, role: StudioRole): Promise<number> {
  if (!plan.published) throw createError({ statusCode: 409, message: 'Publish the plan before starting a project from it' })
  // Frozen as the one starting it sees the plan: a knitter's project never holds a draft's name.
  const inp = await planInputs(plan, role)
  const warnings: PlanWarning[] = []
  const size = body.size ?? 0
  if (size >= plan.sizes.length) throw fieldError('size', `the plan has no size ${size} (it has ${plan.sizes.length}: ${plan.sizes.join(', ')})`)
  const worked = workPieces(plan, inp, warnings, size)
  const chosen = body.pieces ?? inp.pieces.map((_, i) => i)
  const bad = chosen.find(i => i >= inp.pieces.length)
  if (bad !== undefined) throw fieldError('pieces', `the plan has no piece ${bad} (it has ${inp.pieces.length})`)
  const blocker = warnings.find(w => w.kind === 'no-gauge' || (w.kind === 'section' && chosen.includes(w.piece!)))
  if (blocker) throw createError({ statusCode: 409, message: `The plan cannot be knitted yet: ${blocker.message}` })
  const yarns = planSlotYarns(inp.slots.map(s => ({ slot: s.slot, name: s.yarn.name, hex: s.yarn.hex })))
    .map(y => ({ ...y, yarnId: inp.slots.find(s => s.slot === y.slot)!.yarnId }))
  const pieces = chosen.flatMap((i) => {
    const p = inp.pieces[i]!
    // Cut to fit for pieces saved before their names were checked against the copies.
    const name = (k: number) => nameWithSuffix(p.name, copySuffix(k + 1, p.copies))
    return Array.from({ length: p.copies }, (_, k) => ({ name: name(k), timeline: worked[i]!.timeline }))
  })
  const firstMotif = inp.pieces.flatMap(p => p.sections).find(s => s.kind === 'motif')
  const motifId = firstMotif?.kind === 'motif' ? firstMotif.motifId : null
  const motif = motifId ? inp.motifMap.get(motifId) : undefined
  const project = await useDb().transaction(transaction => insertProject({
    studioId: plan.studioId, knitterId, name: body.name ?? projectName(plan, size), machineId: plan.machineId, motifId,
    motifName: motif ? motifSectionName(firstMotif!, motif) : undefined, yarns, notes: body.notes ?? plan.notes,
    source: 'plan', plan: { id: plan.id, name: plan.name }, pieces,
  }, transaction))
  return project.id
}
