// The marks of the scan being edited, with undo/redo. Marks are immutable objects; every edit
// replaces the array, and the history keeps earlier arrays (cheap: they share the objects).
import { defineStore } from 'pinia'

export interface EditableMark { id: number, x_nm: number, y_nm: number, height_nm: number, score: number, species?: string }

const HISTORY = 200

export const useMarksStore = defineStore('marks', () => {
  const marks = shallowRef<EditableMark[]>([])
  const selected = ref(new Set<number>())
  const history = snapshotHistory(marks, HISTORY)
  // Server version the current array descends from, and whether there are unsaved edits.
  const baseVersion = ref(0)
  const dirty = ref(false)
  let nextId = 1

  function load(list: Omit<EditableMark, 'id'>[], version: number) {
    nextId = 1
    marks.value = list.map(m => ({ ...m, id: nextId++ }))
    selected.value = new Set()
    history.clear()
    baseVersion.value = version
    dirty.value = false
  }
  function commit(next: EditableMark[]) {
    history.commit(next)
    dirty.value = true
  }
  function add(x_nm: number, y_nm: number, height_nm = 0, species?: string) {
    const mark: EditableMark = { id: nextId++, x_nm, y_nm, height_nm, score: 0, species }
    commit([...marks.value, mark])
    selected.value = new Set([mark.id])
    return mark
  }
  function remove(ids: Iterable<number>) {
    const drop = new Set(ids)
    if (!drop.size) return
    commit(marks.value.filter(m => !drop.has(m.id)))
    selected.value = new Set([...selected.value].filter(id => !drop.has(id)))
  }
  /** Moves marks by (dx, dy); `live` updates without a history entry (during a drag). */
  function moveBy(ids: Set<number>, dx: number, dy: number, live = false) {
    const next = marks.value.map(m => ids.has(m.id) ? { ...m, x_nm: m.x_nm + dx, y_nm: m.y_nm + dy } : m)
    if (live) marks.value = next
    else commit(next)
  }
  /** Ends a live drag: one history entry from where it started. */
  function endDrag(before: EditableMark[]) {
    if (before === marks.value) return
    history.record(before)
    dirty.value = true
  }
  function tag(ids: Iterable<number>, species: string | undefined) {
    const set = new Set(ids)
    commit(marks.value.map(m => set.has(m.id) ? { ...m, species: species || undefined } : m))
  }
  function undo() {
    if (history.undo()) dirty.value = true
  }
  function redo() {
    if (history.redo()) dirty.value = true
  }
  function select(ids: Iterable<number>, additive = false) {
    selected.value = new Set(additive ? [...selected.value, ...ids] : ids)
  }
  /** The mark nearest to (x, y) within r_nm, if any. Linear scan: fine for clicks on 10⁴ marks. */
  function nearest(x: number, y: number, r_nm: number): EditableMark | undefined {
    let best: EditableMark | undefined
    let bestD = r_nm * r_nm
    for (const m of marks.value) {
      const d = (m.x_nm - x) ** 2 + (m.y_nm - y) ** 2
      if (d <= bestD) {
        bestD = d
        best = m
      }
    }
    return best
  }
  function inBox(x0: number, y0: number, x1: number, y1: number): number[] {
    const [ax, bx] = x0 < x1 ? [x0, x1] : [x1, x0]
    const [ay, by] = y0 < y1 ? [y0, y1] : [y1, y0]
    return marks.value.filter(m => m.x_nm >= ax && m.x_nm <= bx && m.y_nm >= ay && m.y_nm <= by).map(m => m.id)
  }
  function saved(version: number) {
    baseVersion.value = version
    dirty.value = false
  }

  const { canUndo, canRedo } = history
  return { marks, selected, baseVersion, dirty, canUndo, canRedo, load, add, remove, moveBy, endDrag, tag, undo, redo, select, nearest, inBox, saved }
})
