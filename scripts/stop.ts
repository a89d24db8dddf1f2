// `npm run stop`: end what `npm start` started (app, fakes) and stop the local PostgreSQL cluster. Data stays.
import { existsSync, readFileSync, rmSync } from 'node:fs'
import { resolve } from 'node:path'
import { ensureCluster, stopCluster, log } from './lib/pg'
import { RUN_DIR, PG_DIR, PG_PORT } from './lib/paths'

const pidFile = resolve(RUN_DIR, 'pids.json')
if (existsSync(pidFile)) {
  const { starter, children } = JSON.parse(readFileSync(pidFile, 'utf8')) as {
    starter: number
    children: number[]
  }
  for (const pid of [...children, starter]) {
    try {
      process.kill(pid, 'SIGTERM')
    } catch {
      /* already gone */
    }
  }
  rmSync(pidFile, { force: true })
  log('app and fakes stopped')
}
if (existsSync(resolve(PG_DIR, 'PG_VERSION'))) {
  await new Promise((r) => setTimeout(r, 500))
  stopCluster(ensureCluster(PG_DIR, PG_PORT))
  log('PostgreSQL stopped (data kept in ' + PG_DIR + ')')
}
