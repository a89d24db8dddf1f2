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

/** Flattens nested objects to dotted paths; arrays are compared whole. */
export function flatten(
  value: unknown,
  prefix = '',
  out: Record<string, unknown> = {},
): Record<string, unknown> {
  if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [k, v] of Object.entries(value as Record<string, unknown>)) {
      if (!prefix && META.has(k)) continue
      flatten(v, prefix ? `${prefix}.${k}` : k, out)
    }
  } else if (prefix) out[prefix] = value
  return out
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
}

export function labelFor(path: string): string {
  if (LABELS[path]) return LABELS[path]
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

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b)

/**
 * @param base    the record as this editor loaded it
 * @param mine    the fields this editor tried to save (a patch, or the whole record)
 * @param current the record as stored now
 */
export function conflictRows(base: unknown, mine: unknown, current: unknown): ConflictRow[] {
  const b = flatten(base)
  const m = flatten(mine)
  const c = flatten(current)
  const paths = new Set<string>()
  for (const p of new Set([...Object.keys(b), ...Object.keys(c)])) if (!same(b[p], c[p])) paths.add(p)
  for (const p of Object.keys(m)) if (!same(m[p], b[p])) paths.add(p)
  return [...paths].sort().map((path) => {
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
