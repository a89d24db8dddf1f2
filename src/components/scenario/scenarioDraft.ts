/**
 * The scenario editor's working copy and its conversion to the API's shape. Validation uses the
 * shared schema, so the form names the same fields, with the same messages, as the server.
 */
import type { DayPlan, DayPlanEntry, SkyKind } from '@shared/schemas/plan'
import {
  ScenarioCreateSchema,
  type Scenario,
  type ScenarioCreate,
  type ScenarioUsage,
} from '@shared/schemas/vehicles'
import { addDays } from './scenarioWords'

export interface PlaceValue {
  placeName: string
  latitudeDeg: number | null
  longitudeDeg: number | null
  timeZone: string
}

export interface ScenarioDraft {
  name: string
  notes: string
  place: PlaceValue
  startDate: string
  days: number
  sky: SkyKind
  clearnessIndexFraction: number | null
  nightLowC: number | null
  dayHighC: number | null
  startSocFraction: number
  dayPlan: DayPlan
  usage: ScenarioUsage
}

/** A parked day: no driving, no hook-up. */
export const PARKED: DayPlanEntry = { drivingHours: 0, drivingStartHour: 9, hookup: false }

/** The first of next month, as YYYY-MM-DD. */
function firstOfNextMonth(today: Date): string {
  return new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth() + 1, 1)).toISOString().slice(0, 10)
}

export function newScenarioDraft(today = new Date()): ScenarioDraft {
  return {
    name: '',
    notes: '',
    place: { placeName: '', latitudeDeg: null, longitudeDeg: null, timeZone: '' },
    startDate: firstOfNextMonth(today),
    days: 7,
    sky: 'mixed',
    clearnessIndexFraction: null,
    nightLowC: 5,
    dayHighC: 15,
    startSocFraction: 1,
    // A typical touring week: a couple of hours' drive most days, a parked weekend (invented).
    dayPlan: {
      kind: 'week',
      days: [0, 1, 2, 3, 4, 5, 6].map((i) => (i < 5 ? { ...PARKED, drivingHours: 2 } : { ...PARKED })),
    },
    usage: {},
  }
}

export function draftFromScenario(s: Scenario): ScenarioDraft {
  const t = s.trip
  return {
    name: s.name,
    notes: s.notes,
    place: {
      placeName: s.placeName,
      latitudeDeg: t.latitudeDeg,
      longitudeDeg: t.longitudeDeg,
      timeZone: t.timeZone,
    },
    startDate: t.startDate,
    days: t.days,
    sky: t.sky,
    clearnessIndexFraction: t.clearnessIndexFraction ?? null,
    nightLowC: t.nightLowC,
    dayHighC: t.dayHighC,
    startSocFraction: t.startSocFraction,
    dayPlan: JSON.parse(JSON.stringify(t.dayPlan)) as DayPlan,
    usage: JSON.parse(JSON.stringify(s.usage)) as ScenarioUsage,
  }
}

/** The API body. Not validated: `validateDraft` does that. */
export function draftToInput(d: ScenarioDraft): ScenarioCreate {
  const trip = {
    startDate: d.startDate,
    days: d.days,
    latitudeDeg: d.place.latitudeDeg as number,
    longitudeDeg: d.place.longitudeDeg as number,
    timeZone: d.place.timeZone,
    sky: d.sky,
    ...(d.sky === 'custom' && d.clearnessIndexFraction !== null
      ? { clearnessIndexFraction: d.clearnessIndexFraction }
      : {}),
    nightLowC: d.nightLowC as number,
    dayHighC: d.dayHighC as number,
    startSocFraction: d.startSocFraction,
    dayPlan: d.dayPlan,
  }
  return { name: d.name.trim(), notes: d.notes, placeName: d.place.placeName, trip, usage: d.usage }
}

/** Field messages by dotted path (`trip.nightLowC`), from the shared schema. Empty = valid. */
export function validateDraft(d: ScenarioDraft): Record<string, string> {
  const out: Record<string, string> = {}
  if (d.place.latitudeDeg === null || d.place.longitudeDeg === null) {
    out['trip.latitudeDeg'] = 'pick a place or type the coordinates'
  }
  // The schema checks across fields only once every field is valid on its own; say it at once here.
  if (d.nightLowC !== null && d.dayHighC !== null && d.dayHighC < d.nightLowC) {
    out['trip.dayHighC'] = 'must not be below the night low'
  }
  const r = ScenarioCreateSchema.safeParse(draftToInput(d))
  if (!r.success) {
    for (const issue of r.error.issues) {
      const path = issue.path.join('.')
      out[path] ??= issue.message
    }
  }
  return out
}

/** Weekday (Mon = 0) of an ISO date. */
export function weekdayMonday0(isoDate: string): number {
  const [y, m, d] = isoDate.split('-').map(Number) as [number, number, number]
  return (new Date(Date.UTC(y, m - 1, d)).getUTCDay() + 6) % 7
}

/** A repeating week spelled out for each trip day. */
export function weekToDays(week: DayPlanEntry[], startDate: string, days: number): DayPlanEntry[] {
  const first = weekdayMonday0(startDate)
  return Array.from({ length: days }, (_, i) => ({ ...(week[(first + i) % 7] ?? PARKED) }))
}

/** A per-day table folded back into a week: each weekday takes its first day in the trip. */
export function daysToWeek(list: DayPlanEntry[], startDate: string): DayPlanEntry[] {
  const first = weekdayMonday0(startDate)
  return Array.from({ length: 7 }, (_, wd) => {
    const i = (wd - first + 7) % 7
    return { ...(list[i] ?? list[list.length - 1] ?? PARKED) }
  })
}

/** Keeps a per-day table one entry per trip day: new days copy the last one. */
export function resizeDays(list: DayPlanEntry[], days: number): DayPlanEntry[] {
  if (list.length >= days) return list.slice(0, days)
  const last = list[list.length - 1] ?? PARKED
  return [...list, ...Array.from({ length: days - list.length }, () => ({ ...last }))]
}

export function dateOfDay(startDate: string, i: number): string {
  return addDays(startDate, i)
}
