// Undo/redo over immutable snapshots of one piece of editor state (marks, blueprint shapes,
// route options): an edit records the state it replaced; undo and redo swap snapshots. Snapshots
// share their unchanged parts, so keeping a few hundred costs little.
import type { Ref, ShallowRef } from 'vue'

export function snapshotHistory<T>(state: Ref<T> | ShallowRef<T>, limit = 200) {
  const undoStack = shallowRef<T[]>([])
  const redoStack = shallowRef<T[]>([])

  /** Records `before` (default: the current state) as the state an edit replaced. */
  function record(before: T = state.value) {
    undoStack.value = [...undoStack.value.slice(-limit + 1), before]
    redoStack.value = []
  }
  /** Replaces the state with `next` as one undoable edit. */
  function commit(next: T) {
    record()
    state.value = next
  }
  function undo(): boolean {
    const prev = undoStack.value.at(-1)
    if (prev === undefined) return false
    redoStack.value = [...redoStack.value, state.value]
    undoStack.value = undoStack.value.slice(0, -1)
    state.value = prev
    return true
  }
  function redo(): boolean {
    const next = redoStack.value.at(-1)
    if (next === undefined) return false
    undoStack.value = [...undoStack.value, state.value]
    redoStack.value = redoStack.value.slice(0, -1)
    state.value = next
    return true
  }
  function clear() {
    undoStack.value = []
    redoStack.value = []
  }
  const canUndo = computed(() => undoStack.value.length > 0)
  const canRedo = computed(() => redoStack.value.length > 0)
  return { record, commit, undo, redo, clear, canUndo, canRedo }
}
