/**
 * One kind of studio stock (machines, yarns, swatches): the list for the current studio and
 * the add / change / delete calls, each through a form state so server errors sit by fields.
 */
export function useStock<T extends { id: number }>(resource: 'machines' | 'yarns' | 'swatches') {
  const account = useAccountStore()
  const studioId = computed(() => account.currentStudio?.id)
  const key = computed(() => `stock-${resource}-${studioId.value}`)
  const list = useFetch<T[]>(`/api/${resource}`, { key, query: { studioId }, immediate: !!studioId.value, watch: [studioId], default: () => [] })
  const form = useForm()

  /** Adds (no id) or changes (with id) a row; true when the server took it. */
  async function save(id: number | null, body: Record<string, unknown>) {
    const saved = await form.submit(() => id
      ? $fetch<T>(`/api/${resource}/${id}`, { method: 'PATCH', body })
      : $fetch<T>(`/api/${resource}`, { method: 'POST', body: { ...body, studioId: studioId.value } }))
    if (!saved) return false
    await list.refresh()
    return true
  }

  async function remove(id: number) {
    const done = await form.submit(() => $fetch(`/api/${resource}/${id}`, { method: 'DELETE' }).then(() => true))
    if (done) await list.refresh()
    return !!done
  }

  return { studioId, items: list.data, pending: list.pending, error: list.error, refresh: list.refresh, form, save, remove }
}
