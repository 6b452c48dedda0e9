import { Op } from 'sequelize'
import { describeDuration, msPerRow } from '#shared/piece/pace'
import type { ProductionItem } from '#shared/types/plan'
import { Piece, Project, RowEvent, User } from '../db/models'

// The studio's projects not yet finished, most recently knitted first, with a finish estimate
// from the knitter's own recent pace (the same rule as the knit view's).

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null)

export async function studioProduction(studioId: number, now = new Date()): Promise<ProductionItem[]> {
  const projects = await Project.findAll({
    where: { studioId, status: { [Op.ne]: 'finished' } },
    include: [
      { model: Piece, as: 'pieces', attributes: { exclude: ['timeline'] } },
      { model: User, as: 'knitter', attributes: ['id', 'name'] },
    ],
  })
  const items = await Promise.all(projects.map(async (p): Promise<ProductionItem> => {
    const pieces = p.pieces ?? []
    const completedRows = pieces.reduce((n, x) => n + x.completedRows, 0)
    const totalRows = pieces.reduce((n, x) => n + x.totalRows, 0)
    const steps = await RowEvent.findAll({
      where: { pieceId: pieces.map(x => x.id), outcome: 'applied', kind: 'advance' },
      attributes: ['at', 'fromRows', 'toRows'], order: [['seq', 'DESC']], limit: 31,
    })
    const perRow = msPerRow(steps.reverse().map(e => ({ at: new Date(e.at).getTime(), rows: e.toRows - e.fromRows })))
    const left = perRow === null ? null : perRow * (totalRows - completedRows)
    const times = pieces.map(x => x.lastKnittedAt).filter((d): d is Date => !!d).map(d => new Date(d).getTime())
    return {
      projectId: p.id, name: p.name, status: p.status as ProductionItem['status'],
      knitter: { id: p.knitterId, name: p.knitter?.name ?? '' },
      plan: p.planSnapshot.plan ?? null,
      pieceCount: pieces.length, piecesDone: pieces.filter(x => x.finishedAt).length,
      completedRows, totalRows, progress: totalRows ? completedRows / totalRows : 0,
      lastKnittedAt: times.length ? iso(new Date(Math.max(...times))) : null,
      msPerRow: perRow, timeLeft: left === null ? null : describeDuration(left),
      estimatedFinish: left === null ? null : iso(new Date(now.getTime() + left)),
    }
  }))
  const time = (x: ProductionItem) => (x.lastKnittedAt ? Date.parse(x.lastKnittedAt) : -Infinity)
  return items.sort((a, b) => time(b) - time(a) || b.projectId - a.projectId)
}
