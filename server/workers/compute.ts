// Worker-thread entry: runs one job at a time from the pool and reports progress and the result.
// Bundled by the build into .output/server/workers/compute.mjs.
import { parentPort } from 'node:worker_threads'
import { describeFailure, runJob, type JobRequest } from './jobs'

parentPort?.on('message', (msg: { id: number } & JobRequest) => {
  let last = 0
  const progress = (fraction: number, stage: string) => {
    const now = Date.now()
    if (now - last < 100 && fraction < 1) return
    last = now
    parentPort?.postMessage({ id: msg.id, progress: { fraction, stage } })
  }
  try {
    const result = runJob(msg, progress)
    parentPort?.postMessage({ id: msg.id, result })
  }
  catch (e) {
    parentPort?.postMessage({ id: msg.id, error: describeFailure(e) })
  }
})
