// npm test — the whole suite on a fresh clone: installs what is missing, builds if the
// build is stale, runs the unit, api and browser tiers, and prints the totals on their
// own line as "N passed, N failed[, N skipped]".
import { execSync, spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readFileSync } from 'node:fs'

const run = command => execSync(command, { stdio: 'inherit' })
const CHROMIUM = process.env.CHROMIUM_PATH || '/usr/bin/chromium'

if (!existsSync('node_modules/.bin/nuxt')) run('npm ci')

// Debian packages the suite needs: Chromium for the browser tier, pdftotext to read certificates.
const hasCommand = name => spawnSync('sh', ['-c', `command -v ${name}`]).status === 0
const missing = [
  ...(existsSync(CHROMIUM) ? [] : ['chromium']),
  ...(hasCommand('pdftotext') ? [] : ['poppler-utils']),
]
if (missing.length) {
  if (process.getuid?.() === 0) {
    console.log(`Installing Debian packages the tests need: ${missing.join(', ')}`)
    run(`apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq ${missing.join(' ')}`)
  }
  else {
    console.error(`The tests need these Debian packages: ${missing.join(', ')}. Install them (sudo apt-get install ${missing.join(' ')}); Chromium may also be given by CHROMIUM_PATH.`)
    process.exit(1)
  }
}

const { buildIsStale } = await import('./build-state.mjs')
if (buildIsStale()) run('npx nuxt build')

mkdirSync('test-results', { recursive: true })
const result = spawnSync('npx', ['vitest', 'run', '--reporter=default', '--reporter=json', '--outputFile.json=test-results/vitest.json', ...process.argv.slice(2)], { stdio: 'inherit' })

let summary = 'no test results were written'
if (existsSync('test-results/vitest.json')) {
  const report = JSON.parse(readFileSync('test-results/vitest.json', 'utf8'))
  const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0)
  summary = `${report.numPassedTests} passed, ${report.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}`
  if (report.numTotalTests === 0) summary += '\nNo test ran.'
}
console.log(`\n${summary}`)
process.exit(result.status ?? 1)
