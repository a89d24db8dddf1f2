/**
 * Debian's Chromium for the browser tests and the browser benchmarks (bench:web, bench:whatif): installed with
 * apt-get when absent and run as root, otherwise a clear message and exit.
 */
import { spawnSync } from 'node:child_process'
import { existsSync } from 'node:fs'
import { log } from './pg'

export function ensureChromium(): void {
  if (existsSync('/usr/bin/chromium') || existsSync('/usr/lib/chromium/chromium')) return
  if (process.getuid?.() !== 0) {
    console.error('Chromium is needed for the browser tests: sudo apt-get install -y chromium')
    process.exit(1)
  }
  log('installing Chromium from Debian packages…')
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
  spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env })
  const r = spawnSync('apt-get', ['install', '-y', '-qq', 'chromium', 'poppler-utils'], {
    stdio: 'inherit',
    env,
  })
  if (r.status !== 0) process.exit(r.status ?? 1)
}
