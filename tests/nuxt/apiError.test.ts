import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import FormField from '~/components/form/FormField.vue'

describe('describeApiError', () => {
  it('puts zod issues next to their fields and keeps the server message', () => {
    const error = {
      statusCode: 400,
      data: { message: 'Invalid body: email: must be an e-mail address', data: { issues: [{ path: ['email'], message: 'must be an e-mail address' }] } },
    }
    expect(describeApiError(error)).toEqual({ message: 'Invalid body: email: must be an e-mail address', fields: { email: 'must be an e-mail address' } })
  })

  it('never shows a server error’s text, and says when there is no connection', () => {
    expect(describeApiError({ statusCode: 500, data: { message: 'TypeError at foo.mjs:12' } }).message).not.toContain('foo.mjs')
    expect(describeApiError(new TypeError('fetch failed')).message).toMatch(/No connection/)
  })
})

describe('FormField', () => {
  it('ties its error to the input for screen readers', async () => {
    const wrapper = await mountSuspended(FormField, { props: { label: 'E-mail', name: 'email', error: 'must be an e-mail address' } })
    const input = wrapper.get('input')
    expect(input.attributes('aria-invalid')).toBe('true')
    const note = wrapper.get(`#${input.attributes('aria-describedby')}`)
    expect(note.text()).toBe('must be an e-mail address')
  })
})
