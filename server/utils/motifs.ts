import type { H3Event } from 'h3'
import { PNG } from 'pngjs'
import { Op, type Attributes, type Order, type WhereOptions } from 'sequelize'
import { chartToRows, type Chart } from '#shared/engine'
import type { MotifDetail, MotifListItem, MotifPage, MotifPerson } from '#shared/types/motif'
import type { StudioRole } from '#shared/types/studio'
import type { MotifListQuery } from '#shared/validation/motifs'
import { Motif, User } from '../db/models'
import { motifChart } from '../db/motifs'

// Motifs: who sees what, and the shapes the API answers with. Owners and designers see
// every motif of their studio; knitters see the published ones. Anything else is a 404.

const people = [
  { model: User, as: 'creator', attributes: ['id', 'name'] },
  { model: User, as: 'editor', attributes: ['id', 'name'] },
]

/**
 * A motif the caller may see, with at least `least` role in its studio, or an error:
 * not a member, or a knitter asking for a draft → 404; a lower role → 403.
 */
export async function requireMotif(event: H3Event, id: number, least: StudioRole = 'knitter') {
  const motif = await Motif.findByPk(id, { include: people })
  const { user, role } = await studioMember(event, motif?.studioId, least, { what: 'Motif', sees: role => role !== 'knitter' || motif!.published })
  return { user, motif: motif!, role } // no motif: studioMember answered 404
}

function person(user: User | null | undefined): MotifPerson | null {
  return user ? { id: user.id, name: user.name } : null
}

export function motifDetail(motif: Motif): MotifDetail {
  return {
    id: motif.id,
    studioId: motif.studioId,
    name: motif.name,
    width: motif.width,
    height: motif.height,
    rows: chartToRows(motifChart(motif)),
    published: motif.published,
    floatReport: motif.floatReport,
    picture: motif.pictureType ? { url: `/api/motifs/${motif.id}/picture` } : null,
    createdBy: person(motif.creator),
    updatedBy: person(motif.editor),
    createdAt: motif.createdAt.toISOString(),
    updatedAt: motif.updatedAt.toISOString(),
    version: motif.version,
  }
}

/** A motif with its people loaded, as the API answers it. */
export async function loadMotifDetail(id: number): Promise<MotifDetail> {
  return motifDetail((await Motif.findByPk(id, { include: people, rejectOnEmpty: true })))
}

/**
 * Applies a change made from version `expected` (undefined: from whatever the motif is now) and
 * answers the motif exactly as this change left it. A motif that has moved on since is a 409
 * carrying the current copy; nothing is saved.
 */
export async function updateMotif(id: number, expected: number | undefined, changes: Partial<Attributes<Motif>>): Promise<MotifDetail> {
  const saved = await useDb().transaction(async (transaction) => {
    if (!(await updateAtVersion(Motif, id, expected, changes, transaction))) return null
    return Motif.findByPk(id, { include: people, transaction, rejectOnEmpty: true })
  })
  if (saved) return motifDetail(saved)
  const current = await Motif.findByPk(id, { include: people })
  if (!current) throw createError({ statusCode: 404, message: 'Motif not found' })
  throw changedElsewhere('motif', motifDetail(current))
}

// Main colour light, contrast colour dark: the way a drawn chart is read.
const MAIN_RGB = [0xf4, 0xf1, 0xea] as const
const CONTRAST_RGB = [0x1f, 0x2a, 0x33] as const

/**
 * The chart as a PNG picture: `scale` × `scale` pixels per stitch, the top row of the
 * picture is the last row knitted, column 1 is on the left.
 */
export function chartPng(chart: Chart, scale = 1): Buffer {
  const png = new PNG({ width: chart.width * scale, height: chart.height * scale, colorType: 2, inputHasAlpha: true })
  for (let y = 0; y < png.height; y++) {
    const row = chart.height - 1 - Math.floor(y / scale)
    for (let x = 0; x < png.width; x++) {
      const rgb = chart.cells[row * chart.width + Math.floor(x / scale)] ? CONTRAST_RGB : MAIN_RGB
      const i = (y * png.width + x) * 4
      png.data[i] = rgb[0]
      png.data[i + 1] = rgb[1]
      png.data[i + 2] = rgb[2]
      png.data[i + 3] = 255
    }
  }
  return PNG.sync.write(png, { colorType: 2 })
}

const sortColumns: Record<MotifListQuery['sort'], string> = {
  name: 'name', updatedAt: 'updatedAt', width: 'width', height: 'height', longest: 'longestFloat',
}

/** Escapes LIKE wildcards so a search for "50%" finds "50%", not everything. */
function likeText(text: string) {
  return `%${text.replace(/[\\%_]/g, m => `\\${m}`)}%`
}

/** One page of a studio's library for a caller with `role`. */
export async function motifPage(query: MotifListQuery, role: StudioRole): Promise<MotifPage> {
  const where: WhereOptions<Motif> = { studioId: query.studioId }
  if (role === 'knitter') where.published = true
  else if (query.published !== undefined) where.published = query.published
  if (query.verdict) where.verdict = query.verdict
  if (query.q) where.name = { [Op.like]: likeText(query.q) }
  if (query.maxWidth) where.width = { [Op.lte]: query.maxWidth }
  if (query.maxHeight) where.height = { [Op.lte]: query.maxHeight }
  const dir = query.dir.toUpperCase()
  // The id breaks ties, so a page boundary never shows a motif twice or skips one.
  const order: Order = [[sortColumns[query.sort], dir], ['id', dir]]
  if (query.sort !== 'name') order.splice(1, 0, ['name', 'ASC'])
  const { rows, count } = await Motif.findAndCountAll({
    where, order, include: [people[1]!], distinct: true,
    limit: query.pageSize, offset: (query.page - 1) * query.pageSize,
  })
  return { items: rows.map(motifListItem), total: count, page: query.page, pageSize: query.pageSize }
}

export function motifListItem(m: Motif): MotifListItem {
  return {
    id: m.id, name: m.name, width: m.width, height: m.height, published: m.published,
    verdict: m.floatReport?.verdict ?? null, maxFloat: m.floatReport?.maxFloat ?? null,
    thumbnail: `data:image/png;base64,${chartPng(motifChart(m)).toString('base64')}`,
    updatedBy: person(m.editor), updatedAt: m.updatedAt.toISOString(),
  }
}
