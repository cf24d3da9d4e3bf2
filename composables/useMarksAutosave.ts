// Saves the marks a moment after each edit, as a new version on the server. A conflict (someone
// else saved meanwhile) stops saving and asks for a reload instead of overwriting their work.
export function useMarksAutosave(scanId: Ref<number | undefined>) {
  const marks = useMarksStore()
  const status = ref<'saved' | 'pending' | 'saving' | 'conflict' | 'error'>('saved')
  const problem = ref('')
  let timer: ReturnType<typeof setTimeout> | undefined

  async function save() {
    if (!scanId.value || !marks.dirty || status.value === 'conflict') return
    status.value = 'saving'
    const sent = marks.marks
    try {
      const res = await api<{ version: number }>(`/api/scans/${scanId.value}/marks`, {
        method: 'POST',
        body: { base_version: marks.baseVersion, marks: sent.map(({ x_nm, y_nm, height_nm, score, species }) => ({ x_nm, y_nm, height_nm, score, species })) },
      })
      marks.baseVersion = res.version
      // Edits made while saving stay dirty and go out with the next save.
      if (marks.marks === sent) marks.saved(res.version)
      status.value = marks.dirty ? 'pending' : 'saved'
      if (marks.dirty) schedule()
    }
    catch (e) {
      const p = apiProblem(e)
      problem.value = p.message
      status.value = p.status === 409 ? 'conflict' : 'error'
    }
  }
  function schedule() {
    clearTimeout(timer)
    timer = setTimeout(save, 700)
  }
  // Dirty can turn on without a new array (the end of a live drag), so watch both.
  watch(() => [marks.marks, marks.dirty], () => {
    if (!marks.dirty) return
    if (status.value !== 'conflict') status.value = 'pending'
    schedule()
  })
  watch(scanId, () => {
    status.value = 'saved'
    problem.value = ''
  })
  onBeforeUnmount(() => {
    clearTimeout(timer)
    void save()
  })
  return { status, problem, saveNow: save }
}
