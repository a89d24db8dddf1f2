/**
 * A local PostgreSQL cluster in a folder of the project's, on 127.0.0.1 and a port of its own.
 * Uses Debian's server binaries (/usr/lib/postgresql/<major>/bin); installs the `postgresql`
 * package when they are absent and we run as root. initdb refuses root, so as root every server
 * command runs as the `postgres` system user (STACK.md §4).
 */
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync, mkdirSync, readdirSync, chmodSync, chownSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { createServer } from 'node:net'
import pg from 'pg'

const isRoot = process.getuid?.() === 0

export function log(msg: string): void {
  if (!process.env.OHMWARD_QUIET) console.log(`[ohmward] ${msg}`)
}

function findBinDir(): string | null {
  const base = '/usr/lib/postgresql'
  if (!existsSync(base)) return null
  const majors = readdirSync(base)
    .filter((d) => /^\d+$/.test(d) && existsSync(join(base, d, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a))
  return majors[0] ? join(base, majors[0], 'bin') : null
}

/** Server binaries, installing Debian's package when absent (root only). */
export function ensurePostgresBinaries(): string {
  let bin = findBinDir()
  if (bin) return bin
  if (!isRoot) {
    throw new Error(
      'PostgreSQL server binaries were not found in /usr/lib/postgresql/*/bin.\n' +
        'Install them with:  sudo apt-get update && sudo apt-get install -y postgresql\n' +
        'then run the command again.',
    )
  }
  log('installing PostgreSQL from Debian packages (apt-get install postgresql)…')
  run('apt-get', ['update', '-qq'])
  run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', 'postgresql'], {
    DEBIAN_FRONTEND: 'noninteractive',
  })
  bin = findBinDir()
  if (!bin) throw new Error('apt-get install postgresql finished but no server binaries were found')
  return bin
}

function run(cmd: string, args: string[], env: Record<string, string> = {}): void {
  const r = spawnSync(cmd, args, { stdio: ['ignore', 'pipe', 'pipe'], env: { ...process.env, ...env } })
  if (r.status !== 0) {
    throw new Error(`${cmd} ${args.join(' ')} failed (${r.status}):\n${r.stdout}\n${r.stderr}`)
  }
}

/** Run a server binary, as the postgres user when we are root. */
function runPg(binDir: string, tool: string, args: string[]): string {
  const exe = join(binDir, tool)
  const [cmd, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', exe, ...args]] : [exe, args]
  const r = spawnSync(cmd, argv, { cwd: '/tmp', encoding: 'utf8' })
  if (r.status !== 0) throw new Error(`${tool} failed (${r.status}): ${r.stderr || r.stdout}`)
  return r.stdout
}

function postgresCanEnter(dir: string): boolean {
  if (!isRoot) return true
  const r = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-w', dir], { cwd: '/tmp' })
  return r.status === 0
}

export interface Cluster {
  dataDir: string
  port: number
  binDir: string
  socketDir: string
}

/** Prepare (initdb once) a cluster folder. Returns where it lives. */
export function ensureCluster(wantedDir: string, port: number): Cluster {
  const binDir = ensurePostgresBinaries()
  const dataDir = resolve(wantedDir)
  const parent = resolve(dataDir, '..')
  mkdirSync(parent, { recursive: true })
  if (isRoot && !existsSync(dataDir)) {
    mkdirSync(dataDir, { recursive: true })
    const uid = Number(execFileSync('id', ['-u', 'postgres']).toString().trim())
    const gid = Number(execFileSync('id', ['-g', 'postgres']).toString().trim())
    chownSync(dataDir, uid, gid)
    chmodSync(dataDir, 0o700)
    if (!postgresCanEnter(dataDir)) {
      // STACK.md gotcha 19: the project sits where `postgres` cannot enter (e.g. a 700 home folder).
      throw new Error(
        `The postgres user cannot write ${dataDir}. Move the project to a folder other users can enter, ` +
          'or set OHMWARD_PG_DIR to a folder under /tmp.',
      )
    }
  } else {
    mkdirSync(dataDir, { recursive: true, mode: 0o700 })
  }
  if (!existsSync(join(dataDir, 'PG_VERSION'))) {
    log(`creating a PostgreSQL cluster in ${dataDir}`)
    runPg(binDir, 'initdb', [
      '-D',
      dataDir,
      '-U',
      'postgres',
      '--auth=trust',
      '--encoding=UTF8',
      '--locale=C.UTF-8',
    ])
  }
  return { dataDir, port, binDir, socketDir: '/tmp' }
}

export function isRunning(c: Cluster): boolean {
  const exe = join(c.binDir, 'pg_ctl')
  const [cmd, argv] = isRoot
    ? ['runuser', ['-u', 'postgres', '--', exe, '-D', c.dataDir, 'status']]
    : [exe, ['-D', c.dataDir, 'status']]
  return spawnSync(cmd, argv, { cwd: '/tmp' }).status === 0
}

export function startCluster(c: Cluster): void {
  if (isRunning(c)) {
    log(`PostgreSQL already running (port ${c.port})`)
    return
  }
  log(`starting PostgreSQL on 127.0.0.1:${c.port}`)
  runPg(c.binDir, 'pg_ctl', [
    '-D',
    c.dataDir,
    '-l',
    join(c.dataDir, 'server.log'),
    '-o',
    `-p ${c.port} -k ${c.socketDir} -c listen_addresses=127.0.0.1 -c max_connections=200 -c fsync=${process.env.OHMWARD_PG_FSYNC ?? 'on'}`,
    '-w',
    '-t',
    '60',
    'start',
  ])
}

export function stopCluster(c: Cluster): void {
  if (!isRunning(c)) return
  runPg(c.binDir, 'pg_ctl', ['-D', c.dataDir, '-m', 'fast', '-w', 'stop'])
}

export function adminUrl(port: number, db = 'postgres'): string {
  return `postgres://postgres@127.0.0.1:${port}/${db}`
}

/** Wait until the server accepts connections, then create the database if missing. */
export async function ensureDatabase(port: number, name: string): Promise<string> {
  const deadline = Date.now() + 30_000
  for (;;) {
    const client = new pg.Client({ connectionString: adminUrl(port) })
    try {
      await client.connect()
      const r = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name])
      if (r.rowCount === 0) await client.query(`CREATE DATABASE "${name.replace(/"/g, '')}"`)
      await client.end()
      return adminUrl(port, name)
    } catch (err) {
      await client.end().catch(() => {})
      if (Date.now() > deadline) throw err
      await new Promise((r) => setTimeout(r, 250))
    }
  }
}

export function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const srv = createServer()
    srv.once('error', reject)
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address()
      const port = typeof addr === 'object' && addr ? addr.port : 0
      srv.close(() => resolvePort(port))
    })
  })
}
