import type { H3Event } from 'h3'
import { Op } from 'sequelize'
import { KnittingInputError } from '#shared/engine'
import { timelineCard } from '#shared/piece/cardRow'
import { borderedMotifTimeline, compilePieceTimeline, slotYarns } from '#shared/piece/timeline'
import type { KnitterPiece, PieceDetail, PieceProgress, ProjectDetail, ProjectSummary } from '#shared/types/knit'
import { roleAtLeast, type StudioRole } from '#shared/types/studio'
import type { NewProjectBody } from '#shared/validation/projects'
import { Machine, Membership, Motif, Piece, Project, User, Yarn } from '../db/models'
import { insertProject } from '../db/projects'

// Who sees what: owners and designers see every project of their studio; a knitter sees
// the projects they knit. Anything else does not exist for the caller (404).

export type ProjectAccess = 'knitter' | 'viewer'

export function projectAccess(project: Pick<Project, 'knitterId'>, userId: number, role: StudioRole | undefined): ProjectAccess | null {
  if (!role) return null
  if (project.knitterId === userId) return 'knitter'
  return roleAtLeast(role, 'designer') ? 'viewer' : null
}

/** The caller's role per studio. */
export async function rolesByStudio(userId: number): Promise<Map<number, StudioRole>> {
  const rows = await Membership.findAll({ where: { userId }, attributes: ['studioId', 'role'] })
  return new Map(rows.map(m => [m.studioId, m.role]))
}

// Progress lists never need the (large) timeline.
const piecesWithoutTimeline = { model: Piece, as: 'pieces', attributes: { exclude: ['timeline'] } }
const knitterName = { model: User, as: 'knitter', attributes: ['id', 'name'] }
const withoutSnapshot = { exclude: ['planSnapshot'] }

/** A project the caller may see, with its pieces and knitter, or a 404. */
export async function requireProject(event: H3Event, id: number) {
  const project = await Project.findByPk(id, { attributes: withoutSnapshot, include: [piecesWithoutTimeline, knitterName] })
  const { user, role } = await studioMember(event, project?.studioId, 'knitter', {
    what: 'Project',
    sees: (role, user) => !!projectAccess(project!, user.id, role),
  })
  return { user, project: project!, role } // no project, or not the caller's to see: studioMember answered 404
}

/**
 * A piece the caller may see, with its project, or a 404.
 * `withTimeline: false` skips loading the timeline (progress checks).
 */
export async function requirePiece(event: H3Event, id: number, options: { withTimeline?: boolean } = {}) {
  const piece = await Piece.findByPk(id, {
    attributes: options.withTimeline === false ? { exclude: ['timeline'] } : undefined,
    include: [{ model: Project, as: 'project', attributes: { exclude: ['planSnapshot'] } }],
  })
  const project = piece?.project
  const { user, role } = await studioMember(event, project?.studioId, 'knitter', {
    what: 'Piece',
    sees: (role, user) => !!projectAccess(project!, user.id, role),
  })
  return { user, piece: piece!, project: project!, role } // no piece, or not the caller's to see: studioMember answered 404
}

/** Every project the person may see, most recently active first. */
export async function visibleProjects(userId: number): Promise<ProjectSummary[]> {
  const roles = await rolesByStudio(userId)
  const studios = [...roles.keys()]
  const overseen = studios.filter(s => roleAtLeast(roles.get(s), 'designer'))
  const projects = await Project.findAll({
    where: { [Op.or]: [{ studioId: overseen }, { studioId: studios, knitterId: userId }] },
    attributes: withoutSnapshot,
    include: [piecesWithoutTimeline, knitterName],
  })
  return projects.map(projectSummary)
    .sort((a, b) => b.updatedAt.localeCompare(a.updatedAt) || b.id - a.id)
}

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)
const latest = (dates: (Date | null | undefined)[]) => {
  const times = dates.filter((d): d is Date => !!d).map(d => new Date(d).getTime())
  return times.length ? new Date(Math.max(...times)) : null
}

export function projectSummary(project: Project): ProjectSummary {
  const pieces = project.pieces ?? []
  return {
    id: project.id,
    studioId: project.studioId,
    name: project.name,
    status: project.status,
    knitter: { id: project.knitterId, name: project.knitter?.name ?? '' },
    pieceCount: pieces.length,
    piecesDone: pieces.filter(p => p.finishedAt).length,
    completedRows: pieces.reduce((n, p) => n + p.completedRows, 0),
    totalRows: pieces.reduce((n, p) => n + p.totalRows, 0),
    lastKnittedAt: iso(latest(pieces.map(p => p.lastKnittedAt))),
    // A row knitted on any piece counts as activity on the project.
    updatedAt: iso(latest([project.updatedAt, ...pieces.map(p => p.updatedAt)]))!,
  }
}

export function projectDetail(project: Project): ProjectDetail {
  return {
    ...projectSummary(project),
    machineId: project.machineId,
    yarns: project.yarns,
    notes: project.notes,
    startedAt: iso(project.startedAt),
    finishedAt: iso(project.finishedAt),
    pieces: [...(project.pieces ?? [])].sort((a, b) => a.position - b.position || a.id - b.id).map(p => ({
      id: p.id, name: p.name, position: p.position, completedRows: p.completedRows, totalRows: p.totalRows,
      version: p.version, lastKnittedAt: iso(p.lastKnittedAt), finishedAt: iso(p.finishedAt),
    })),
  }
}

export async function loadProjectDetail(id: number): Promise<ProjectDetail> {
  return projectDetail((await Project.findByPk(id, { attributes: withoutSnapshot, include: [piecesWithoutTimeline, knitterName] }))!)
}

/** The pieces of the person's own projects (in studios they still belong to), most recently knitted first. */
export async function knitterPieces(userId: number): Promise<KnitterPiece[]> {
  const studios = [...(await rolesByStudio(userId)).keys()]
  const pieces = await Piece.findAll({
    attributes: { exclude: ['timeline'] },
    include: [{ model: Project, as: 'project', attributes: ['id', 'name'], where: { knitterId: userId, studioId: studios } }],
  })
  const time = (p: Piece) => (p.lastKnittedAt ? new Date(p.lastKnittedAt).getTime() : -Infinity)
  return pieces
    .sort((a, b) => time(b) - time(a) || a.id - b.id)
    .map(p => ({
      id: p.id, projectId: p.projectId, projectName: p.project!.name, name: p.name, position: p.position,
      completedRows: p.completedRows, totalRows: p.totalRows, version: p.version,
      lastKnittedAt: iso(p.lastKnittedAt), finishedAt: iso(p.finishedAt),
    }))
}

export function pieceProgress(piece: Piece): PieceProgress {
  return { completedRows: piece.completedRows, version: piece.version, updatedAt: iso(piece.updatedAt)! }
}

export async function pieceDetail(piece: Piece, project: Project): Promise<PieceDetail> {
  const siblings = await Piece.findAll({
    where: { projectId: project.id },
    attributes: ['id', 'position', 'finishedAt'],
    order: [
      ['position', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  // The next unfinished piece after this one, else the first unfinished one before it.
  const here = siblings.findIndex(p => p.id === piece.id)
  const next = [...siblings.slice(here + 1), ...siblings.slice(0, here)].find(p => !p.finishedAt)
  return {
    id: piece.id, projectId: project.id, projectName: project.name, name: piece.name, position: piece.position,
    completedRows: piece.completedRows, totalRows: piece.totalRows, version: piece.version,
    updatedAt: iso(piece.updatedAt)!, lastKnittedAt: iso(piece.lastKnittedAt), finishedAt: iso(piece.finishedAt),
    timeline: piece.timeline,
    nextPieceId: next?.id ?? null,
  }
}

/** Motif cells as stored ('0'/'1', row 0 first knitted) → chart rows. */
export function motifChartRows(motif: Pick<Motif, 'width' | 'height' | 'cells'>): string[] {
  return Array.from({ length: motif.height }, (_, r) => motif.cells.slice(r * motif.width, (r + 1) * motif.width))
}

/**
 * The "new project" form: the motif between two plain borders, the same timeline for every
 * piece. Knitters may use published motifs only; a motif or yarn that is not the studio's
 * (or not visible to the caller) is named as missing. Returns the new project's id.
 */
export async function createProjectFromForm(body: NewProjectBody, knitterId: number, role: StudioRole): Promise<number> {
  const { studioId } = body
  const motifWhere = roleAtLeast(role, 'designer') ? { id: body.motifId, studioId } : { id: body.motifId, studioId, published: true }
  const [motif, main, contrast, machine] = await Promise.all([
    Motif.findOne({ where: motifWhere }),
    Yarn.findOne({ where: { id: body.mainYarnId, studioId } }),
    Yarn.findOne({ where: { id: body.contrastYarnId, studioId } }),
    body.machineId ? Machine.findOne({ where: { id: body.machineId, studioId } }) : null,
  ])
  if (!motif) throw fieldError('motifId', 'no such motif in this studio')
  if (!main) throw fieldError('mainYarnId', 'no such yarn in this studio')
  if (!contrast) throw fieldError('contrastYarnId', 'no such yarn in this studio')
  if (body.machineId && !machine) throw fieldError('machineId', 'no such machine in this studio')
  if (machine && body.needles > machine.needles) throw fieldError('needles', `${machine.name} has ${machine.needles} needles`)

  const stock = [main, contrast]
  const yarns = slotYarns(stock).map((y, i) => ({ ...y, yarnId: stock[i]!.id }))
  const timeline = borderedMotifTimeline({
    technique: body.technique, passesPerColour: body.passesPerColour, needles: body.needles,
    yarns: yarns.map(({ slot, name, hex, symbol }) => ({ slot, name, hex, symbol })),
    motif: { name: motif.name, chart: motifChartRows(motif) },
    chartRows: body.chartRows, borderBefore: body.borderBefore, borderAfter: body.borderAfter,
  })
  const card = machine ? timelineCard({ patterningWidth: machine.patterningWidth, card: machineCard(machine) }, body.technique) : undefined
  if (card) timeline.card = card
  try { compilePieceTimeline(timeline) }
  catch (e) {
    if (!(e instanceof KnittingInputError)) throw e
    // Sections are [border before?, motif, border after?]: name the form field that made the section.
    const fields = [...(body.borderBefore > 0 ? ['borderBefore'] : []), 'chartRows', ...(body.borderAfter > 0 ? ['borderAfter'] : [])]
    const section = Number(/sections\[(\d+)\]/.exec(e.field ?? '')?.[1] ?? -1)
    throw fieldError(fields[section] ?? 'motifId', e.message)
  }
  const project = await useDb().transaction(transaction => insertProject({
    studioId, knitterId, name: body.name, machineId: machine?.id ?? null, motifId: motif.id, yarns,
    notes: body.notes, source: 'new-project-form', motifName: motif.name,
    pieces: body.pieces.map(p => ({ name: p.name, timeline })),
  }, transaction))
  return project.id
}
