// Writing to a build run from the run page: logging an outcome (with an idempotency key kept for
// retries, so a double click or a resent request never makes a second entry), re-planning and
// closing. A conflict (someone logged meanwhile, the move moved on) refreshes the view and says so.
import type { RunView } from '#shared/types/night'

interface Pending { key: string, body: Record<string, unknown> }

export function useRunActions(view: Ref<RunView | null | undefined>, refresh: () => Promise<void>) {
  const busy = ref(false)
  // Right after a logged outcome the buttons rest for a moment: a double click on a fast network
  // would otherwise land on the next move.
  const resting = ref(false)
  const unconfirmed = shallowRef<Pending | null>(null)
  const problem = ref('')
  const flash = ref('')
  let flashTimer: ReturnType<typeof setTimeout> | undefined

  function say(text: string) {
    flash.value = text
    clearTimeout(flashTimer)
    flashTimer = setTimeout(() => (flash.value = ''), 2500)
  }

  async function post(p: Pending) {
    const v = view.value!
    busy.value = true
    problem.value = ''
    try {
      await api(`/api/runs/${v.run.id}/entries`, { method: 'POST', body: { ...p.body, idempotency_key: p.key } })
      unconfirmed.value = null
      say(`Logged: ${String(p.body.outcome)} · move ${Number(p.body.move_index) + 1}`)
      resting.value = true
      setTimeout(() => (resting.value = false), 600)
      await refresh()
      return true
    }
    catch (e) {
      const pr = apiProblem(e)
      if (pr.status === undefined || pr.status >= 500) {
        // Unknown whether it landed: keep the key so that a retry cannot log it twice.
        unconfirmed.value = p
        problem.value = `Not confirmed: ${pr.message}`
      }
      else {
        unconfirmed.value = null
        problem.value = pr.message
        if (pr.status === 409) await refresh()
      }
      return false
    }
    finally {
      busy.value = false
    }
  }

  function log(body: { move_index: number, outcome: string, params?: Record<string, number>, note?: string, position?: [number, number], supersedes?: number }) {
    const v = view.value
    if (!v || busy.value || resting.value || unconfirmed.value) return Promise.resolve(false)
    return post({ key: crypto.randomUUID(), body: { ...body, expected_seq: v.state.last_seq, ...(body.supersedes === undefined && { route_id: v.run.current_route_id }) } })
  }
  const retry = () => unconfirmed.value ? post(unconfirmed.value) : Promise.resolve(false)
  function discard() {
    unconfirmed.value = null
    problem.value = ''
    void refresh()
  }

  async function replan(scanId?: number) {
    const v = view.value
    if (!v || busy.value) return false
    busy.value = true
    problem.value = ''
    try {
      await api(`/api/runs/${v.run.id}/replan`, { method: 'POST', body: { expected_seq: v.state.last_seq, ...(scanId && { scan_id: scanId }) } })
      say('Re-planned: the remaining moves start from where the atoms are now')
      await refresh()
      return true
    }
    catch (e) {
      problem.value = apiProblem(e).message
      await refresh()
      return false
    }
    finally {
      busy.value = false
    }
  }

  async function close(note: string, picture?: string) {
    const v = view.value
    if (!v || busy.value) return null
    busy.value = true
    problem.value = ''
    try {
      const res = await api<{ mail: { sent: boolean, to: number } }>(`/api/runs/${v.run.id}/close`, { method: 'POST', body: { ...(note && { note }), ...(picture && { picture_png: picture }) } })
      await refresh()
      return res.mail
    }
    catch (e) {
      problem.value = apiProblem(e).message
      return null
    }
    finally {
      busy.value = false
    }
  }

  return { busy, resting, unconfirmed, problem, flash, log, retry, discard, replan, close }
}
