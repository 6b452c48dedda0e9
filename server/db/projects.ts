import type { Transaction } from 'sequelize'
import { compilePieceTimeline } from '#shared/piece/timeline'
import type { ProjectPlanSnapshot, ProjectYarn } from '#shared/types/knit'
import type { PieceTimeline } from '#shared/piece/types'
import { Piece, Project } from './models'

// Writing a project with its pieces. Plain module (no Nitro auto-imports) so the API, the
// demo seed and the test fixtures all make projects the same way.

export interface ProjectDraft {
  studioId: number
  knitterId: number
  name: string
  machineId?: number | null
  motifId?: number | null
  yarns: ProjectYarn[]
  notes?: string
  source: ProjectPlanSnapshot['source']
  motifName?: string
  plan?: ProjectPlanSnapshot['plan']
  pieces: { name: string; timeline: PieceTimeline }[]
}

/**
 * Compiles every piece with the engine (throws its KnittingInputError, naming
 * `pieces[i].sections[j]…`, before anything is written) and stores project and pieces.
 */
export async function insertProject(draft: ProjectDraft, transaction: Transaction): Promise<Project> {
  const totals = draft.pieces.map((p, i) => {
    try { return compilePieceTimeline(p.timeline).rows.length }
    catch (e) {
      if (e instanceof Error && 'field' in e) (e as { field?: string }).field = `pieces[${i}].${(e as { field?: string }).field ?? ''}`
      throw e
    }
  })
  const snapshot: ProjectPlanSnapshot = {
    source: draft.source,
    motif: draft.motifName ? { id: draft.motifId ?? null, name: draft.motifName } : null,
    ...(draft.plan ? { plan: draft.plan } : {}),
    pieces: draft.pieces.map(p => ({ name: p.name, timeline: p.timeline })),
  }
  const project = await Project.create({
    studioId: draft.studioId,
    knitterId: draft.knitterId,
    name: draft.name,
    planSnapshot: snapshot,
    machineId: draft.machineId ?? null,
    motifId: draft.motifId ?? null,
    yarns: draft.yarns,
    notes: draft.notes ?? '',
  }, { transaction })
  for (const [i, p] of draft.pieces.entries()) {
    await Piece.create({ projectId: project.id, name: p.name, position: i + 1, timeline: p.timeline, totalRows: totals[i]! }, { transaction })
  }
  return project
}
