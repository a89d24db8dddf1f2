/**
 * `npm run bench:logs`: a month of invented monitor data at 5-second steps (≥ 500,000 rows, from
 * scripts/generate-sample-log.ts) is uploaded and imported over HTTP into the real server process (production
 * mode) on a throwaway, seeded PostgreSQL (scripts/lib/harness.ts, which uses scripts/lib/pg.ts), signed in as
 * the demo owner. The server's resident memory is sampled every 100 ms and its peak read from /proc (VmHWM).
 * The last line is one JSON object: { rows, seconds, peakRssMB, … }.
 * Targets on the 2-core machine: seconds ≤ 15 (upload + check + import), peakRssMB ≤ 250.
 *   BENCH_LOG_DAYS=7 npm run bench:logs   a smaller file
 */
import { mkdtempSync, openAsBlob, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { writeSampleLog } from './generate-sample-log'
import { startDatabase, startServerProcess } from './lib/harness'

const days = Number(process.env.BENCH_LOG_DAYS ?? 30)
const stepS = Number(process.env.BENCH_LOG_STEP_S ?? 5)

const dir = mkdtempSync(join(tmpdir(), 'ohmward-bench-logs-'))
const file = join(dir, 'month-5s.csv')
const { rows } = await writeSampleLog({ days, stepS, out: file })
const sizeMB = Math.round(statSync(file).size / 1024 / 102.4) / 10
console.log(`[bench:logs] ${rows.toLocaleString('en')} rows, ${sizeMB} MB`)

const stack = await startDatabase({ seed: true })
const server = await startServerProcess(stack.dbUrl)
let sampledPeakMB = 0
const sampler = setInterval(() => {
  try {
    const status = readFileSync(`/proc/${server.child.pid}/status`, 'utf8')
    const kb = Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0)
    sampledPeakMB = Math.max(sampledPeakMB, kb / 1024)
  } catch {
    /* process gone */
  }
}, 100)

try {
  const signIn = await fetch(server.url + '/api/auth/sign-in', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'ines@demo.ohmward.local', password: 'van-life-demo-1' }),
  })
  if (!signIn.ok) throw new Error(`demo sign-in failed: ${signIn.status} ${await signIn.text()}`)
  const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? ''
  const vehicles = (await (await fetch(server.url + '/api/vehicles', { headers: { cookie } })).json()) as {
    items: { id: string }[]
  }
  const vehicleId = vehicles.items[0]?.id
  if (!vehicleId) throw new Error('the demo has no vehicle')
  const baseline = server.peakRssMB()

  const t0 = performance.now()
  const form = new FormData()
  form.append('file', await openAsBlob(file, { type: 'text/csv' }), 'month-5s.csv')
  const previewRes = await fetch(`${server.url}/api/vehicles/${vehicleId}/logs/preview`, {
    method: 'POST',
    headers: { cookie },
    body: form,
  })
  const preview = (await previewRes.json()) as {
    uploadId: string
    proposal: { mapping: Record<string, unknown> }
    check: { rowCount: number; errorCount: number } | null
  }
  if (!previewRes.ok) throw new Error(`preview failed: ${previewRes.status} ${JSON.stringify(preview)}`)
  const t1 = performance.now()
  const importRes = await fetch(`${server.url}/api/vehicles/${vehicleId}/logs/${preview.uploadId}/import`, {
    method: 'POST',
    headers: { cookie, 'content-type': 'application/json' },
    body: JSON.stringify({ mapping: { ...preview.proposal.mapping, utcOffsetMinutes: 60 } }),
  })
  const imported = (await importRes.json()) as { rowCount?: number; dayCount?: number }
  if (!importRes.ok) throw new Error(`import failed: ${importRes.status} ${JSON.stringify(imported)}`)
  const t2 = performance.now()
  clearInterval(sampler)
  const peakRssMB = server.peakRssMB()
  console.log(
    `[bench:logs] preview (upload + check of the first 50,000 rows) ${((t1 - t0) / 1000).toFixed(1)} s, import ${((t2 - t1) / 1000).toFixed(1)} s, ` +
      `${imported.rowCount} rows stored over ${imported.dayCount} days; server memory ${baseline} MB at rest, peak ${peakRssMB} MB`,
  )
  console.log(
    JSON.stringify({
      rows: imported.rowCount,
      seconds: Math.round((t2 - t0) / 100) / 10,
      peakRssMB,
      previewSeconds: Math.round((t1 - t0) / 100) / 10,
      importSeconds: Math.round((t2 - t1) / 100) / 10,
      sampledPeakRssMB: Math.round(sampledPeakMB * 10) / 10,
      fileMB: sizeMB,
      targets: { seconds: 15, peakRssMB: 250 },
    }),
  )
} finally {
  clearInterval(sampler)
  await server.stop()
  await stack.stop()
  rmSync(dir, { recursive: true, force: true })
}
