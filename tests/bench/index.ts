// `npm run bench`: every benchmark file in this folder registers a run() that prints its figures.
// Pass a name to run one group: `npm run bench -- route`.
import { readdirSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import os from 'node:os'

const here = dirname(fileURLToPath(import.meta.url))
const only = process.argv[2]
console.log(`Tessera benchmarks — node ${process.version}, ${os.cpus().length} × ${os.cpus()[0]?.model ?? 'cpu'}`)
for (const file of readdirSync(here).filter(f => f.endsWith('.bench.ts')).sort()) {
  if (only && !file.startsWith(only)) continue
  const mod = await import(pathToFileURL(join(here, file)).href) as { run: () => Promise<void> }
  await mod.run()
}
