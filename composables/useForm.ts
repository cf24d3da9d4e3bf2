// A small form helper: submit once at a time, show the server's message and per-field messages.
export function useForm() {
  const busy = ref(false)
  // False until hydrated: submit buttons stay disabled so that a click before the page is
  // interactive cannot fall through to a native form submission (fields in the URL).
  const ready = ref(false)
  onMounted(() => {
    ready.value = true
  })
  const message = ref('')
  const fields = ref<Record<string, string>>({})

  async function submit<T>(action: () => Promise<T>): Promise<T | undefined> {
    if (busy.value) return undefined
    busy.value = true
    message.value = ''
    fields.value = {}
    try {
      return await action()
    }
    catch (e) {
      const problem = apiProblem(e)
      message.value = problem.message
      fields.value = problem.fields
      return undefined
    }
    finally {
      busy.value = false
    }
  }

  return { busy, ready, message, fields, submit }
}
