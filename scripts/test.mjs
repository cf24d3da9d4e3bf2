#!/usr/bin/env node
// `npm test`: type check, lint, build once, then every vitest project (unit, server, e2e) against
// that build. Ends with one line `N passed, N failed` (checks + tests) for CI to read.
import { spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync } from 'node:fs'

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium'
let passed = 0
let failed = 0

function run(label, cmd, args, env = {}) {
  console.log(`\n▶ ${label}: ${cmd} ${args.join(' ')}`)
  const t0 = Date.now()
  const res = spawnSync(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } })
  const ok = res.status === 0
  console.log(`${ok ? '✔' : '✘'} ${label} (${((Date.now() - t0) / 1000).toFixed(1)} s)`)
  return ok
}

function check(label, cmd, args) {
  if (run(label, cmd, args)) passed++
  else failed++
}

// The browser tests never skip silently: install Chromium (as root) or stop with the command.
if (!existsSync(CHROMIUM)) {
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0
  if (!isRoot) {
    console.error(`Chromium is needed for the browser tests and is not at ${CHROMIUM}.\nInstall it with:\n  sudo apt-get update && sudo apt-get install -y chromium`)
    process.exit(1)
  }
  const ok = run('install chromium', 'sh', ['-c', 'apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium'])
  if (!ok || !existsSync(CHROMIUM)) {
    console.error('Installing Chromium failed; run: apt-get update && apt-get install -y chromium')
    process.exit(1)
  }
}

check('type check', 'npx', ['nuxi', 'typecheck'])
check('lint', 'npx', ['eslint', '.'])
const built = run('build', 'npx', ['nuxi', 'build'])
if (built) passed++
else failed++

mkdirSync('.tmp', { recursive: true })
const report = '.tmp/vitest-report.json'
const projects = built ? [] : ['--project', 'unit']
run('tests', 'npx', ['vitest', 'run', ...projects, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`])
if (existsSync(report)) {
  const r = JSON.parse(readFileSync(report, 'utf8'))
  passed += r.numPassedTests
  failed += r.numFailedTests + (r.numRuntimeErrors ?? 0) + (r.testResults ?? []).filter(f => f.status === 'failed' && !f.assertionResults?.length).length
}
else {
  failed++
}
console.log(`\n${passed} passed, ${failed} failed`)
process.exit(failed ? 1 : 0)
