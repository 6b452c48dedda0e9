import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStock, makeStudio } from '../support/db'
import { PlanPiece } from '../../server/db/models'

// Each copy of a plan piece becomes a project piece named "<piece> 1 of 2", in a column as long
// as the piece name's own (120): the name's limit counts the longest suffix of its copies.

let s: Awaited<ReturnType<typeof makeStudio>>
beforeAll(async () => {
  s = await makeStudio()
})
afterAll(closeTestDb)

describe('copies of a plan piece named "<piece> 1 of 2"', () => {
  let designer: ApiClient
  let knitter: ApiClient
  let stock: Awaited<ReturnType<typeof makeStock>>
  let machineId: number
  let swatchId: number
  beforeAll(async () => {
    designer = await signedIn(s.designer.email, fixturePassword)
    knitter = await signedIn(s.knitter.email, fixturePassword)
    stock = await makeStock(s.studio.id)
    machineId = (await designer.post('/api/machines', { studioId: s.studio.id, name: 'Copies machine', needlePitchMm: 4.5, needles: 200, patterningWidth: 24 }))
      .body.id
    swatchId = (await designer.post('/api/swatches', { studioId: s.studio.id, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 6 })).body.id
  })

  const plan = (pieceName: string, copies: number) => ({
    studioId: s.studio.id, name: 'Copies jumper', machineId, swatchId, published: true,
    yarns: [{ slot: 'A', yarnId: stock.main.id }],
    pieces: [{ name: pieceName, copies, targetWidth: 20, targetLength: 10, sections: [{ kind: 'plain', rows: 4, yarn: 'A' }] }],
  })
  const named = (n: number) => 'S'.repeat(n)

  it.each([[114, 2], [120, 2], [112, 10]])('a piece name of %i characters with %i copies is a 400 naming the field and its limit', async (n, copies) => {
    const longest = 120 - ` ${copies} of ${copies}`.length
    const res = await designer.post('/api/plans', plan(named(n), copies))
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.data.issues).toEqual([expect.objectContaining({ path: ['pieces', '0', 'name'] })])
    expect(res.body.message).toContain(`pieces.0.name: must be at most ${longest} characters with ${copies} copies`)
    // A patch that raises the copies of a stored piece is judged the same way.
    const stored = await designer.post('/api/plans', plan(named(n), 1))
    expect(stored.status).toBe(201)
    const patched = await designer.patch(`/api/plans/${stored.body.id}`, { pieces: [plan(named(n), copies).pieces[0]] })
    expect(patched.status).toBe(400)
    expect(patched.body.data.issues[0].path).toEqual(['pieces', '0', 'name'])
  })

  it.each([[113, 2], [111, 10], [120, 1]])('a piece name of %i characters with %i copies fits: each copy is a piece of the project', async (n, copies) => {
    const made = await designer.post('/api/plans', plan(named(n), copies))
    expect(made.status, JSON.stringify(made.body)).toBe(201)
    const project = await knitter.post(`/api/plans/${made.body.id}/projects`, {})
    expect(project.status, JSON.stringify(project.body)).toBe(201)
    const names = project.body.pieces.map((p: { name: string }) => p.name)
    expect(names).toEqual(Array.from({ length: copies }, (_, k) => copies > 1 ? `${named(n)} ${k + 1} of ${copies}` : named(n)))
    expect(Math.max(...names.map((x: string) => x.length))).toBeLessThanOrEqual(120)
  })

  it('a plan stored before the limit (a 120-character piece, 2 copies) still starts a project, the copies cut with an ellipsis', async () => {
    const made = await designer.post('/api/plans', plan(named(113), 2))
    expect(made.status).toBe(201)
    await PlanPiece.update({ name: named(120) }, { where: { planId: made.body.id } })
    const project = await knitter.post(`/api/plans/${made.body.id}/projects`, {})
    expect(project.status, JSON.stringify(project.body)).toBe(201)
    expect(project.body.pieces.map((p: { name: string }) => p.name)).toEqual([`${named(112)}… 1 of 2`, `${named(112)}… 2 of 2`])
  })
})
