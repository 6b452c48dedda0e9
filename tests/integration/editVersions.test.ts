import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn, type ApiClient, type ApiResponse } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { storedRows } from '../support/storedRows'
import type { MotifDetail } from '#shared/types/motif'
import type { PlanDetail } from '#shared/types/plan'

// Edits that cannot overwrite each other: a change names the version it was made from (body
// `version`, or `If-Match`); when the motif or plan has moved on, the answer is a 409 carrying
// the current copy and nothing is saved. A change naming no version is applied as before.

let s: Awaited<ReturnType<typeof makeStudio>>
let designer: ApiClient
let owner: ApiClient
beforeAll(async () => {
  s = await makeStudio()
  designer = await signedIn(s.designer.email, fixturePassword)
  owner = await signedIn(s.owner.email, fixturePassword)
})
afterAll(closeTestDb)

function ok<T>(res: ApiResponse<T>, status = 200): T {
  expect(res.status, JSON.stringify(res.body)).toBe(status)
  return res.body
}

/** The 409 contract: a clean JSON error whose data.current is the whole copy as it is now. */
function expectChangedElsewhere(res: ApiResponse, current: unknown, what: 'motif' | 'plan') {
  expect(res.status, JSON.stringify(res.body)).toBe(409)
  expect(res.headers.get('content-type')).toMatch(/application\/json/)
  expect(res.body).toMatchObject({ statusCode: 409, statusMessage: 'Conflict' })
  expect(res.body.message).toMatch(new RegExp(`^Changed elsewhere: .+ saved this ${what} after you opened it`))
  expect(res.body.data.current).toEqual(current)
}

describe('motifs', () => {
  const newMotif = async () => ok<MotifDetail>(await designer.post('/api/motifs', { studioId: s.studio.id, name: 'Shared stars', rows: ['....', '....'] }), 201)

  it('two people read version v: the first change is saved as v+1, the second is a 409 with the current motif', async () => {
    const made = await newMotif()
    expect(made.version).toBe(0)
    const read = ok<MotifDetail>(await owner.get(`/api/motifs/${made.id}`))
    expect(read.version).toBe(0)

    const first = await designer.patch<MotifDetail>(`/api/motifs/${made.id}`, { rows: ['x...', '....'], version: read.version })
    expect(ok(first)).toMatchObject({ version: 1, rows: ['x...', '....'], updatedBy: { id: s.designer.id, name: s.designer.name } })
    expect(first.headers.get('etag')).toBe('"1"')

    const before = await storedRows([s.studio.id])
    const second = await owner.patch(`/api/motifs/${made.id}`, { rows: ['...x', '....'], name: 'Owner stars', version: read.version })
    const now = ok<MotifDetail>(await owner.get(`/api/motifs/${made.id}`))
    expectChangedElsewhere(second, now, 'motif')
    expect(second.body.message).toContain(`${s.designer.name} saved this motif`)
    expect(second.body.message).toContain('version 1')
    // Nothing of the refused change is stored.
    expect(now).toMatchObject({ version: 1, name: 'Shared stars', rows: ['x...', '....'] })
    expect(await storedRows([s.studio.id])).toEqual(before)

    // Sent again from the copy the 409 carried: saved, knowingly over the first change.
    const again = ok(await owner.patch<MotifDetail>(`/api/motifs/${made.id}`, { rows: ['...x', '....'], version: second.body.data.current.version }))
    expect(again).toMatchObject({ version: 2, rows: ['...x', '....'], updatedBy: { id: s.owner.id } })
  })

  it('takes the version from If-Match too (quoted like the ETag it answers with); the body\'s version wins over the header', async () => {
    const made = await newMotif()
    const read = await owner.get<MotifDetail>(`/api/motifs/${made.id}`)
    expect(read.headers.get('etag')).toBe('"0"')
    expect(ok(await designer.patch<MotifDetail>(`/api/motifs/${made.id}`, { name: 'Tagged' }, { 'if-match': read.headers.get('etag')! })).version).toBe(1)
    expectChangedElsewhere(
      await owner.patch(`/api/motifs/${made.id}`, { name: 'Stale tag' }, { 'if-match': '"0"' }),
      ok(await owner.get(`/api/motifs/${made.id}`)),
      'motif',
    )
    // A bare number is read as the same tag; `*` means any version (no check).
    expect(ok(await owner.patch<MotifDetail>(`/api/motifs/${made.id}`, { name: 'Bare tag' }, { 'if-match': '1' })).version).toBe(2)
    expect(ok(await owner.patch<MotifDetail>(`/api/motifs/${made.id}`, { name: 'Any tag' }, { 'if-match': '*' })).version).toBe(3)
    // Body first: a current body version passes a stale header, a stale body version fails a current one.
    expect(ok(await owner.patch<MotifDetail>(`/api/motifs/${made.id}`, { name: 'Body wins', version: 3 }, { 'if-match': '"0"' })).version).toBe(4)
    expect((await owner.patch(`/api/motifs/${made.id}`, { name: 'Body loses', version: 0 }, { 'if-match': '"4"' })).status).toBe(409)
  })

  it('a change naming no version is saved as before (last write wins), and still counts as a change', async () => {
    const made = await newMotif()
    ok(await designer.patch(`/api/motifs/${made.id}`, { rows: ['xx..', '....'] }))
    const last = ok<MotifDetail>(await owner.patch(`/api/motifs/${made.id}`, { rows: ['..xx', '....'] }))
    expect(last).toMatchObject({ version: 2, rows: ['..xx', '....'] })
    // Publishing is a change like any other: it moves the version, so an older copy is refused.
    expect(ok(await designer.patch<MotifDetail>(`/api/motifs/${made.id}`, { published: true, version: 2 })).version).toBe(3)
    expect((await owner.patch(`/api/motifs/${made.id}`, { published: false, version: 2 })).status).toBe(409)
  })

  it.each([
    ['a negative version', { version: -1 }, {}, 'version: must be at least 0'],
    ['a fraction', { version: 1.5 }, {}, 'version: must be a whole number'],
    ['text', { version: '1' }, {}, 'version: must be a number'],
    ['a weak tag', {}, { 'if-match': 'W/"0"' }, 'If-Match: must be one version in quotes'],
    ['a list of tags', {}, { 'if-match': '"0", "1"' }, 'If-Match: must be one version in quotes'],
    ['a tag that is no number', {}, { 'if-match': '"abc"' }, 'If-Match: must be one version in quotes'],
  ])('%s is a 400 naming the field, and nothing is saved', async (_, body, headers, message) => {
    const made = await newMotif()
    const res = await designer.patch(`/api/motifs/${made.id}`, { name: 'Bad version', ...body }, headers)
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toContain(message)
    expect(res.body.data.issues[0].path).toEqual([message.split(':')[0]])
    expect(ok(await designer.get<MotifDetail>(`/api/motifs/${made.id}`))).toEqual(made)
  })

  it('of several changes sent at once from the same version, exactly one is saved', async () => {
    const made = await newMotif()
    const rows = (i: number) => ['....'.split('').map((_, c) => (c === i ? 'x' : '.')).join(''), '....']
    const answers = await Promise.all([0, 1, 2, 3].map(i => (i % 2 ? owner : designer).patch(`/api/motifs/${made.id}`, { rows: rows(i), version: 0 })))
    const won = answers.filter(a => a.status === 200)
    expect(answers.map(a => a.status).sort()).toEqual([200, 409, 409, 409])
    const now = ok<MotifDetail>(await designer.get(`/api/motifs/${made.id}`))
    expect(now).toEqual(won[0]!.body)
    expect(now.version).toBe(1)
    for (const lost of answers.filter(a => a.status === 409)) expect(lost.body.data.current.rows).toEqual(now.rows)
  })
})

describe('plans', () => {
  let motifId: number
  beforeAll(async () => {
    motifId = ok<MotifDetail>(await designer.post('/api/motifs', { studioId: s.studio.id, name: 'Plan checks', rows: ['x.', '.x'] }), 201).id
  })
  const piece = (name: string) => ({
    name,
    targetWidth: 20,
    targetLength: 10,
    sections: [
      { kind: 'plain', rows: 4, yarn: 'A' },
      { kind: 'motif', motifId, placement: 'centred', chartRows: 2, main: 'A', contrast: 'B' },
    ],
  })
  const newPlan = async () => ok<PlanDetail>(await designer.post('/api/plans', { studioId: s.studio.id, name: 'Shared jumper', pieces: [piece('Back')] }), 201)

  it('two people read version v: the first change is saved as v+1, the second is a 409 with the current plan', async () => {
    const made = await newPlan()
    expect(made.version).toBe(0)
    const read = ok<PlanDetail>(await owner.get(`/api/plans/${made.id}`))
    const first = await designer.patch<PlanDetail>(`/api/plans/${made.id}`, { pieces: [piece('Front'), piece('Back')], version: read.version })
    expect(ok(first)).toMatchObject({ version: 1, pieceCount: 2 })
    expect(first.headers.get('etag')).toBe('"1"')

    const before = await storedRows([s.studio.id])
    const second = await owner.patch(`/api/plans/${made.id}`, { name: 'Owner jumper', pieces: [piece('Sleeve')], version: read.version })
    const now = ok<PlanDetail>(await designer.get(`/api/plans/${made.id}`))
    expectChangedElsewhere(second, now, 'plan')
    expect(now).toMatchObject({ version: 1, name: 'Shared jumper' })
    expect(now.pieces.map(p => p.name)).toEqual(['Front', 'Back'])
    expect(await storedRows([s.studio.id])).toEqual(before)

    expect(ok(await owner.patch<PlanDetail>(`/api/plans/${made.id}`, { name: 'Owner jumper' }, { 'if-match': `"${now.version}"` }))).toMatchObject({
      version: 2,
      name: 'Owner jumper',
    })
    // Publishing moves the version as well; a change naming none is saved as before.
    expect(ok(await designer.patch<PlanDetail>(`/api/plans/${made.id}`, { published: true, version: 2 })).version).toBe(3)
    expect((await owner.patch(`/api/plans/${made.id}`, { notes: 'From an old copy', version: 2 })).status).toBe(409)
    expect(ok(await owner.patch<PlanDetail>(`/api/plans/${made.id}`, { notes: 'No version named' }))).toMatchObject({ version: 4, notes: 'No version named' })
  })

  it('a bad version is a 400 naming it', async () => {
    const made = await newPlan()
    const res = await designer.patch(`/api/plans/${made.id}`, { name: 'Bad', version: 2 ** 32 })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toEqual(['version'])
  })

  it('of two piece rewrites sent at once from the same version, exactly one is saved, whole', async () => {
    const made = await newPlan()
    const answers = await Promise.all([
      designer.patch(`/api/plans/${made.id}`, { pieces: [piece('Front'), piece('Back')], version: 0 }),
      owner.patch(`/api/plans/${made.id}`, { pieces: [piece('Left sleeve'), piece('Right sleeve'), piece('Yoke')], version: 0 }),
    ])
    expect(answers.map(a => a.status).sort()).toEqual([200, 409])
    const won = answers.find(a => a.status === 200)!.body
    const now = ok<PlanDetail>(await designer.get(`/api/plans/${made.id}`))
    expect(now).toEqual(won)
    expect(now.version).toBe(1)
    expect(answers.find(a => a.status === 409)!.body.data.current).toEqual(now)
  })
})
