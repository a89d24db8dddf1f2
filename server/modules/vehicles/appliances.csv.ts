/**
 * Appliance list as CSV (papaparse): export, and import with a preview. The import checks every row
 * first; it saves only when asked to (`confirm`) and only when no row has an error, in one transaction.
 */
import { eq, sql } from 'drizzle-orm'
import Papa from 'papaparse'
import { PLAN_LIMITS } from '../../../shared/schemas/plan'
import {
  APPLIANCE_CSV_COLUMNS,
  APPLIANCE_CSV_OPTIONAL_COLUMNS,
  ApplianceCreateSchema,
  type ApplianceCsvColumn,
  type ApplianceFields,
  type ApplianceImportRequest,
  type ImportError,
  type ImportPreview,
  type ImportPreviewRow,
  type ImportResult,
} from '../../../shared/schemas/vehicles'
import type { Db } from '../../db/client'
import { appliances, vehicles } from '../../db/schema/index'
import { HttpError } from '../../errors'
import { requireVehicleRole } from './access'
import { loadApplianceRows, presentAppliances } from './appliances.service'
import { recordHistory, type Actor } from './records'

const NUMERIC: readonly ApplianceCsvColumn[] = [
  'powerW',
  'quantity',
  'hoursPerDay',
  'startHour',
  'endHour',
  'dutyCycleFraction',
  'standbyW',
]
const KNOWN = new Set<string>(APPLIANCE_CSV_COLUMNS)
const FORMULA_START = /^[=+\-@\t\r]/

/** Spreadsheets may turn `1,5` into text in a comma file; accept a decimal comma in a quoted cell. */
function toNumber(cell: string): number | null {
  const t = cell.trim().replace(/^(-?\d+),(\d+)$/, '$1.$2')
  if (t === '' || !/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t)) return null
  return Number(t)
}

/** Undo the export's formula guard (a `'` before =, +, -, @) so an export re-imports unchanged. */
const unguard = (text: string) =>
  text.startsWith("'") && FORMULA_START.test(text.slice(1)) ? text.slice(1) : text

interface Parsed {
  rows: ImportPreviewRow[]
  errors: ImportError[]
}

/** Check a CSV text: every problem with its line and column, and the appliance each good row becomes. */
export function parseApplianceCsv(csv: string): Parsed {
  const errors: ImportError[] = []
  const rows: ImportPreviewRow[] = []
  const result = Papa.parse<string[]>(csv.replace(/^\uFEFF/, ''), { header: false, skipEmptyLines: false })
  const lines = result.data
  const header = (lines[0] ?? []).map((h) => h.trim())
  if (header.length === 0 || header.every((h) => h === '')) {
    return {
      rows,
      errors: [
        {
          row: 0,
          column: null,
          message: 'The file is empty: it needs a header row and one row per appliance.',
        },
      ],
    }
  }
  header.forEach((h) => {
    if (h !== '' && !KNOWN.has(h))
      errors.push({
        row: 1,
        column: h,
        message: `is not a known column (known: ${APPLIANCE_CSV_COLUMNS.join(', ')})`,
      })
  })
  for (const col of APPLIANCE_CSV_COLUMNS) {
    if (!APPLIANCE_CSV_OPTIONAL_COLUMNS.includes(col) && !header.includes(col)) {
      errors.push({ row: 1, column: col, message: 'column is missing from the header row' })
    }
  }
  const parseErrorsByLine = new Map<number, string>()
  for (const e of result.errors) if (e.row !== undefined) parseErrorsByLine.set(e.row, e.message)

  lines.slice(1).forEach((cells, i) => {
    const line = i + 2
    if (cells.every((c) => c.trim() === '')) return // blank line
    const values: Record<string, string> = {}
    header.forEach((h, j) => {
      if (h !== '') values[h] = cells[j] ?? ''
    })
    const rowErrors: ImportError[] = []
    const parseError = parseErrorsByLine.get(i + 1)
    if (parseError) rowErrors.push({ row: line, column: null, message: parseError })
    if (cells.length > header.length && cells.slice(header.length).some((c) => c.trim() !== '')) {
      rowErrors.push({
        row: line,
        column: null,
        message: `has ${cells.length} cells but the header has ${header.length}`,
      })
    }
    const candidate: Record<string, unknown> = {}
    for (const col of APPLIANCE_CSV_COLUMNS) {
      const cell = (values[col] ?? '').trim()
      if (cell === '') {
        if (!APPLIANCE_CSV_OPTIONAL_COLUMNS.includes(col)) candidate[col] = undefined
        continue
      }
      if (NUMERIC.includes(col)) {
        const n = toNumber(cell)
        if (n === null) rowErrors.push({ row: line, column: col, message: `“${cell}” is not a number` })
        else candidate[col] = n
      } else if (col === 'name') {
        candidate[col] = unguard(cell)
      } else {
        candidate[col] = cell.toLowerCase()
      }
    }
    const checked = ApplianceCreateSchema.safeParse(candidate)
    if (!checked.success) {
      for (const issue of checked.error.issues) {
        const column = String(issue.path[0] ?? '')
        if (rowErrors.some((e) => e.column === column)) continue // already said "not a number"
        rowErrors.push({ row: line, column: column || null, message: issue.message })
      }
    }
    errors.push(...rowErrors)
    rows.push({
      row: line,
      values,
      appliance: rowErrors.length === 0 && checked.success ? checked.data : null,
    })
  })
  if (rows.length === 0 && errors.length === 0) {
    errors.push({ row: 0, column: null, message: 'The file has a header row but no appliances.' })
  }
  return { rows, errors }
}

/** Preview (`confirm: false`) or save all rows in one transaction (`confirm: true`, no errors). */
export async function importAppliances(
  db: Db,
  actor: Actor,
  vehicleId: string,
  input: Required<ApplianceImportRequest>,
): Promise<ImportPreview | ImportResult> {
  await requireVehicleRole(db, actor.id, vehicleId, 'write')
  const { rows, errors } = parseApplianceCsv(input.csv)
  const [count] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(appliances)
    .where(eq(appliances.vehicleId, vehicleId))
  const total = rows.length + (input.mode === 'replace' ? 0 : (count?.n ?? 0))
  if (total > PLAN_LIMITS.appliancesMax) {
    errors.push({
      row: 0,
      column: null,
      message: `A vehicle holds at most ${PLAN_LIMITS.appliancesMax} appliances; this import would make ${total}.`,
    })
  }
  if (!input.confirm) return { saved: false, mode: input.mode, rows, errors }
  if (errors.length > 0) {
    throw new HttpError(
      400,
      'import_invalid',
      `Nothing was imported: ${errors.length} problem${errors.length === 1 ? '' : 's'} in the file. Fix them and try again.`,
      undefined,
      { errors },
    )
  }
  const fields = rows.map((r) => r.appliance!) satisfies ApplianceFields[]
  return db.transaction(async (tx) => {
    let removed = 0
    if (input.mode === 'replace') {
      removed = (
        await tx
          .delete(appliances)
          .where(eq(appliances.vehicleId, vehicleId))
          .returning({ id: appliances.id })
      ).length
    }
    const created = await tx
      .insert(appliances)
      .values(fields.map((params) => ({ vehicleId, params, updatedBy: actor.id })))
      .returning()
    created.sort((a, b) => a.seq - b.seq)
    await recordHistory(tx, {
      vehicleId,
      entity: 'appliance',
      entityId: null,
      action: 'import',
      summary: `Imported ${created.length} appliance${created.length === 1 ? '' : 's'} from a CSV file${
        input.mode === 'replace' ? `, replacing ${removed}` : ''
      }`,
      after: fields,
      actorId: actor.id,
    })
    return { saved: true as const, mode: input.mode, created: await presentAppliances(tx, created), removed }
  })
}

/** The inventory as CSV text (columns APPLIANCE_CSV_COLUMNS) and a file name for it. */
export async function exportAppliancesCsv(
  db: Db,
  actor: Actor,
  vehicleId: string,
): Promise<{ fileName: string; csv: string }> {
  await requireVehicleRole(db, actor.id, vehicleId, 'read')
  const [vehicle] = await db.select({ name: vehicles.name }).from(vehicles).where(eq(vehicles.id, vehicleId))
  const rows = await loadApplianceRows(db, vehicleId)
  const data = rows.map((r) => APPLIANCE_CSV_COLUMNS.map((c) => (r.params[c] ?? '') as string | number))
  // escapeFormulae: a name like "=HYPERLINK(…)" must not run as a formula when the file is opened.
  const csv = Papa.unparse(
    { fields: [...APPLIANCE_CSV_COLUMNS], data },
    { escapeFormulae: true, newline: '\r\n' },
  )
  const slug = (vehicle?.name ?? 'vehicle')
    .normalize('NFKD')
    .replace(/[^\w]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .toLowerCase()
  return { fileName: `${slug || 'vehicle'}-appliances.csv`, csv: `${csv}\r\n` }
}
