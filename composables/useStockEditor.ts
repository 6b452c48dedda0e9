import type { Ref } from 'vue'

/**
 * The add/change form of one stock list (machines, yarns, swatches): which row is open
 * (`undefined` none, `null` a new one), its draft, the server's message per field.
 */
export function useStockEditor<T extends { id: number }, D>(
  stock: ReturnType<typeof useStock<T>>, blank: () => D, fromItem: (item: T) => D,
) {
  const { form } = stock
  const draft = ref(blank()) as Ref<D>
  const editing = ref<number | null | undefined>(undefined)
  const err = (field: string) => form.fields.value[field]

  function open(item?: T) {
    form.message.value = ''
    form.fields.value = {}
    editing.value = item?.id ?? null
    draft.value = item ? fromItem(item) : blank()
  }
  const close = () => { editing.value = undefined }

  /** Sends the body (a change when a row is open, else an addition); closes the form when taken. */
  async function submit(body: Record<string, unknown>, said: string) {
    if (!(await stock.save(editing.value ?? null, body))) return
    close()
    form.say(said)
  }

  async function remove(item: T, question: string, said: string) {
    if (!confirm(question)) return
    if (await stock.remove(item.id)) form.say(said)
  }

  return { draft, editing, err, open, close, submit, remove }
}
