/**
 * Logs (issue 9): preview an uploaded battery-monitor CSV, import it in one transaction, list uploads,
 * daily summaries, measured vs planned, and a calibrated copy of a scenario. Routes: logs.routes.ts.
 */
import { once } from 'node:events'
import { rm, stat } from 'node:fs/promises'
import { finished } from 'node:stream/promises'
import { desc, eq, sql } from 'drizzle-orm'
import type pg from 'pg'
import { from as copyFrom } from 'pg-copy-streams'
import type {
  LogCalibrateAnswer,
  LogCompareAnswer,
  LogDaysAnswer,
  LogPreview,
  LogUpload,
} from '../../../shared/logs/api'
import { calibrateUsage } from '../../../shared/logs/calibrate'
import {
  compareWithPlan,
  plannedPackDays,
  type Comparison,
  type PlannedDay,
} from '../../../shared/logs/compare'
import { detectShape } from '../../../shared/logs/detect'
import { completeMapping, proposeMapping } from '../../../shared/logs/mapping'
import { cellSpreadTrend } from '../../../shared/logs/trend'
import { LOG_LIMITS, type LogDay, type LogMapping, type LogSample } from '../../../shared/logs/types'
import { simulate } from '../../../shared/engine/simulate'
import type { AppContext } from '../../context'
import type { Db } from '../../db/client'
import { logDays, logMappings, logUploads } from '../../db/schema/index'
import { HttpError, badRequest, notFound } from '../../errors'
import { buildPlanForScenario } from '../scenarios/plan'
import {
  duplicateScenario,
  loadScenarioForUser,
  loadUsage,
  patchScenario,
  deleteScenario,
} from '../scenarios/scenarios.service'
import { isId, requireVehicleRole } from '../vehicles/access'
import { loadApplianceRows } from '../vehicles/appliances.service'
import { userRefs, type Actor } from '../vehicles/records'
import { readHead } from './csv'
import { loadPending, pendingFile, removePending, savePending, sweepPending } from './pending'
import { scanLog, type ScanResult } from './scan'

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString())

export const importInvalid = (scan: ScanResult) =>
  new HttpError(
    400,
    'import_invalid',
    scan.errorCount === 1
      ? 'The file has 1 problem. Nothing was stored.'
      : `The file has ${scan.errorCount.toLocaleString('en')} problems. Nothing was stored.`,
    undefined,
    { errors: scan.errors, errorCount: scan.errorCount },
  )

function checkOf(scan: ScanResult) {
  return {
    rowCount: scan.rowCount,
    complete: scan.complete,
    errors: scan.errors,
    errorCount: scan.errorCount,
    firstTs: iso(scan.firstTsMs),
    lastTs: iso(scan.lastTsMs),
  }
}

/**
 * Step 1: the file is already on disk (multer). Detect its shape from the first 64 kB, propose a mapping
 * (the vehicle's remembered one when it fits) and check the whole file against it, streaming.
 */
export async function previewUpload(
  db: Db,
  actor: Actor,
  vehicleId: string,
  file: { path: string; originalName: string; sizeBytes: number; uploadId: string },
): Promise<LogPreview> {
  void sweepPending()
  const head = await readHead(file.path)
  const fail = async (code: string, message: string) => {
    await rm(file.path, { force: true })
    return new HttpError(400, code, message)
  }
  if (file.sizeBytes === 0 || head.text.trim() === '') throw await fail('empty_file', 'The file is empty.')
  if (head.binary) {
    throw await fail(
      'not_text',
      'This is not a text CSV file (it looks like a spreadsheet or another binary file). Export the log as CSV and upload that.',
    )
  }
  const shape = detectShape(head.text, head.complete)
  if (!shape) throw await fail('empty_file', 'The file has no rows.')
  const [remembered] = await db
    .select({ mapping: logMappings.mapping })
    .from(logMappings)
    .where(eq(logMappings.vehicleId, vehicleId))
  const proposal = proposeMapping(shape, remembered?.mapping ?? null)
  const complete = completeMapping(proposal.mapping)
  const check = complete.ok
    ? checkOf(await scanLog(file.path, complete.mapping, { maxRows: LOG_LIMITS.checkRows }))
    : null
  await savePending({
    uploadId: file.uploadId,
    vehicleId,
    userId: actor.id,
    fileName: file.originalName,
    sizeBytes: file.sizeBytes,
    createdAt: new Date().toISOString(),
  })
  const first = shape.format.hasHeader ? 2 : 1
  return {
    uploadId: file.uploadId,
    fileName: file.originalName,
    sizeBytes: file.sizeBytes,
    detected: shape.format,
    columns: shape.columns,
    notes: shape.notes,
    proposal: {
      ...proposal,
      source: proposal.reasons.timestampColumn?.startsWith('Same columns') ? 'remembered' : 'detected',
    },
    rows: shape.rows.slice(0, LOG_LIMITS.previewRows).map((cells, i) => ({ row: first + i, cells })),
    check,
  }
}

async function pendingFor(actor: Actor, vehicleId: string, uploadId: string) {
  const p = await loadPending(uploadId)
  if (!p || p.vehicleId !== vehicleId || p.userId !== actor.id) {
    throw notFound('That upload (it may have expired: upload the file again)')
  }
  try {
    await stat(pendingFile(uploadId))
  } catch {
    throw notFound('That upload (it may have expired: upload the file again)')
  }
  return p
}

/** Check the pending file against a corrected mapping (nothing is stored). */
export async function checkUpload(actor: Actor, vehicleId: string, uploadId: string, mapping: LogMapping) {
  await pendingFor(actor, vehicleId, uploadId)
  return checkOf(await scanLog(pendingFile(uploadId), mapping, { maxRows: LOG_LIMITS.checkRows }))
}

/**
 * Samples go into log_samples with `COPY … FROM STDIN` (pg-copy-streams), inside the import's transaction:
 * each row becomes one line of PostgreSQL's COPY text format, and lines are sent in pieces of about 64 kB with
 * the connection's backpressure. Against batched `INSERT … SELECT FROM unnest(arrays)` this keeps no per-batch
 * column arrays and builds no array literals, so far less garbage piles up in the server's heap during a
 * 500,000-row import (bench:logs), and PostgreSQL takes the rows on its fastest path.
 */
const COPY_SAMPLES = `COPY log_samples (upload_id, ts, pack_voltage_v, current_a, soc_fraction, temperatures_c, cell_voltages_v) FROM STDIN`
const COPY_PIECE_CHARS = 64 * 1024

/** COPY text for a list of numbers as a PostgreSQL array (`{3.301,3.302}`), or NULL (`\N`). */
const copyArray = (xs: readonly number[] | null | undefined): string => (xs ? `{${xs.join(',')}}` : '\\N')

class SampleCopy {
  private readonly stream: ReturnType<typeof copyFrom>
  private readonly done: Promise<void>
  private text = ''

  constructor(
    client: pg.PoolClient,
    private readonly uploadId: string,
  ) {
    this.stream = client.query(copyFrom(COPY_SAMPLES))
    this.done = finished(this.stream)
    this.done.catch(() => {}) // awaited by finish() or abort(); this only avoids an unhandled rejection
  }

  /** Add one sample; returns a promise only when a piece was sent and the connection asks to wait. */
  push(x: LogSample): Promise<void> | undefined {
    this.text +=
      `${this.uploadId}\t${new Date(x.tsMs).toISOString()}\t${x.packVoltageV}\t${x.currentA}\t` +
      `${x.socFraction ?? '\\N'}\t${copyArray(x.temperaturesC)}\t${copyArray(x.cellVoltagesV)}\n`
    return this.text.length >= COPY_PIECE_CHARS ? this.send() : undefined
  }

  private async send(): Promise<void> {
    const ok = this.stream.write(this.text)
    this.text = ''
    if (!ok) await once(this.stream, 'drain')
  }

  /** Send the rest and wait until PostgreSQL has taken every row. */
  async finish(): Promise<void> {
    if (this.text) await this.send()
    this.stream.end()
    await this.done
  }

  /** Give up (the file has problems): PostgreSQL fails the COPY; the caller rolls the transaction back. */
  async abort(): Promise<void> {
    this.stream.destroy(new Error('import abandoned: the file has problems'))
    await this.done.catch(() => {})
  }
}

const INSERT_DAYS = `
INSERT INTO log_days (upload_id, date, sample_count, covered_h, energy_in_wh, energy_out_wh, soc_min_fraction,
  soc_max_fraction, pack_voltage_min_v, pack_voltage_max_v, cell_spread_max_mv, cell_spread_typical_mv,
  cell_spread_p95_mv, temperature_min_c, temperature_max_c)
SELECT $1::uuid, d.date, d."sampleCount", d."coveredH", d."energyInWh", d."energyOutWh", d."socMinFraction",
  d."socMaxFraction", d."packVoltageMinV", d."packVoltageMaxV", d."cellSpreadMaxMv", d."cellSpreadTypicalMv",
  d."cellSpreadP95Mv", d."temperatureMinC", d."temperatureMaxC"
FROM jsonb_to_recordset($2::jsonb) AS d(date date, "sampleCount" int, "coveredH" float8, "energyInWh" float8,
  "energyOutWh" float8, "socMinFraction" float8, "socMaxFraction" float8, "packVoltageMinV" float8,
  "packVoltageMaxV" float8, "cellSpreadMaxMv" float8, "cellSpreadTypicalMv" float8, "cellSpreadP95Mv" float8,
  "temperatureMinC" float8, "temperatureMaxC" float8)`

/**
 * Step 2: stream the pending file again, check every row, and insert samples in batches inside ONE
 * transaction. Any problem rolls everything back: nothing is stored and the answer lists the problems.
 */
export async function importUpload(
  ctx: Pick<AppContext, 'db' | 'pool'>,
  actor: Actor,
  vehicleId: string,
  uploadId: string,
  mapping: LogMapping,
): Promise<LogUpload> {
  const pending = await pendingFor(actor, vehicleId, uploadId)
  const client = await ctx.pool.connect()
  let scan: ScanResult
  try {
    await client.query('BEGIN')
    await client.query(
      `INSERT INTO log_uploads (id, vehicle_id, file_name, size_bytes, row_count, first_ts, last_ts, mapping, spread_trend, created_by)
       VALUES ($1, $2, $3, $4, 0, now(), now(), $5, '{}'::jsonb, $6)`,
      [
        uploadId,
        vehicleId,
        pending.fileName.slice(0, 200),
        pending.sizeBytes,
        JSON.stringify(mapping),
        actor.id,
      ],
    )
    const copy = new SampleCopy(client, uploadId)
    try {
      scan = await scanLog(pendingFile(uploadId), mapping, { summarise: true, onSample: (s) => copy.push(s) })
    } catch (err) {
      await copy.abort()
      throw err
    }
    if (scan.errorCount > 0 || scan.rowCount === 0) {
      await copy.abort()
      await client.query('ROLLBACK')
      throw importInvalid(scan)
    }
    await copy.finish()
    await client.query(INSERT_DAYS, [uploadId, JSON.stringify(scan.days)])
    await client.query(
      `UPDATE log_uploads SET row_count = $2, first_ts = $3, last_ts = $4, spread_trend = $5 WHERE id = $1`,
      [
        uploadId,
        scan.rowCount,
        iso(scan.firstTsMs),
        iso(scan.lastTsMs),
        JSON.stringify(cellSpreadTrend(scan.days)),
      ],
    )
    await client.query(
      `INSERT INTO log_mappings (vehicle_id, mapping, updated_at, updated_by) VALUES ($1, $2, now(), $3)
       ON CONFLICT (vehicle_id) DO UPDATE SET mapping = EXCLUDED.mapping, updated_at = now(), updated_by = EXCLUDED.updated_by`,
      [vehicleId, JSON.stringify(mapping), actor.id],
    )
    await client.query('COMMIT')
  } catch (err) {
    await client.query('ROLLBACK').catch(() => {})
    throw err
  } finally {
    client.release()
  }
  await removePending(uploadId)
  return getUpload(ctx.db, actor, uploadId, 'read')
}

type UploadRow = typeof logUploads.$inferSelect

async function present(db: Db, rows: UploadRow[]): Promise<LogUpload[]> {
  const refs = await userRefs(
    db,
    rows.map((r) => r.createdBy),
  )
  const counts = rows.length
    ? await db
        .select({ uploadId: logDays.uploadId, n: sql<number>`count(*)::int` })
        .from(logDays)
        .where(sql`${logDays.uploadId} IN ${rows.map((r) => r.id)}`)
        .groupBy(logDays.uploadId)
    : []
  const dayCount = new Map(counts.map((c) => [c.uploadId, c.n]))
  return rows.map((r) => ({
    id: r.id,
    vehicleId: r.vehicleId,
    fileName: r.fileName,
    sizeBytes: r.sizeBytes,
    rowCount: r.rowCount,
    firstTs: r.firstTs.toISOString(),
    lastTs: r.lastTs.toISOString(),
    dayCount: dayCount.get(r.id) ?? 0,
    mapping: r.mapping,
    spreadTrend: r.spreadTrend,
    createdAt: r.createdAt.toISOString(),
    createdBy: r.createdBy ? (refs.get(r.createdBy) ?? null) : null,
  }))
}

export async function listUploads(db: Db, actor: Actor, vehicleId: string): Promise<{ items: LogUpload[] }> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  const rows = await db
    .select()
    .from(logUploads)
    .where(eq(logUploads.vehicleId, vehicleId))
    .orderBy(desc(logUploads.createdAt))
    .limit(100)
  return { items: await present(db, rows) }
}

/** The upload, if the user's role on its vehicle allows `need` (404 otherwise, like a missing one). */
async function loadUpload(
  db: Db,
  actor: Actor,
  uploadId: string,
  need: 'read' | 'write',
): Promise<UploadRow> {
  if (!isId(uploadId)) throw notFound('That log')
  const [row] = await db.select().from(logUploads).where(eq(logUploads.id, uploadId)).limit(1)
  if (!row) throw notFound('That log')
  try {
    await requireVehicleRole(db, actor.id, row.vehicleId, need)
  } catch (err) {
    if ((err as { status?: number }).status === 404) throw notFound('That log')
    throw err
  }
  return row
}

export async function getUpload(
  db: Db,
  actor: Actor,
  uploadId: string,
  need: 'read' | 'write',
): Promise<LogUpload> {
  const [u] = await present(db, [await loadUpload(db, actor, uploadId, need)])
  return u!
}

async function loadDays(db: Db, uploadId: string): Promise<LogDay[]> {
  const rows = await db.select().from(logDays).where(eq(logDays.uploadId, uploadId)).orderBy(logDays.date)
  return rows.map(({ uploadId: _u, ...d }) => d)
}

export async function uploadDays(db: Db, actor: Actor, uploadId: string): Promise<LogDaysAnswer> {
  const upload = await getUpload(db, actor, uploadId, 'read')
  return { upload, days: await loadDays(db, uploadId) }
}

export async function deleteUpload(db: Db, actor: Actor, uploadId: string): Promise<void> {
  const row = await loadUpload(db, actor, uploadId, 'write')
  await db.delete(logUploads).where(eq(logUploads.id, row.id))
}

async function comparison(
  db: Db,
  actor: Actor,
  upload: UploadRow,
  scenarioId: string,
  need: 'read' | 'write',
): Promise<{
  comparison: Comparison
  planDays: PlannedDay[]
  scenario: { id: string; name: string; vehicleId: string }
}> {
  const { row: scenario } = await loadScenarioForUser(db, actor.id, scenarioId, need)
  if (scenario.vehicleId !== upload.vehicleId) {
    throw badRequest('Pick a scenario of the same vehicle as the log.', {
      scenarioId: ['belongs to another vehicle'],
    })
  }
  const plan = await buildPlanForScenario(db, scenario.id)
  const planDays = plannedPackDays(simulate(plan))
  const days = await loadDays(db, upload.id)
  return {
    comparison: compareWithPlan(days, planDays),
    planDays,
    scenario: { id: scenario.id, name: scenario.name, vehicleId: scenario.vehicleId },
  }
}

export async function compareUpload(
  db: Db,
  actor: Actor,
  uploadId: string,
  scenarioId: string,
): Promise<LogCompareAnswer> {
  const upload = await loadUpload(db, actor, uploadId, 'read')
  const r = await comparison(db, actor, upload, scenarioId, 'read')
  return { ...r.comparison, planDays: r.planDays, scenario: r.scenario }
}

/**
 * A copy of the scenario whose appliance use is scaled by measured ÷ planned use, made with the scenarios
 * module's own duplicate and patch (history rows included).
 */
export async function calibrateScenario(
  db: Db,
  actor: Actor,
  uploadId: string,
  input: { scenarioId: string; name?: string | undefined },
): Promise<LogCalibrateAnswer> {
  const upload = await loadUpload(db, actor, uploadId, 'write')
  const { comparison: c, scenario } = await comparison(db, actor, upload, input.scenarioId, 'write')
  if (c.useRatio === null || c.totals.days === 0) {
    throw new HttpError(
      422,
      'nothing_to_calibrate',
      'No full day of this log lines up with the plan, so there is no measured ratio to calibrate with.',
    )
  }
  const ratio = Math.round(c.useRatio * 100) / 100
  const appliances = (await loadApplianceRows(db, upload.vehicleId)).map((a) => ({ id: a.id, ...a.params }))
  const usage = await loadUsage(db, scenario.id)
  // The ratio applies to what the plan uses from the pack, but only appliance use is scaled (the heater, the
  // BMS and inverter idle stay), and windows can fill up. So refine the appliance factor a few times against
  // the engine until the calibrated plan's use matches the measured use.
  const plan = await buildPlanForScenario(db, scenario.id)
  const days = await loadDays(db, upload.id)
  let factor = c.useRatio
  let calibrated = calibrateUsage(appliances, usage, factor)
  for (let i = 0; i < 4; i++) {
    const trial = {
      ...plan,
      appliances: plan.appliances.map((a) => ({ ...a, usage: calibrated.usage[a.id] ?? a.usage })),
    }
    const r = compareWithPlan(days, plannedPackDays(simulate(trial))).useRatio
    if (r === null || Math.abs(r - 1) < 0.01) break
    factor *= r
    calibrated = calibrateUsage(appliances, usage, factor)
  }
  const name = (input.name ?? `${scenario.name} (calibrated ×${ratio.toFixed(2)})`).slice(0, 120)
  const copy = await duplicateScenario(db, actor, scenario.id, { name })
  try {
    const patched = await patchScenario(db, actor, copy.id, {
      version: copy.version,
      usage: calibrated.usage,
      notes:
        `${copy.notes ? copy.notes + '\n\n' : ''}Calibrated from the log “${upload.fileName}”: appliance use scaled by ${ratio.toFixed(2)} (measured ÷ planned use from the pack over ${c.totals.days} full days).`.slice(
          0,
          4000,
        ),
    })
    return {
      scenario: {
        id: patched.id,
        name: patched.name,
        vehicleId: patched.vehicleId,
        version: patched.version,
      },
      ratio,
      capped: calibrated.capped,
    }
  } catch (err) {
    await deleteScenario(db, actor, copy.id, copy.version).catch(() => {})
    throw err
  }
}
