// Deadline and progress bookkeeping for a route solve: the worker thread can stop a solve that runs
// past its budget, and the client can show how far it got.

/** Thrown when a solve runs past options.deadline_ms. Not an InputError: the input was fine. */
export class RouteDeadlineError extends Error {
  readonly stage: string
  readonly deadline_ms: number
  constructor(stage: string, deadline_ms: number, elapsed_ms: number) {
    super(`route solve stopped at stage '${stage}': ${elapsed_ms.toFixed(0)} ms exceeds deadline_ms = ${deadline_ms}`)
    this.name = 'RouteDeadlineError'
    this.stage = stage
    this.deadline_ms = deadline_ms
  }
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now())

export class Clock {
  readonly t0 = now()
  private stage = 'start'
  constructor(
    private readonly deadline_ms?: number,
    private readonly onProgress?: (fraction: number, stage: string) => void,
  ) {}

  elapsed(): number {
    return now() - this.t0
  }

  /** Throws RouteDeadlineError once the budget is spent. Cheap enough for inner loops every ~100 iterations. */
  check(): void {
    if (this.deadline_ms !== undefined) {
      const e = now() - this.t0
      if (e > this.deadline_ms) throw new RouteDeadlineError(this.stage, this.deadline_ms, e)
    }
  }

  progress(fraction: number, stage: string): void {
    this.stage = stage
    this.check()
    this.onProgress?.(Math.min(1, Math.max(0, fraction)), stage)
  }
}
