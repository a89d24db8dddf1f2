/**
 * `npm test`: a throwaway PostgreSQL cluster (temporary folder, free port), Chromium from Debian when absent,
 * typecheck and lint, a client build for the browser tests, the local fakes, then every test with vitest.
 * Everything is torn down even on failure; the last line printed is vitest's own summary.
 *
 *   npm test                       everything
 *   npm test -- tests/api          only some test files (arguments go to vitest)
 *   OHMWARD_TEST_QUICK=1 npm test  skip typecheck, lint and the client build (for quick local loops)
 */
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync, chmodSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import {
  ensureCluster,
  startCluster,
  stopCluster,
  ensureDatabase,
  adminUrl,
  freePort,
  log,
  type Cluster,
} from './lib/pg'
import { runMigrations } from './lib/migrate'
import { ensureChromium } from './lib/chromium'
import { startFakes, fakeSpecs } from './lib/fakes'
import { ROOT } from './lib/paths'

const quick = process.env.OHMWARD_TEST_QUICK === '1'
const vitestArgs = process.argv.slice(2)
const children: ChildProcess[] = []
let cluster: Cluster | null = null
let tempDir: string | null = null

function step(name: string, cmd: string, args: string[]): void {
  log(name)
  const r = spawnSync(cmd, args, { cwd: ROOT, stdio: 'inherit' })
  if (r.status !== 0) {
    console.error(`[ohmward] ${name} failed`)
    throw new Error(`${name} failed`)
  }
}

function teardown(): void {
  for (const c of children) c.kill('SIGTERM')
  try {
    if (cluster) stopCluster(cluster)
  } catch {
    /* best effort */
  }
  if (tempDir) rmSync(tempDir, { recursive: true, force: true })
}

let exitCode = 1
try {
  ensureChromium()
  tempDir = mkdtempSync(join(tmpdir(), 'ohmward-test-'))
  chmodSync(tempDir, 0o755)
  const pgPort = await freePort()
  process.env.OHMWARD_PG_FSYNC = 'off'
  cluster = ensureCluster(join(tempDir, 'pg'), pgPort)
  startCluster(cluster)
  const dbUrl = await ensureDatabase(pgPort, 'ohmward_test')
  await runMigrations(dbUrl)

  if (!quick) {
    step('typecheck', 'npm', ['run', '--silent', 'typecheck'])
    step('lint', 'npm', ['run', '--silent', 'lint'])
    step('client build', 'npx', ['vite', 'build', '--logLevel', 'warn'])
  }

  const ports = { smtp: await freePort(), smtpApi: await freePort(), stripe: await freePort() }
  children.push(...(await startFakes(fakeSpecs(ports), true)))

  const env = {
    ...process.env,
    NODE_ENV: 'test',
    TZ: 'UTC',
    LOG_LEVEL: 'silent',
    DATABASE_URL: dbUrl,
    PG_ADMIN_URL: adminUrl(pgPort),
    OHMWARD_PG_BIN: cluster.binDir,
    OHMWARD_PG_DATA: cluster.dataDir,
    OHMWARD_PG_PORT: String(pgPort),
    OHMWARD_ARTIFACTS: join(ROOT, 'artifacts'),
    SMTP_PORT: String(ports.smtp),
    OHMWARD_FAKE_MAIL_API: `http://127.0.0.1:${ports.smtpApi}`,
    STRIPE_API_URL: `http://127.0.0.1:${ports.stripe}`,
  }
  const vitest = spawn('npx', ['vitest', 'run', ...vitestArgs], { cwd: ROOT, stdio: 'inherit', env })
  children.push(vitest)
  exitCode = await new Promise<number>((ok) => vitest.on('exit', (code) => ok(code ?? 1)))
} catch (err) {
  console.error(err instanceof Error ? err.message : err)
} finally {
  teardown()
}
process.exit(exitCode)
