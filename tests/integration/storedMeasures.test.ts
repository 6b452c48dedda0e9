import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { storedRows } from '../support/storedRows'

// Measures are kept in DECIMAL columns with one or two decimal places. A measure more than 0
// but below one step passed validation, was stored as 0 and then divided by: a swatch 0 cm
// high broke its own answer and every later list of the studio's swatches with a 500.

let s: Awaited<ReturnType<typeof makeStudio>>
let designer: ApiClient
beforeAll(async () => {
  s = await makeStudio()
  designer = await signedIn(s.designer.email, fixturePassword)
})
afterAll(closeTestDb)

const swatch = (overrides: Record<string, unknown>) => ({
  studioId: s?.studio.id,
  stitches: 30,
  rows: 40,
  width: 10,
  height: 10,
  unit: 'cm',
  grams: 6,
  ...overrides,
})

describe('a measure below what its column keeps', () => {
  it.each([
    ['/api/swatches', 'height', 8.4e-323, '0.01', () => swatch({ height: 8.4e-323 })],
    ['/api/swatches', 'width', 0.004, '0.01', () => swatch({ width: 0.004 })],
    [
      '/api/machines',
      'needlePitchMm',
      0.001,
      '0.01',
      () => ({ studioId: s.studio.id, name: 'Tiny pitch', needlePitchMm: 0.001, needles: 200, patterningWidth: 24 }),
    ],
    ['/api/yarns', 'metresPer100g', 0.04, '0.1', () => ({ studioId: s.studio.id, name: 'Thin yarn', hex: '#112233', weightCategory: 1, metresPer100g: 0.04 })],
  ] as const)('POST %s with %s %s is a 400 naming the field and the step %s, and stores nothing', async (path, field, _, step, body) => {
    const before = await storedRows([s.studio.id])
    const res = await designer.post(path, body())
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(res.body.message).toContain(`${field}: must be at least ${step}`)
    expect(await storedRows([s.studio.id])).toEqual(before)
    expect((await designer.get(`${path}?studioId=${s.studio.id}`)).status).toBe(200)
  })

  it('one step is kept and worked with', async () => {
    const res = await designer.post('/api/swatches', swatch({ width: 0.01, height: 0.01 }))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ width: 0.01, height: 0.01, gauge: { stitchesPer10cm: 30000, rowsPer10cm: 40000 } })
    expect((await designer.get(`/api/swatches?studioId=${s.studio.id}`)).status).toBe(200)
  })
})
