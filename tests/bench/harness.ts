// Tiny benchmark harness: runs a function repeatedly and prints the median wall time.
// Figures are printed, never asserted: speed is read off `npm run bench`, not gated in tests.
import { performance } from 'node:perf_hooks'

export interface BenchResult { name: string, median_ms: number, min_ms: number, runs: number, note?: string }

export async function bench(name: string, fn: () => unknown | Promise<unknown>, opts: { runs?: number, warmup?: number, target_ms?: number, note?: () => string } = {}): Promise<BenchResult> {
  const runs = opts.runs ?? 7
  for (let i = 0; i < (opts.warmup ?? 1); i++) await fn()
  const times: number[] = []
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now()
    await fn()
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  const median_ms = times.length % 2 ? times[(times.length - 1) / 2]! : (times[times.length / 2 - 1]! + times[times.length / 2]!) / 2
  const result: BenchResult = { name, median_ms, min_ms: times[0]!, runs, note: opts.note?.() }
  const target = opts.target_ms === undefined ? '' : `  target < ${opts.target_ms} ms ${median_ms < opts.target_ms ? 'OK' : 'MISSED'}`
  console.log(`${name.padEnd(56)} median ${median_ms.toFixed(2).padStart(10)} ms  (min ${result.min_ms.toFixed(2)}, ${runs} runs)${target}${result.note ? `  ${result.note}` : ''}`)
  return result
}

export function section(title: string) {
  console.log(`\n## ${title}`)
}
