/**
 * `npm start`: local PostgreSQL (installed from Debian when absent), migrations, demo seed, client build,
 * the local mail and payment fakes, then the app on http://127.0.0.1:3000. Ctrl-C or `npm run stop` ends it.
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { mkdirSync, writeFileSync, rmSync } from 'node:fs'
import { resolve } from 'node:path'
import { ensureCluster, startCluster, ensureDatabase, log } from './lib/pg'
import { runMigrations } from './lib/migrate'
import { startFakes, fakeSpecs } from './lib/fakes'
import { ROOT, RUN_DIR, PG_DIR, PG_PORT, DB_NAME } from './lib/paths'
import { createDatabase } from '../server/db/client'
import { seedDemoIfEmpty } from '../server/seed/index'
import { buildServer } from './lib/build-server'

const PORT = Number(process.env.PORT ?? 3000)
const HOST = process.env.HOST ?? '127.0.0.1'
const FAKE_PORTS = {
  smtp: Number(process.env.SMTP_PORT ?? 2525),
  smtpApi: Number(process.env.SMTP_API_PORT ?? 2526),
  stripe: Number(process.env.OHMWARD_STRIPE_FAKE_PORT ?? 12111),
}

const cluster = ensureCluster(PG_DIR, PG_PORT)
startCluster(cluster)
const dbUrl = process.env.DATABASE_URL ?? (await ensureDatabase(PG_PORT, DB_NAME))
await runMigrations(dbUrl)
log('migrations applied')
{
  const { pool, db } = createDatabase(dbUrl, { max: 1 })
  if (await seedDemoIfEmpty(db)) log('demo data seeded (see README for the demo accounts)')
  await pool.end()
}

log('building the client…')
const build = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: ROOT, stdio: 'inherit' })
if (build.status !== 0) process.exit(build.status ?? 1)
log('building the server…')
const serverEntry = await buildServer()

mkdirSync(RUN_DIR, { recursive: true })
const children: ChildProcess[] = await startFakes(fakeSpecs(FAKE_PORTS))
const server = spawn(process.execPath, ['--enable-source-maps', serverEntry], {
  cwd: ROOT,
  stdio: 'inherit',
  env: {
    ...process.env,
    NODE_ENV: process.env.NODE_ENV ?? 'development',
    DATABASE_URL: dbUrl,
    PORT: String(PORT),
    HOST,
    APP_URL: process.env.APP_URL ?? `http://${HOST}:${PORT}`,
    SMTP_PORT: String(FAKE_PORTS.smtp),
    OHMWARD_FAKE_MAIL_API: `http://127.0.0.1:${FAKE_PORTS.smtpApi}`,
    STRIPE_API_URL: process.env.STRIPE_API_URL ?? `http://127.0.0.1:${FAKE_PORTS.stripe}`,
  },
})
children.push(server)
writeFileSync(
  resolve(RUN_DIR, 'pids.json'),
  JSON.stringify({ starter: process.pid, children: children.map((c) => c.pid) }),
)

const stopAll = (code: number) => {
  for (const c of children) c.kill('SIGTERM')
  rmSync(resolve(RUN_DIR, 'pids.json'), { force: true })
  setTimeout(() => process.exit(code), 300).unref()
}
server.on('exit', (code) => {
  for (const c of children) if (c !== server) c.kill('SIGTERM')
  rmSync(resolve(RUN_DIR, 'pids.json'), { force: true })
  process.exit(code ?? 0)
})
process.on('SIGINT', () => stopAll(0))
process.on('SIGTERM', () => stopAll(0))
log(`mail and payment fakes on 127.0.0.1:${FAKE_PORTS.smtp} (SMTP) and :${FAKE_PORTS.stripe} (payments)`)
log(`PostgreSQL data in ${cluster.dataDir} (port ${PG_PORT}); stop everything with: npm run stop`)
