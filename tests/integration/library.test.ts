import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { Motif, Yarn } from '../../server/db/models'

let s: Awaited<ReturnType<typeof makeStudio>>
beforeAll(async () => {
  s = await makeStudio()
  await Motif.create({ studioId: s.studio.id, name: 'Shown', width: 2, height: 1, cells: '01', published: true, createdBy: null, updatedBy: null })
  await Motif.create({ studioId: s.studio.id, name: 'Draft', width: 2, height: 1, cells: '10', published: false, createdBy: null, updatedBy: null })
  await Yarn.create({ studioId: s.studio.id, name: 'Oat', hex: '#e8dcc0', weightCategory: 1, metresPer100g: 400 })
})
afterAll(closeTestDb)

describe('motif and yarn lists', () => {
  it('knitters see published motifs only; designers see drafts too', async () => {
    const knitter = await signedIn(s.knitter.email, fixturePassword)
    const designer = await signedIn(s.designer.email, fixturePassword)
    expect((await knitter.get(`/api/motifs?studioId=${s.studio.id}`)).body.items.map((m: { name: string }) => m.name)).toEqual(['Shown'])
    expect((await designer.get(`/api/motifs?studioId=${s.studio.id}`)).body.items.map((m: { name: string }) => m.name)).toEqual(['Draft', 'Shown'])
  })

  it('lists the yarn stock and refuses a missing or bad studio id with a 400 naming it', async () => {
    const knitter = await signedIn(s.knitter.email, fixturePassword)
    expect((await knitter.get(`/api/yarns?studioId=${s.studio.id}`)).body).toEqual([
      expect.objectContaining({ name: 'Oat', hex: '#e8dcc0', metresPer100g: 400 }),
    ])
    const missing = await knitter.get('/api/yarns')
    expect(missing.status).toBe(400)
    expect(missing.body.message).toContain('studioId')
  })
})
