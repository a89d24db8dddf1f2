// `npm run dev`: the database and fakes as in `npm start`, the API with reload (tsx watch), and Vite's hot reload
// on http://127.0.0.1:5173 with /api proxied to the API.
import { spawn } from 'node:child_process'
import { ensureCluster, startCluster, ensureDatabase, log } from './lib/pg'
import { runMigrations } from './lib/migrate'
import { startFakes, fakeSpecs } from './lib/fakes'
import { ROOT, PG_DIR, PG_PORT, DB_NAME } from './lib/paths'
import { createDatabase } from '../server/db/client'
import { seedDemoIfEmpty } from '../server/seed/index'

const PORT = Number(process.env.PORT ?? 3000)
const FAKE_PORTS = {
  smtp: Number(process.env.SMTP_PORT ?? 2525),
  smtpApi: Number(process.env.SMTP_API_PORT ?? 2526),
  stripe: Number(process.env.OHMWARD_STRIPE_FAKE_PORT ?? 12111),
}
startCluster(ensureCluster(PG_DIR, PG_PORT))
const dbUrl = await ensureDatabase(PG_PORT, DB_NAME)
await runMigrations(dbUrl)
{
  const { pool, db } = createDatabase(dbUrl, { max: 1 })
  await seedDemoIfEmpty(db)
  await pool.end()
}
const children = await startFakes(fakeSpecs(FAKE_PORTS))
const env = {
  ...process.env,
  DATABASE_URL: dbUrl,
  PORT: String(PORT),
  APP_URL: 'http://127.0.0.1:5173',
  SMTP_PORT: String(FAKE_PORTS.smtp),
  OHMWARD_FAKE_MAIL_API: `http://127.0.0.1:${FAKE_PORTS.smtpApi}`,
  STRIPE_API_URL: `http://127.0.0.1:${FAKE_PORTS.stripe}`,
}
children.push(spawn('npx', ['tsx', 'watch', 'server/index.ts'], { cwd: ROOT, stdio: 'inherit', env }))
children.push(spawn('npx', ['vite'], { cwd: ROOT, stdio: 'inherit', env }))
log('dev: open http://127.0.0.1:5173')
const stop = () => {
  for (const c of children) c.kill('SIGTERM')
  process.exit(0)
}
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
