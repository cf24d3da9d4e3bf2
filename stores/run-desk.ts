// The run page's drafts: the manipulation parameters actually used (as typed, in mV / nA / nm/s),
// the note for the next entry, and a position being picked on the structure (off-site outcomes,
// corrections to off-site). Client state only; the logbook itself lives on the server.
import { defineStore } from 'pinia'

export interface PickRequest { move_index: number, supersedes?: number }

export const useRunDeskStore = defineStore('run-desk', () => {
  const bias_mV = ref('')
  const setpoint_nA = ref('')
  const speed_nm_s = ref('')
  const note = ref('')
  const picking = shallowRef<PickRequest | null>(null)
  const pick = ref<[number, number] | null>(null)

  function loadParams(p: { bias_V?: number, setpoint_A?: number, tip_speed_nm_s?: number }) {
    bias_mV.value = p.bias_V === undefined ? '' : String(+(p.bias_V * 1000).toPrecision(6))
    setpoint_nA.value = p.setpoint_A === undefined ? '' : String(+(p.setpoint_A * 1e9).toPrecision(6))
    speed_nm_s.value = p.tip_speed_nm_s === undefined ? '' : String(p.tip_speed_nm_s)
  }
  /** The parameters in the API's units; fields left empty are left out, unreadable ones reported. */
  const parsed = computed(() => {
    const out: Record<string, number> = {}
    const errors: Record<string, string> = {}
    const read = (raw: string, key: string, factor: number, label: string) => {
      if (!raw.trim()) return
      const v = Number(raw.replace(',', '.'))
      if (Number.isFinite(v)) out[key] = v * factor
      else errors[key] = `${label} must be a number`
    }
    read(bias_mV.value, 'bias_V', 1e-3, 'bias')
    read(setpoint_nA.value, 'setpoint_A', 1e-9, 'setpoint')
    read(speed_nm_s.value, 'tip_speed_nm_s', 1, 'tip speed')
    return { params: out, errors }
  })
  function startPick(req: PickRequest, initial: [number, number] | null) {
    picking.value = req
    pick.value = initial
  }
  function endPick() {
    picking.value = null
    pick.value = null
  }
  return { bias_mV, setpoint_nA, speed_nm_s, note, picking, pick, loadParams, parsed, startPick, endPick }
})
