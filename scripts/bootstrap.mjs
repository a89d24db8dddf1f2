// First step of `npm start`, `npm test` and `npm run dev`: install the Node packages when they are missing
// or older than package-lock.json. Plain JavaScript on purpose: it must run before tsx is installed.
import { existsSync, readFileSync, writeFileSync, statSync } from 'node:fs'
import { createHash } from 'node:crypto'
import { spawnSync } from 'node:child_process'

const lock = readFileSync('package-lock.json')
const digest = createHash('sha256').update(lock).digest('hex')
const marker = 'node_modules/.ohmward-lock-digest'
const current = existsSync(marker) ? readFileSync(marker, 'utf8').trim() : ''

const fresh = !existsSync('node_modules') || !statSync('node_modules').isDirectory()
if (fresh || current !== digest) {
  // A fresh checkout gets the exact lockfile (npm ci); an existing install is brought up to date in place
  // (npm install), which never wipes node_modules under a running process.
  const args = fresh ? ['ci'] : ['install']
  console.log(`[ohmward] installing Node packages (npm ${args[0]})…`)
  const r = spawnSync('npm', [...args, '--no-audit', '--no-fund', '--loglevel=error'], { stdio: 'inherit' })
  if (r.status !== 0) {
    console.error('[ohmward] npm ci failed; see the messages above.')
    process.exit(r.status ?? 1)
  }
  writeFileSync(marker, digest + '\n')
}
