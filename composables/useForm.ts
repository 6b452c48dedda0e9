/** Submitting state, the message and per-field errors for one form posting to the API. */
export function useForm() {
  const busy = ref(false)
  const message = ref('')
  const tone = ref<'error' | 'ok'>('ok')
  const fields = ref<Record<string, string>>({})

  async function submit<T>(work: () => Promise<T>): Promise<T | undefined> {
    busy.value = true
    message.value = ''
    fields.value = {}
    try {
      return await work()
    }
    catch (error) {
      const described = describeApiError(error)
      tone.value = 'error'
      message.value = described.message
      fields.value = described.fields
    }
    finally {
      busy.value = false
    }
  }

  function say(text: string, as: 'error' | 'ok' = 'ok') {
    tone.value = as
    message.value = text
  }

  return { busy, message, tone, fields, submit, say }
}
