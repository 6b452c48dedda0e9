import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestDb, fixturePassword, makeProject, makeStudio } from '../support/db'
import { Piece, Project, RowEvent } from '../../server/db/models'

// Two tablets of one knitter, each a plain fetch with the knitter's session cookie and its own device id.
let s: Awaited<ReturnType<typeof makeStudio>>
let cookie = ''
beforeAll(async () => {
  s = await makeStudio()
  cookie = (await signedIn(s.knitter.email, fixturePassword)).cookie
})
afterAll(closeTestDb)

interface Step { id?: string; pieceId: number; kind?: 'advance' | 'back' | 'jump'; from: number; to: number; version: number }

function device(deviceId: string, sessionCookie = () => cookie) {
  const baseUrl = inject('baseUrl')
  async function sync(body: unknown) {
    const res = await fetch(`${baseUrl}/api/sync`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'cookie': sessionCookie() },
      body: JSON.stringify(body),
    })
    return { status: res.status, body: await res.json() as any }
  }
  return {
    deviceId,
    sync,
    send: (events: ReturnType<typeof step>[], extra: Record<string, unknown> = {}) => sync({ deviceId, events, ...extra }),
  }
}

function step(e: Step) {
  return { id: e.id ?? randomUUID(), kind: e.kind ?? 'advance', at: new Date().toISOString(), ...e }
}

async function freshPiece(rows?: { before?: number; chartRows?: number; after?: number }) {
  const { pieces, project } = await makeProject({ studioId: s.studio.id, knitterId: s.knitter.id, pieces: ['Back'], shape: rows })
  return { piece: pieces[0]!, project }
}

const log = (pieceId: number) => RowEvent.findAll({ where: { pieceId }, order: [['seq', 'ASC']] })

describe('POST /api/sync', () => {
  it('a replayed batch is accepted again and applied once', async () => {
    const { piece } = await freshPiece()
    const a = device('tablet-a-replay')
    const batch = [step({ pieceId: piece.id, from: 0, to: 1, version: 0 })]
    const first = await a.send(batch)
    const second = await a.send(batch)
    for (const res of [first, second]) {
      expect(res.status).toBe(200)
      expect(res.body.accepted).toEqual([batch[0]!.id])
      expect(res.body.pieces).toEqual([expect.objectContaining({ id: piece.id, completedRows: 1, version: 1, conflict: null })])
    }
    expect(await log(piece.id)).toHaveLength(1)
  })

  it('applies events in order, each on the version before it', async () => {
    const { piece, project } = await freshPiece()
    const a = device('tablet-a-order')
    const res = await a.send([
      step({ pieceId: piece.id, from: 0, to: 1, version: 0 }),
      step({ pieceId: piece.id, from: 1, to: 2, version: 1 }),
      step({ pieceId: piece.id, kind: 'jump', from: 2, to: 9, version: 2 }),
    ])
    expect(res.status).toBe(200)
    expect(res.body.accepted).toHaveLength(3)
    expect(res.body.rejected).toEqual([])
    expect(res.body.pieces).toEqual([
      { id: piece.id, completedRows: 9, totalRows: 14, version: 3, updatedAt: expect.any(String), lastKnittedAt: expect.any(String), conflict: null },
    ])
    const stored = await Piece.findByPk(piece.id)
    expect(stored).toMatchObject({ completedRows: 9, version: 3, lastDeviceId: 'tablet-a-order' })
    expect((await log(piece.id)).map(e => e.outcome)).toEqual(['applied', 'applied', 'applied'])
    expect(await Project.findByPk(project.id)).toMatchObject({ status: 'knitting', startedAt: expect.any(Date) })
  })

  it('two devices on the same version: the second is a conflict until the knitter chooses with a jump', async () => {
    const { piece } = await freshPiece()
    const a = device('tablet-a-conflict')
    const b = device('tablet-b-conflict')
    const fromA = await a.send([step({ pieceId: piece.id, from: 0, to: 5, version: 0 })])
    expect(fromA.body.pieces[0]).toMatchObject({ completedRows: 5, version: 1, conflict: null })

    const fromB = await b.send([step({ pieceId: piece.id, from: 0, to: 3, version: 0 })])
    expect(fromB.body.accepted).toHaveLength(1)
    expect(fromB.body.pieces[0]).toMatchObject({ completedRows: 5, version: 1, conflict: { deviceId: 'tablet-a-conflict', theirs: 5, ours: 3 } })

    // Device A is not in conflict: it hears the place without one.
    expect((await a.send([], { pieceIds: [piece.id] })).body.pieces[0].conflict).toBeNull()

    const chosen = await b.send([step({ pieceId: piece.id, kind: 'jump', from: 5, to: 3, version: 1 })])
    expect(chosen.body.pieces[0]).toMatchObject({ completedRows: 3, version: 2, conflict: null })
    expect((await Piece.findByPk(piece.id))!.lastDeviceId).toBe('tablet-b-conflict')
    expect((await log(piece.id)).map(e => [e.deviceId, e.outcome, e.toRows])).toEqual([
      ['tablet-a-conflict', 'applied', 5], ['tablet-b-conflict', 'conflict', 3], ['tablet-b-conflict', 'applied', 3],
    ])
  })

  it('the same row number on a stale version does not get through', async () => {
    const { piece } = await freshPiece()
    await device('tablet-a-same').send([step({ pieceId: piece.id, from: 0, to: 1, version: 0 }), step({ pieceId: piece.id, from: 1, to: 2, version: 1 })])
    const b = device('tablet-b-same')
    // B went 0 → 2 on its own, built on version 0: the same place, but not the same history.
    const res = await b.send([step({ pieceId: piece.id, kind: 'jump', from: 0, to: 2, version: 0 })])
    expect(res.body.pieces[0]).toMatchObject({ completedRows: 2, version: 2, conflict: { deviceId: 'tablet-a-same', theirs: 2, ours: 2 } })
    expect((await Piece.findByPk(piece.id))!.version).toBe(2)
  })

  it('a device\'s later offline steps after a conflict do not slip through on a coinciding version', async () => {
    const { piece } = await freshPiece()
    await device('tablet-a-chain').send([step({ pieceId: piece.id, from: 0, to: 6, version: 0 })])
    const b = device('tablet-b-chain')
    // B knitted two rows offline from 0: its second step says version 1, which is the server's version now.
    const res = await b.send([step({ pieceId: piece.id, from: 0, to: 1, version: 0 }), step({ pieceId: piece.id, from: 1, to: 2, version: 1 })])
    expect(res.body.pieces[0]).toMatchObject({ completedRows: 6, version: 1, conflict: { deviceId: 'tablet-a-chain', theirs: 6, ours: 2 } })
    expect((await log(piece.id)).map(e => e.outcome)).toEqual(['applied', 'conflict', 'conflict'])
  })

  it('a retry after a lost answer reports the same conflict', async () => {
    const { piece } = await freshPiece()
    await device('tablet-a-lost').send([step({ pieceId: piece.id, from: 0, to: 4, version: 0 })])
    const b = device('tablet-b-lost')
    const batch = [step({ pieceId: piece.id, from: 0, to: 7, version: 0 })]
    const first = await b.send(batch)
    const retry = await b.send(batch)
    expect(retry.body.accepted).toEqual([batch[0]!.id])
    expect(retry.body.pieces).toEqual(first.body.pieces)
    expect(retry.body.pieces[0].conflict).toEqual({ deviceId: 'tablet-a-lost', theirs: 4, ours: 7 })
    expect(await log(piece.id)).toHaveLength(2)
  })

  it('reaching the last row finishes the piece, and the last piece finishes the project', async () => {
    const { pieces, project } = await makeProject({ studioId: s.studio.id, knitterId: s.knitter.id, pieces: ['Left', 'Right'] })
    const a = device('tablet-a-finish')
    await a.send([step({ pieceId: pieces[0]!.id, kind: 'jump', from: 0, to: 14, version: 0 })])
    expect((await Piece.findByPk(pieces[0]!.id))!.finishedAt).toBeInstanceOf(Date)
    expect((await Project.findByPk(project.id))!.status).toBe('knitting')
    await a.send([step({ pieceId: pieces[1]!.id, kind: 'jump', from: 0, to: 14, version: 0 })])
    expect(await Project.findByPk(project.id)).toMatchObject({ status: 'finished', finishedAt: expect.any(Date) })
    // Taking rows back reopens both.
    await a.send([step({ pieceId: pieces[1]!.id, kind: 'back', from: 14, to: 13, version: 1 })])
    expect((await Piece.findByPk(pieces[1]!.id))!.finishedAt).toBeNull()
    expect(await Project.findByPk(project.id)).toMatchObject({ status: 'knitting', finishedAt: null })
  })

  it('takes 500 events in one batch and refuses 501', async () => {
    const { piece } = await freshPiece({ before: 400, chartRows: 100, after: 100 })
    const a = device('tablet-a-bulk')
    const events = Array.from({ length: 500 }, (_, i) => step({ pieceId: piece.id, from: i, to: i + 1, version: i }))
    const res = await a.send(events)
    expect(res.status).toBe(200)
    expect(res.body.accepted).toHaveLength(500)
    expect(res.body.pieces[0]).toMatchObject({ completedRows: 500, version: 500 })

    const tooMany = await a.send(Array.from({ length: 501 }, (_, i) => step({ pieceId: piece.id, from: i, to: i + 1, version: i })))
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.message).toMatch(/events: /)
  }, 60_000)

  it('events for a piece that is not mine are rejected and stored nowhere', async () => {
    const { pieces } = await makeProject({ studioId: s.studio.id, knitterId: s.designer.id, pieces: ['Theirs'] })
    const { piece: mine } = await freshPiece()
    const theirs = step({ pieceId: pieces[0]!.id, from: 0, to: 1, version: 0 })
    const missing = step({ pieceId: 999999999, from: 0, to: 1, version: 0 })
    const ok = step({ pieceId: mine.id, from: 0, to: 1, version: 0 })
    const res = await device('tablet-a-foreign').send([theirs, missing, ok], { pieceIds: [pieces[0]!.id] })
    expect(res.status).toBe(200)
    expect(res.body.accepted).toEqual([ok.id])
    expect(res.body.rejected.map((r: any) => r.id)).toEqual([theirs.id, missing.id])
    expect(res.body.pieces.map((p: any) => p.id)).toEqual([mine.id])
    expect(await RowEvent.count({ where: { id: [theirs.id, missing.id] } })).toBe(0)
    expect((await Piece.findByPk(pieces[0]!.id))!.version).toBe(0)

    // Even the studio's owner may not move the knitter's piece.
    const owner = await signedIn(s.owner.email, fixturePassword)
    const byOwner = await device('tablet-owner', () => owner.cookie).send([step({ pieceId: mine.id, from: 1, to: 2, version: 1 })])
    expect(byOwner.body.rejected).toHaveLength(1)
    expect((await Piece.findByPk(mine.id))!.version).toBe(1)
  })

  it('an event id used by someone else cannot be replayed into their log or mine', async () => {
    const { piece } = await freshPiece()
    const first = step({ pieceId: piece.id, from: 0, to: 1, version: 0 })
    await device('tablet-a-reuse').send([first])
    const { piece: other } = await freshPiece()
    const reused = await device('tablet-a-reuse').send([{ ...first, pieceId: other.id }])
    expect(reused.body.rejected).toEqual([{ id: first.id, reason: expect.any(String) }])
    expect((await Piece.findByPk(other.id))!.version).toBe(0)
  })

  it.each([
    ['deviceId', { deviceId: 'short', events: [] }],
    ['deviceId', { deviceId: 'has spaces in it', events: [] }],
    ['events.0.id', { deviceId: 'tablet-bad-1', events: [{ ...step({ pieceId: 1, from: 0, to: 1, version: 0 }), id: 'not-a-uuid' }] }],
    ['events.0.kind', { deviceId: 'tablet-bad-1', events: [{ ...step({ pieceId: 1, from: 0, to: 1, version: 0 }), kind: 'skip' }] }],
    ['events.0.to', { deviceId: 'tablet-bad-1', events: [step({ pieceId: 1, from: 0, to: -1, version: 0 })] }],
    ['events.0.version', { deviceId: 'tablet-bad-1', events: [step({ pieceId: 1, from: 0, to: 1, version: 1.5 })] }],
    ['events.0.at', { deviceId: 'tablet-bad-1', events: [{ ...step({ pieceId: 1, from: 0, to: 1, version: 0 }), at: 'yesterday' }] }],
    ['pieceIds', { deviceId: 'tablet-bad-1', events: [], pieceIds: Array.from({ length: 101 }, (_, i) => i + 1) }],
  ])('a bad %s is a 400 naming the field', async (field, body) => {
    const res = await device('unused').sync(body)
    expect(res.status).toBe(400)
    expect(res.body.message).toContain(`${field}: `)
  })

  it('an event at 9999-12-31T23:59:59-10:00 (year 10000 in UTC) is a 400 naming events.N.at, and nothing of the batch is stored', async () => {
    const { piece } = await freshPiece()
    const good = step({ pieceId: piece.id, from: 0, to: 1, version: 0 })
    const res = await device('tablet-a-year').send([good, { ...step({ pieceId: piece.id, from: 1, to: 2, version: 1 }), at: '9999-12-31T23:59:59-10:00' }])
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toContain('events.1.at: must be between 2020-01-01 and a day after the server\'s time')
    expect(await log(piece.id)).toHaveLength(0)
  })

  const day = 24 * 60 * 60_000
  it.each([
    ['2019-12-31T23:59:59.999Z (before 2020)', 400, '2019-12-31T23:59:59.999Z'],
    ['2020-01-01T00:00:00.000Z (the first moment of 2020)', 200, '2020-01-01T00:00:00.000Z'],
    ['23 hours ahead of the server', 200, () => new Date(Date.now() + day - 3_600_000).toISOString()],
    ['two days ahead of the server', 400, () => new Date(Date.now() + 2 * day).toISOString()],
    ['0000-01-01T00:00:00Z (year 0)', 400, '0000-01-01T00:00:00Z'],
  ] as const)('an event at %s answers %i', async (_, status, at) => {
    const { piece } = await freshPiece()
    const res = await device('tablet-a-clock').send([{ ...step({ pieceId: piece.id, from: 0, to: 1, version: 0 }), at: typeof at === 'function' ? at() : at }])
    expect(res.status, JSON.stringify(res.body)).toBe(status)
    if (status === 400) expect(res.body.message).toContain('events.0.at: ')
    expect(await log(piece.id)).toHaveLength(status === 200 ? 1 : 0)
  })

  it('a step whose from is not the piece\'s place at the version it names is kept as a conflict and moves nothing', async () => {
    const { piece } = await freshPiece()
    const a = device('tablet-a-from')
    await a.send([step({ pieceId: piece.id, from: 0, to: 2, version: 0 })])
    // Version 1 is the piece's version, but the piece is at row 2 there, not at row 9.
    const res = await a.send([step({ pieceId: piece.id, from: 9, to: 10, version: 1 })])
    expect(res.status).toBe(200)
    expect(res.body.accepted).toHaveLength(1) // kept in the log: the device drops nothing it cannot send again
    expect(res.body.pieces[0]).toMatchObject({ completedRows: 2, version: 1, conflict: { deviceId: 'tablet-a-from', theirs: 2, ours: 10 } })
    // The knitter's jump settles it, as for any conflict; a jump's from is the device's own place.
    const chosen = await a.send([step({ pieceId: piece.id, kind: 'jump', from: 10, to: 10, version: 1 })])
    expect(chosen.body.pieces[0]).toMatchObject({ completedRows: 10, version: 2, conflict: null })
    expect((await log(piece.id)).map(e => [e.outcome, e.fromRows, e.toRows])).toEqual([['applied', 0, 2], ['conflict', 9, 10], ['applied', 10, 10]])
  })

  it('a step past the last row of my piece is a 400 naming it, and nothing of the batch is stored', async () => {
    const { piece } = await freshPiece()
    const good = step({ pieceId: piece.id, from: 0, to: 1, version: 0 })
    const res = await device('tablet-a-bounds').send([good, step({ pieceId: piece.id, from: 1, to: 15, version: 1 })])
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/^Invalid body|events\.1\.to: /)
    expect(res.body.message).toContain('events.1.to: ')
    expect(await log(piece.id)).toHaveLength(0)
  })

  it('signed out is a 401', async () => {
    const res = await device('tablet-anon', () => '').send([])
    expect(res.status).toBe(401)
  })

  it('five identical requests at once apply the batch once', async () => {
    const { piece } = await freshPiece()
    const a = device('tablet-a-race')
    const batch = [
      step({ pieceId: piece.id, from: 0, to: 1, version: 0 }),
      step({ pieceId: piece.id, from: 1, to: 2, version: 1 }),
      step({ pieceId: piece.id, from: 2, to: 3, version: 2 }),
    ]
    const answers = await Promise.all(Array.from({ length: 5 }, () => a.send(batch)))
    for (const res of answers) {
      expect(res.status).toBe(200)
      expect(res.body.accepted).toEqual(batch.map(e => e.id))
    }
    expect(await Piece.findByPk(piece.id)).toMatchObject({ completedRows: 3, version: 3 })
    expect((await log(piece.id)).map(e => e.outcome)).toEqual(['applied', 'applied', 'applied'])
  })

  it('events: [] with pieceIds answers where my pieces stand (page show)', async () => {
    const { piece } = await freshPiece()
    await device('tablet-a-show').send([step({ pieceId: piece.id, from: 0, to: 2, version: 0 })])
    const res = await device('tablet-b-show').send([], { pieceIds: [piece.id] })
    expect(res.body).toEqual({
      accepted: [], rejected: [],
      pieces: [{ id: piece.id, completedRows: 2, totalRows: 14, version: 1, updatedAt: expect.any(String), lastKnittedAt: expect.any(String), conflict: null }],
    })
    const progress = await fetch(`${inject('baseUrl')}/api/pieces/${piece.id}/progress`, { headers: { cookie } })
    expect(await progress.json()).toEqual({ completedRows: 2, version: 1, updatedAt: expect.any(String) })
  })
})
