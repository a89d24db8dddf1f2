/**
 * What changed under an edit that came back as 409: for each field, what the editor started from,
 * what is stored now (someone else's change), and what this editor wanted. Pure; tested in
 * tests/components/conflictDiff.test.ts.
 */

const META = new Set([
  'version',
  'updatedAt',
  'updatedBy',
  'id',
  'vehicleId',
  'createdAt',
  'vehicleName',
  'myRole',
])

export interface ConflictRow {
  path: string
  label: string
  was: string
  theirs: string
  mine: string | null
  /** Both sides changed this field, to different values. */
  clash: boolean
}

/**
 * Flattens nested objects to dotted paths. Arrays are one value (`arrays: 'leaf'`, for merging) or
 * spelled out by index (`arrays: 'index'`, for showing what changed line by line).
 */
export function flatten(
  value: unknown,
  prefix = '',
  out: Record<string, unknown> = {},
  arrays: 'leaf' | 'index' = 'leaf',
): Record<string, unknown> {
  if (Array.isArray(value) && arrays === 'index' && prefix) {
    value.forEach((v, i) => flatten(v, `${prefix}.${i}`, out, arrays))
  } else if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
      if (!prefix && META.has(k)) continue
      flatten(v, prefix ? `${prefix}.${k}` : k, out, arrays)
    }
  } else if (prefix) out[prefix] = value
  return out
}

/** JSON with object keys sorted, so key order (PostgreSQL jsonb reorders keys) never counts as a change. */
export function stableJson(v: unknown): string {
  return JSON.stringify(v, (_k, val: unknown) =>
    val && typeof val === 'object' && !Array.isArray(val)
      ? Object.fromEntries(
          Object.entries(val as Record<string, unknown>).sort(([a], [b]) => a.localeCompare(b)),
        )
      : val,
  )
}

const LABELS: Record<string, string> = {
  name: 'Name',
  notes: 'Notes',
  kind: 'Kind',
  systemVoltageV: 'System voltage',
  powerW: 'Power',
  quantity: 'Quantity',
  hoursPerDay: 'Hours a day',
  startHour: 'From',
  endHour: 'Until',
  dutyCycleFraction: 'Duty cycle',
  standbyW: 'Standby',
  supply: 'DC or AC',
  category: 'Category',
  placeName: 'Place',
  'trip.startDate': 'Start date',
  'trip.days': 'Days',
  'trip.latitudeDeg': 'Latitude',
  'trip.longitudeDeg': 'Longitude',
  'trip.timeZone': 'Time zone',
  'trip.sky': 'Sky',
  'trip.nightLowC': 'Night low (°C)',
  'trip.dayHighC': 'Day high (°C)',
  'trip.startSocFraction': 'Starting charge',
  'trip.dayPlan.kind': 'Day plan',
  'trip.dayPlan.days': 'Day plan entries',
  peakPowerWp: 'Panel power (Wp)',
  currentA: 'Current (A)',
  maxCurrentA: 'Controller current (A)',
  capacityAh: 'Capacity (Ah)',
  cellCapacityAh: 'Capacity per cell (Ah)',
  cellsSeries: 'Cells in series',
  cellsParallel: 'Strings in parallel',
  chemistry: 'Chemistry',
  ratedW: 'Inverter rating (W)',
  enabled: 'used on this trip',
}

const DAY_FIELDS: Record<string, string> = {
  drivingHours: 'driving (h)',
  drivingStartHour: 'driving from (h)',
  hookup: 'hook-up',
  generatorHours: 'generator (h)',
  generatorStartHour: 'generator from (h)',
}

export function labelFor(path: string): string {
  if (LABELS[path]) return LABELS[path]
  const day = /^trip\.dayPlan\.days\.(\d+)\.(\w+)$/.exec(path)
  if (day) return `Day plan line ${Number(day[1]) + 1}: ${DAY_FIELDS[day[2]!] ?? day[2]}`
  const use = /^usage\.[^.]+\.(\w+)$/.exec(path)
  if (use) return `Appliance use: ${LABELS[use[1]!] ?? use[1]}`
  const leaf = path.split('.').slice(-1)[0] ?? path
  return LABELS[leaf] ?? path
}

export function show(v: unknown): string {
  if (v === undefined) return '—'
  if (v === null) return 'none'
  if (typeof v === 'boolean') return v ? 'yes' : 'no'
  if (typeof v === 'number') return String(Math.round(v * 1000) / 1000)
  if (typeof v === 'string') return v === '' ? '(empty)' : v
  if (Array.isArray(v)) return `${v.length} entries`
  return JSON.stringify(v)
}

const same = (a: unknown, b: unknown) => stableJson(a) === stableJson(b)

/**
 * @param base    the record as this editor loaded it
 * @param mine    the fields this editor tried to save (a patch, or the whole record)
 * @param current the record as stored now
 */
export function conflictRows(base: unknown, mine: unknown, current: unknown): ConflictRow[] {
  const b = flatten(base, '', {}, 'index')
  const m = flatten(mine, '', {}, 'index')
  const c = flatten(current, '', {}, 'index')
  const paths = new Set<string>()
  for (const p of new Set([...Object.keys(b), ...Object.keys(c)])) if (!same(b[p], c[p])) paths.add(p)
  for (const p of Object.keys(m)) if (!same(m[p], b[p])) paths.add(p)
  return [...paths]
    .sort((x, y) => x.localeCompare(y, 'en', { numeric: true }))
    .map((path) => {
      const theirsChanged = !same(b[path], c[path])
      const mineChanged = path in m && !same(m[path], b[path])
      return {
        path,
        label: labelFor(path),
        was: show(b[path]),
        theirs: show(c[path]),
        mine: mineChanged ? show(m[path]) : null,
        clash: theirsChanged && mineChanged && !same(m[path], c[path]),
      }
    })
}

function setPath(target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.')
  let obj = target
  for (const k of keys.slice(0, -1)) {
    if (obj[k] === null || typeof obj[k] !== 'object' || Array.isArray(obj[k])) obj[k] = {}
    obj = obj[k] as Record<string, unknown>
  }
  const last = keys[keys.length - 1]!
  if (value === undefined) delete obj[last]
  else obj[last] = value
}

/**
 * "Apply my edit again" for a whole record: the stored version with only the fields this editor
 * changed (relative to what they started from) put on top. Others' changes elsewhere survive.
 */
export function rebase<T>(base: unknown, mine: T, current: unknown): T {
  if (mine === null || typeof mine !== 'object' || current === null || typeof current !== 'object')
    return mine
  const b = flatten(base)
  const m = flatten(mine)
  const out = JSON.parse(JSON.stringify(current)) as Record<string, unknown>
  for (const p of new Set([...Object.keys(b), ...Object.keys(m)])) {
    if (!same(m[p], b[p])) setPath(out, p, m[p])
  }
  return out as T
}

/** For a partial patch: only the top-level fields this editor changed. */
export function changedOnly<T extends Record<string, unknown>>(base: unknown, mine: T): Partial<T> {
  const b = (base ?? {}) as Record<string, unknown>
  const out: Partial<T> = {}
  for (const [k, v] of Object.entries(mine)) if (!same(v, b[k])) (out as Record<string, unknown>)[k] = v
  return out
}
