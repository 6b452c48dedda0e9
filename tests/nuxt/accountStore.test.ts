import { beforeEach, describe, expect, it } from 'vitest'
import { registerEndpoint } from '@nuxt/test-utils/runtime'

// Who is signed in, as the app keeps it: only the server's 401 signs a person out; a sign-out
// made offline is owed to the server and sent before anyone is taken for signed in again.
const person = { user: { id: 5, email: 'tamsin@example.test', name: 'Tamsin Roe' }, studios: [{ id: 9, name: 'Saltmarsh', role: 'knitter', personal: false }] }
let meStatus = 200
const logouts: number[] = []

registerEndpoint('/api/me', (event) => {
  if (meStatus === 200) return person
  event.node.res.statusCode = meStatus
  return { statusCode: meStatus, message: meStatus === 401 ? 'Sign in first' : 'The database is not answering' }
})
registerEndpoint('/api/auth/logout', { method: 'POST', handler: () => { logouts.push(Date.now()); meStatus = 401; return { ok: true } } })

beforeEach(() => {
  useAccountStore().me = null
  localStorage.clear()
  meStatus = 200
  logouts.length = 0
})

describe('the account store', () => {
  it('keeps the person through a server error and forgets them, and their studio, on a 401', async () => {
    const account = useAccountStore()
    await account.refresh()
    account.chooseStudio(9)
    expect(account.me?.user.id).toBe(5)
    meStatus = 503
    await account.refresh()
    expect(account.me?.user.id).toBe(5)
    meStatus = 401
    await account.refresh()
    expect(account.me).toBeNull()
    expect(localStorage.getItem('fw-me')).toBeNull()
    expect(localStorage.getItem('fw-studio')).toBeNull()
  })

  it('sends a sign-out made offline before asking who is signed in, and a new sign-in cancels it', async () => {
    const account = useAccountStore()
    await account.refresh()
    account.reset({ serverStillSignedIn: true })
    await account.refresh()
    expect(logouts).toHaveLength(1)
    expect(account.me).toBeNull()

    account.reset({ serverStillSignedIn: true })
    meStatus = 200 // the next person signed in meanwhile: their new cookie replaced the old one
    await account.afterSignIn()
    expect(logouts).toHaveLength(1)
    expect(account.me?.user.id).toBe(5)
  })

  it('says what the person may do in the studio the screens look at, or in a named one', () => {
    const account = useAccountStore()
    expect(account.role).toBeNull()
    expect(account.can('knitter')).toBe(false) // nobody signed in: no studio, nothing
    account.me = { user: person.user, studios: [
      { id: 9, name: 'Saltmarsh', role: 'knitter', personal: false },
      { id: 11, name: 'Tamsin\'s studio', role: 'owner', personal: true },
      { id: 12, name: 'Harbour', role: 'designer', personal: false },
    ] }
    account.chooseStudio(9)
    expect(account.role).toBe('knitter')
    expect([account.can('knitter'), account.can('designer'), account.can('owner')]).toEqual([true, false, false])
    account.chooseStudio(12)
    expect(account.role).toBe('designer')
    expect([account.can('knitter'), account.can('designer'), account.can('owner')]).toEqual([true, true, false])
    account.chooseStudio(11)
    expect([account.can('knitter'), account.can('designer'), account.can('owner')]).toEqual([true, true, true])
    // A motif opened from a link may be another studio's: its own studio's role counts.
    expect(account.can('designer', 9)).toBe(false)
    expect(account.can('designer', 12)).toBe(true)
    expect(account.can('knitter', 404)).toBe(false)
  })
})
