import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { apiClient, signedIn, type ApiClient } from '../support/api'
import { closeTestDb, fixturePassword, makeStudio } from '../support/db'
import { apiRoutes, clientFor, everyone, roleMatrix, type Fixture, type Who } from '../support/routeCalls'

// Every API route × every kind of caller → the status the server must answer. The rows live
// in tests/support/routeCalls.ts (the fuzz uses the same calls); a new route joins there.
let f: Fixture
const clients = {} as Record<Who, ApiClient>
beforeAll(async () => {
  f = await makeStudio()
  clients.anonymous = apiClient()
  for (const who of ['knitter', 'designer', 'owner', 'outsider'] as const) clients[who] = await signedIn(f[who].email, fixturePassword)
})
afterAll(closeTestDb)

describe('role matrix', () => {
  const cases = roleMatrix.flatMap(row => everyone.map(who => ({ ...row, who, status: row.expect[who] })))
  it.each(cases)('$route as $who → $status', async ({ who, status, ...row }) => {
    // A fresh client with the same cookie, so a cookie set by one row reaches no other
    // (and rows that end sessions get a session or a person of their own).
    const { client, me } = await clientFor(f, who, row, () => {
      const shared = apiClient()
      shared.cookie = clients[who].cookie
      return shared
    })
    const { method, path, body } = await row.call(f, who, me)
    const res = await client.request(method, path, body)
    expect(res.status, JSON.stringify(res.body)).toBe(status)
  })

  it('has a row for every route in server/api', () => {
    const routes = apiRoutes()
    const covered = new Set(roleMatrix.map(r => r.route))
    expect(routes.filter(r => !covered.has(r))).toEqual([])
    expect([...covered].filter(r => !routes.includes(r))).toEqual([])
  })
})
