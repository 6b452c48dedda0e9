import type { H3Event } from 'h3'
import type { Model, ModelStatic } from 'sequelize'
import { gaugeFromSwatch, gaugePer4in, inToCm, yarnWeightCategory, YARN_WEIGHT_CATEGORIES, type Gauge } from '#shared/engine'
import type { MachineCard, MachineItem, SwatchGauge, SwatchItem, YarnItem } from '#shared/types/stock'
import type { StudioRole } from '#shared/types/studio'
import type { Swatch } from '../db/models'
import { Machine, Yarn } from '../db/models'

// Studio stock for the planner: machines, yarns and swatches. Any member reads; designers and
// owners write; deleting a machine or a yarn is the owner's (they run the studio's stock).
// A row of a studio the caller is not in is a 404.

type StudioRow = Model & { studioId: number }

/** A row of `model` by id in a studio where the caller has at least `least`, or 404/403. */
export async function requireStudioRow<M extends StudioRow>(event: H3Event, model: ModelStatic<M>, id: number, least: StudioRole, what: string) {
  const row = await model.findByPk(id)
  const { user, role } = await studioMember(event, row?.studioId, least, { what })
  return { user, row: row!, role } // no row: studioMember answered 404
}

/** Ids given in a body must name rows of the same studio; otherwise a 400 naming the field. */
export async function requireInStudio(studioId: number, refs: { field: string; model: ModelStatic<StudioRow>; id: number | null | undefined }[]) {
  for (const ref of refs) {
    if (ref.id == null) continue
    const row = await ref.model.findOne({ where: { id: ref.id, studioId } as never })
    if (!row) throw fieldError(ref.field, 'no such item in this studio')
  }
}

const iso = (d: Date) => new Date(d).toISOString()

export function machineItem(m: Machine): MachineItem {
  return {
    id: m.id, studioId: m.studioId, name: m.name, needlePitchMm: Number(m.needlePitchMm), needles: m.needles,
    patterningWidth: m.patterningWidth, technique: m.technique, passesPerColour: m.passesPerColour, notes: m.notes,
    card: machineCard(m), createdAt: iso(m.createdAt), updatedAt: iso(m.updatedAt),
  }
}

/** The machine's punch card as the API gives it (null when it does not pattern from a card). */
export function machineCard(m: Machine): MachineCard | null {
  if (!m.cardReader) return null
  return {
    holePitchMm: Number(m.cardHolePitchMm), rowPitchMm: Number(m.cardRowPitchMm), edgeMm: Number(m.cardEdgeMm),
    minRows: m.cardMinRows, joinRows: m.cardJoinRows, readerOffset: m.cardReaderOffset,
  }
}

/**
 * A machine body's columns: the card's measures go to their own columns; a null card keeps the
 * stored measures (a card switched off and on again comes back as it was).
 */
export function machineColumns<B extends { card?: MachineCard | null }>(body: B) {
  const { card, ...rest } = body
  if (card === undefined) return rest
  if (card === null) return { ...rest, cardReader: false }
  return {
    ...rest, cardReader: true, cardHolePitchMm: card.holePitchMm, cardRowPitchMm: card.rowPitchMm, cardEdgeMm: card.edgeMm,
    cardMinRows: card.minRows, cardJoinRows: card.joinRows, cardReaderOffset: card.readerOffset,
  }
}

export function yarnItem(y: Yarn): YarnItem {
  return {
    id: y.id, studioId: y.studioId, name: y.name, hex: y.hex, weightCategory: y.weightCategory,
    weightName: YARN_WEIGHT_CATEGORIES[y.weightCategory]?.name ?? '',
    metresPer100g: Number(y.metresPer100g), gramsOnHand: Number(y.gramsOnHand), notes: y.notes,
    createdAt: iso(y.createdAt), updatedAt: iso(y.updatedAt),
  }
}

/** The engine's gauge of a swatch, its measures turned into cm. */
export function swatchEngineGauge(s: Pick<Swatch, 'stitches' | 'rows' | 'width' | 'height' | 'unit'>): Gauge {
  const cm = (v: number) => (s.unit === 'in' ? inToCm(Number(v)) : Number(v))
  return gaugeFromSwatch({ stitches: s.stitches, rows: s.rows, widthCm: cm(s.width), heightCm: cm(s.height) })
}

export function swatchGauge(s: Pick<Swatch, 'stitches' | 'rows' | 'width' | 'height' | 'unit'>): SwatchGauge {
  const g = swatchEngineGauge(s)
  const per4 = gaugePer4in(g)
  return { ...g, ...per4, weightCategory: yarnWeightCategory(per4.stitchesPer4in) }
}

export function swatchItem(s: Swatch): SwatchItem {
  return {
    id: s.id, studioId: s.studioId, machineId: s.machineId, stitchSize: s.stitchSize, mainYarnId: s.mainYarnId,
    contrastYarnId: s.contrastYarnId, stitches: s.stitches, rows: s.rows, width: Number(s.width), height: Number(s.height),
    unit: s.unit, grams: s.grams == null ? null : Number(s.grams), washed: !!s.washed, notes: s.notes,
    gauge: swatchGauge(s), createdAt: iso(s.createdAt), updatedAt: iso(s.updatedAt),
  }
}

/** The machine and yarns a swatch names must be the studio's. */
export function checkSwatchRefs(studioId: number, b: { machineId?: number | null; mainYarnId?: number | null; contrastYarnId?: number | null }) {
  return requireInStudio(studioId, [
    { field: 'machineId', model: Machine as never, id: b.machineId },
    { field: 'mainYarnId', model: Yarn as never, id: b.mainYarnId },
    { field: 'contrastYarnId', model: Yarn as never, id: b.contrastYarnId },
  ])
}
