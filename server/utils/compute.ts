import { existsSync } from 'node:fs'
import { cpus } from 'node:os'
import { dirname, join } from 'node:path'
import { Worker } from 'node:worker_threads'
import { describeFailure, runJob, type JobFailure, type JobRequest } from '../workers/jobs'

// Heavy computations (route solves, scattering maps) run in worker threads so that one large plan
// never holds up other users' requests. The pool is a process resource, like the database client:
// it holds threads, not request data. Development runs jobs inline so edits to shared/ reload.

export interface ComputeOptions { timeout_ms?: number, onProgress?: (fraction: number, stage: string) => void }

interface Pending { resolve: (v: unknown) => void, reject: (e: unknown) => void, onProgress?: ComputeOptions['onProgress'], timer: NodeJS.Timeout, worker: PoolWorker }
interface PoolWorker { thread: Worker, busy: number, timedOut?: boolean }

const DEFAULT_TIMEOUT_MS = 60_000
let workers: PoolWorker[] | undefined
let nextId = 1
const pending = new Map<number, Pending>()

function workerFile(): string | undefined {
  const candidates = [process.env.TESSERA_COMPUTE_WORKER, process.argv[1] ? join(dirname(process.argv[1]), 'workers/compute.mjs') : undefined]
  return candidates.find(p => p && existsSync(p))
}

function spawnWorker(file: string): PoolWorker {
  const w: PoolWorker = { thread: new Worker(file), busy: 0 }
  w.thread.on('message', (msg: { id: number, progress?: { fraction: number, stage: string }, result?: unknown, error?: JobFailure }) => {
    const job = pending.get(msg.id)
    if (!job) return
    if (msg.progress) return job.onProgress?.(msg.progress.fraction, msg.progress.stage)
    clearTimeout(job.timer)
    pending.delete(msg.id)
    w.busy--
    if (msg.error) job.reject(msg.error)
    else job.resolve(msg.result)
  })
  w.thread.on('error', (e: Error) => failWorker(w, { kind: 'crash', message: e.message }))
  w.thread.on('exit', () => failWorker(w, w.timedOut
    ? { kind: 'deadline', message: 'it was stopped at the hard limit' }
    : { kind: 'crash', message: 'the computation stopped unexpectedly' }))
  return w
}

function failWorker(w: PoolWorker, failure: JobFailure) {
  for (const [id, job] of pending) {
    if (job.worker !== w) continue
    clearTimeout(job.timer)
    pending.delete(id)
    job.reject(failure)
  }
  const file = workerFile()
  if (workers && file) workers = workers.map(x => x === w ? spawnWorker(file) : x)
}

function pool(): PoolWorker[] | undefined {
  if (import.meta.dev) return undefined
  const file = workerFile()
  if (!file) return undefined
  workers ??= Array.from({ length: Math.max(1, Math.min(4, cpus().length - 1)) }, () => spawnWorker(file))
  return workers
}

function toHttpError(f: JobFailure) {
  if (f.kind === 'input') return createError({ statusCode: 400, message: `${f.field}: ${f.message}`, data: { field: f.field } })
  if (f.kind === 'deadline') return createError({ statusCode: 422, message: `The computation took longer than its time limit: ${f.message}. Reduce the problem or split it.` })
  return createError({ statusCode: 500, message: `The computation failed: ${f.message}` })
}

/** Runs a job in the worker pool (inline in development); failures become HTTP errors. */
export async function runCompute<T = unknown>(req: JobRequest, opts: ComputeOptions = {}): Promise<T> {
  const timeout = opts.timeout_ms ?? DEFAULT_TIMEOUT_MS
  const threads = pool()
  if (!threads) {
    try {
      return runJob({ ...req, options: { deadline_ms: timeout, ...req.options } }, opts.onProgress ?? (() => {})) as T
    }
    catch (e) {
      throw toHttpError(describeFailure(e))
    }
  }
  const worker = threads.reduce((a, b) => (b.busy < a.busy ? b : a))
  const id = nextId++
  return new Promise<T>((resolve, reject) => {
    // The solver stops itself at its deadline; the hard limit beyond it catches a runaway job.
    const timer = setTimeout(() => {
      worker.timedOut = true
      worker.thread.terminate()
    }, timeout + 5000)
    pending.set(id, { resolve: v => resolve(v as T), reject: f => reject(toHttpError(f as JobFailure)), onProgress: opts.onProgress, timer, worker })
    worker.busy++
    worker.thread.postMessage({ id, ...req, options: { deadline_ms: timeout, ...req.options } })
  })
}
