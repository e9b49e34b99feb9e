/** What the server sends with a 400: one entry per field, e.g. { path: 'body.email', message }. */
interface ServerIssue {
  path: string
  message: string
}

/**
 * One form's submit state: `pending` while the request runs, `errors[field]` from the server's
 * field issues, `message` for the rest. What the user typed stays in their own refs.
 */
export function useFormErrors<Field extends string>(fields: readonly Field[]) {
  const errors = reactive({}) as Partial<Record<Field, string>>
  const message = ref('')
  const pending = ref(false)

  function clear() {
    for (const field of fields) delete errors[field]
    message.value = ''
  }

  function absorb(error: unknown) {
    // $fetch errors carry the server's JSON body in `data`.
    const data = (error as { data?: { message?: string, data?: { issues?: ServerIssue[] } } }).data
    const issues = data?.data?.issues ?? []
    let unplaced = false
    for (const issue of issues) {
      const field = issue.path.replace(/^body\./, '').split('.')[0] as Field
      if (fields.includes(field) && !errors[field]) errors[field] = issue.message
      else if (!fields.includes(field)) unplaced = true
    }
    if (!issues.length || unplaced) {
      message.value = data?.message || 'Lamina could not reach the server. Check the connection and try again.'
    }
    else message.value = 'Check the highlighted fields.'
  }

  /** Runs `action` with the form disabled; resolves to its result, or undefined after an error. */
  // Typed by a bare `T`, not `Promise<T>`: that context makes TypeScript infer typed $fetch's
  // route parameter backwards from the result and overflow (nitrojs/nitro#470).
  async function submit<T>(action: () => T): Promise<Awaited<T> | undefined> {
    if (pending.value) return undefined
    clear()
    pending.value = true
    try {
      return await action()
    }
    catch (error) {
      absorb(error)
      return undefined
    }
    finally {
      pending.value = false
    }
  }

  return { errors, message, pending, submit, clear }
}
