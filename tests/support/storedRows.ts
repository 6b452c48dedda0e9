import { QueryTypes } from 'sequelize'
import { testDb } from './db'

// What studios hold, as one comparable value: the row count and the newest change of every
// table a request could write. A refused request must leave it exactly as it was.
const tables = {
  motifs: 'FROM motifs t WHERE t.studio_id IN (:ids)',
  yarns: 'FROM yarns t WHERE t.studio_id IN (:ids)',
  machines: 'FROM machines t WHERE t.studio_id IN (:ids)',
  swatches: 'FROM swatches t WHERE t.studio_id IN (:ids)',
  plans: 'FROM plans t WHERE t.studio_id IN (:ids)',
  planPieces: 'FROM plan_pieces t JOIN plans p ON p.id = t.plan_id WHERE p.studio_id IN (:ids)',
  projects: 'FROM projects t WHERE t.studio_id IN (:ids)',
  pieces: 'FROM pieces t JOIN projects p ON p.id = t.project_id WHERE p.studio_id IN (:ids)',
  invitations: 'FROM invitations t WHERE t.studio_id IN (:ids)',
  memberships: 'FROM memberships t WHERE t.studio_id IN (:ids)',
}

export async function storedRows(studioIds: number[]) {
  const columns = Object.entries(tables).map(([name, from]) => `(SELECT CONCAT(COUNT(*), ' ', COALESCE(MAX(t.updated_at), '-')) ${from}) AS ${name}`)
  const events = `(SELECT COUNT(*) FROM row_events e JOIN pieces t ON t.id = e.piece_id JOIN projects p ON p.id = t.project_id WHERE p.studio_id IN (:ids)) AS rowEvents`
  const [row] = await testDb().query(`SELECT ${[...columns, events].join(', ')}`, { replacements: { ids: studioIds }, type: QueryTypes.SELECT })
  return row as Record<string, string | number>
}
