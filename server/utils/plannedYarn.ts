import { QueryTypes } from 'sequelize'
import { Plan } from '../db/models'

// What the studio's published plans call for of each yarn, for the yarn stock list.
//
// Working it out runs the whole engine over every published plan, so the answer is kept per
// studio and used again while nothing it depends on has changed. "Changed" is read from the
// database, not from this process's own writes, so every app server of a cluster sees a change
// made through another at once: a fingerprint over the rows the estimate reads (published plans
// and their pieces, machines, swatches, yarns, motifs of the studio) — per table the row count,
// the newest updated_at (milliseconds) and a checksum over every row's id and updated_at, so an
// edit, an insert and a delete each change it. One indexed query instead of the engine.

type PlannedGrams = Map<number, { grams: number; plans: number }>

const kept = new Map<number, { fingerprint: string; planned: PlannedGrams }>()
/** Studios kept at most (the oldest entry goes first); a studio's entry is a few hundred bytes. */
const MAX_STUDIOS = 1000

const rowsOf = (from: string) => `SELECT CONCAT_WS('/', COUNT(*), MAX(t.updated_at), SUM(CRC32(CONCAT(t.id, '@', t.updated_at)))) ${from}`

const fingerprintSql = `SELECT CONCAT_WS(' ',
  (${rowsOf('FROM plans t WHERE t.studio_id = :studioId AND t.published = 1')}),
  (${rowsOf('FROM plan_pieces t JOIN plans p ON p.id = t.plan_id WHERE p.studio_id = :studioId AND p.published = 1')}),
  (${rowsOf('FROM machines t WHERE t.studio_id = :studioId')}),
  (${rowsOf('FROM swatches t WHERE t.studio_id = :studioId')}),
  (${rowsOf('FROM yarns t WHERE t.studio_id = :studioId')}),
  (${rowsOf('FROM motifs t WHERE t.studio_id = :studioId')})
) AS fingerprint`

async function fingerprint(studioId: number): Promise<string> {
  const [row] = await useDb().query<{ fingerprint: string }>(fingerprintSql, { replacements: { studioId }, type: QueryTypes.SELECT })
  return row!.fingerprint
}

/** Grams of each yarn the studio's published plans need, and in how many plans. */
export async function plannedGramsByYarn(studioId: number): Promise<PlannedGrams> {
  // Read before working out: a change made meanwhile leaves a fingerprint that no longer matches.
  const now = await fingerprint(studioId)
  const hit = kept.get(studioId)
  if (hit?.fingerprint === now) return hit.planned
  const planned = await workOutPlannedGrams(studioId)
  kept.delete(studioId)
  kept.set(studioId, { fingerprint: now, planned })
  if (kept.size > MAX_STUDIOS) kept.delete(kept.keys().next().value!)
  return planned
}

/**
 * Grams of each yarn the studio's published plans call for, summed over those plans (drafts are
 * still changing, so they do not count). Plans without an estimate add nothing. A plan in several
 * sizes counts its first size: which sizes will be knitted is not known until projects start.
 */
async function workOutPlannedGrams(studioId: number): Promise<PlannedGrams> {
  const plans = await Plan.findAll({ where: { studioId, published: true }, include: planWithPieces })
  const planned: PlannedGrams = new Map()
  for (const plan of plans) {
    const detail = await planDetail(plan, 'owner') // only the grams are used
    for (const y of detail.estimate?.yarns ?? []) {
      const p = planned.get(y.yarnId) ?? { grams: 0, plans: 0 }
      planned.set(y.yarnId, { grams: p.grams + y.grams, plans: p.plans + 1 })
    }
  }
  return planned
}
