/**
 * A throwaway stack for benchmarks and fault tests: its own PostgreSQL cluster in a temporary folder on a free
 * port, migrated and seeded, and the server as a child process. Everything stops with `stop()`.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync, rmSync, chmodSync, readFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { ensureCluster, startCluster, stopCluster, ensureDatabase, freePort, type Cluster } from './pg'
import { runMigrations } from './migrate'
import { ROOT } from './paths'
import { createDatabase } from '../../server/db/client'
import { seedDemo } from '../../server/seed/index'
import { buildServer } from './build-server'
import { randomUUID } from 'node:crypto'

export interface Stack {
  cluster: Cluster
  dbUrl: string
  dir: string
  stop(): Promise<void>
}

export async function startDatabase(options: { seed?: boolean } = {}): Promise<Stack> {
  const dir = mkdtempSync(join(tmpdir(), 'ohmward-stack-'))
  chmodSync(dir, 0o755)
  const port = await freePort()
  process.env.OHMWARD_PG_FSYNC = 'off'
  process.env.OHMWARD_QUIET = '1'
  const cluster = ensureCluster(join(dir, 'pg'), port)
  startCluster(cluster)
  const dbUrl = await ensureDatabase(port, 'ohmward_bench')
  await runMigrations(dbUrl)
  if (options.seed) {
    const { pool, db } = createDatabase(dbUrl, { max: 1 })
    await seedDemo(db)
    await pool.end()
  }
  return {
    cluster,
    dbUrl,
    dir,
    async stop() {
      stopCluster(cluster)
      rmSync(dir, { recursive: true, force: true })
    },
  }
}

export interface ServerProcess {
  url: string
  child: ChildProcess
  /** Peak resident memory so far (VmHWM from /proc), in MB. */
  peakRssMB(): number
  stop(): Promise<void>
  cleanup(): void
}

/** The real server (server/index.ts) as a child process on a free port. */
export async function startServerProcess(
  dbUrl: string,
  env: Record<string, string> = {},
  /**
   * Extra arguments for node itself, e.g. `--cpu-prof` when profiling a bench; OHMWARD_SERVER_NODE_ARGS
   * (space-separated) adds some to every server a bench or test starts.
   */
  nodeArgs: string[] = (process.env.OHMWARD_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean),
): Promise<ServerProcess> {
  const port = await freePort()
  const url = `http://127.0.0.1:${port}`
  // The production bundle, built per process so parallel test files never share a half-written file.
  const entry = await buildServer(resolve(ROOT, `dist-server/harness-${randomUUID()}.js`))
  const child = spawn(process.execPath, [...nodeArgs, entry], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      ...process.env,
      NODE_ENV: 'production',
      LOG_LEVEL: 'silent',
      DATABASE_URL: dbUrl,
      PORT: String(port),
      HOST: '127.0.0.1',
      APP_URL: url,
      RATE_LIMIT_PER_MINUTE: '100000000',
      ...env,
    },
  })
  let stderr = ''
  child.stderr?.on('data', (b: Buffer) => (stderr += b.toString()))
  await new Promise<void>((ok, fail) => {
    const timer = setTimeout(() => fail(new Error('server did not start in 90 s:\n' + stderr)), 90_000)
    child.stdout?.on('data', (b: Buffer) => {
      if (b.toString().includes('running at')) {
        clearTimeout(timer)
        ok()
      }
    })
    child.once('exit', (code) => fail(new Error(`server exited with ${code}:\n${stderr}`)))
  })
  const cleanup = () => {
    rmSync(entry, { force: true })
    rmSync(entry + '.map', { force: true })
  }
  return {
    url,
    child,
    peakRssMB() {
      try {
        const status = readFileSync(`/proc/${child.pid}/status`, 'utf8')
        const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0)
        return Math.round(kb / 102.4) / 10
      } catch {
        return NaN
      }
    },
    async stop() {
      cleanup()
      if (child.exitCode !== null || child.signalCode !== null) return
      const exited = new Promise((ok) => child.once('exit', ok))
      child.kill('SIGTERM')
      await exited
    },
    cleanup,
  }
}
