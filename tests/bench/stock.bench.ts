// The yarn stock list, run by `npm run bench`: GET /api/yarns works out what every published
// plan needs of each yarn, and keeps that answer while nothing it reads has changed
// (server/utils/plannedYarn.ts). Prints the list's time with the kept answer and right after a
// plan changed, against GET /api/machines (one indexed query) measured in the same run.
import { expect, it } from 'vitest'
import { signedIn } from '../support/api'

const PLANS = 20
const CALLS = 30

it('GET /api/yarns with 20 published plans: kept answer and after a change, against GET /api/machines', async () => {
  const designer = await signedIn('designer@floatwise.test', 'floatwise-demo')
  const studioId = (await designer.get('/api/me')).body.studios[0].id as number
  const machines = (await designer.get(`/api/machines?studioId=${studioId}`)).body
  const yarns = (await designer.get(`/api/yarns?studioId=${studioId}`)).body
  const motifs = (await designer.get(`/api/motifs?studioId=${studioId}&pageSize=200`)).body
  const motif = (Array.isArray(motifs) ? motifs : motifs.items)[0]
  const swatch = await designer.post('/api/swatches', { studioId, stitches: 30, rows: 40, width: 10, height: 10, unit: 'cm', grams: 4 })
  const planIds: number[] = []
  for (let i = 0; i < PLANS; i++) {
    const plan = await designer.post('/api/plans', {
      studioId, name: `Stock bench plan ${i + 1}`, machineId: machines[0].id, swatchId: swatch.body.id, published: true,
      yarns: [{ slot: 'A', yarnId: yarns[0].id }, { slot: 'B', yarnId: yarns[1].id }],
      pieces: ['Back', 'Front', 'Sleeve'].map(name => ({ name, targetWidth: 50, targetLength: 60, unit: 'cm', sections: [
        { kind: 'plain', lengthCm: 5, yarn: 'A' },
        { kind: 'motif', motifId: motif.id, placement: 'centred', chartRows: 120, main: 'A', contrast: 'B' },
        { kind: 'plain', lengthCm: 20, yarn: 'A' },
      ] })),
    })
    expect(plan.status, JSON.stringify(plan.body)).toBe(201)
    planIds.push(plan.body.id)
  }

  const timed = async (path: string, before?: (i: number) => Promise<unknown>) => {
    const ms: number[] = []
    for (let i = 0; i < CALLS; i++) {
      await before?.(i)
      const start = performance.now()
      const res = await designer.get(path)
      ms.push(performance.now() - start)
      expect(res.status).toBe(200)
    }
    return ms.sort((a, b) => a - b)[Math.floor(CALLS / 2)]!
  }
  const baseline = await timed(`/api/machines?studioId=${studioId}`)
  const kept = await timed(`/api/yarns?studioId=${studioId}`)
  const changed = await timed(`/api/yarns?studioId=${studioId}`, i => designer.patch(`/api/plans/${planIds[i % PLANS]}`, { notes: `change ${i}` }))
  console.log(`\nGET /api/yarns, ${PLANS} published plans of 3 pieces (median of ${CALLS} calls)`)
  console.table([
    { call: 'GET /api/machines (baseline)', ms: +baseline.toFixed(1), ratio: 1 },
    { call: 'GET /api/yarns, answer kept', ms: +kept.toFixed(1), ratio: +(kept / baseline).toFixed(2) },
    { call: 'GET /api/yarns, a plan just changed', ms: +changed.toFixed(1), ratio: +(changed / baseline).toFixed(2) },
  ])
})
