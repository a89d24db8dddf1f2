import { describe, expect, it } from 'vitest'
import { changedOnly, conflictRows, rebase, stableJson } from '../../src/composables/conflictDiff'

// What a 409 shows and what "apply my edit again" sends. Plain data logic; no physics, no source needed.
const base = {
  version: 1,
  name: 'Summer month in the south',
  trip: {
    nightLowC: 18,
    dayHighC: 35,
    dayPlan: { kind: 'week', days: [{ drivingHours: 2, hookup: false }] },
  },
}
const theirs = {
  version: 2,
  updatedBy: { id: 'u2', displayName: 'Ada' },
  name: 'Summer month in Andalusia',
  trip: {
    dayHighC: 35,
    nightLowC: 18,
    dayPlan: { days: [{ hookup: false, drivingHours: 2 }], kind: 'week' },
  },
}
const mine = { name: 'Summer month in the south', trip: { ...base.trip, nightLowC: 16 } }

describe('conflictRows', () => {
  it('lists their change and my change, and ignores key order and record metadata', () => {
    const rows = conflictRows(base, mine, theirs)
    expect(rows.map((r) => r.path)).toEqual(['name', 'trip.nightLowC'])
    expect(rows[0]).toMatchObject({
      label: 'Name',
      was: 'Summer month in the south',
      theirs: 'Summer month in Andalusia',
      mine: null,
      clash: false,
    })
    expect(rows[1]).toMatchObject({ was: '18', theirs: '18', mine: '16', clash: false })
  })

  it('marks a field both sides changed to different values as a clash', () => {
    const rows = conflictRows(base, { ...mine, name: 'Andalusia in July' }, theirs)
    expect(rows.find((r) => r.path === 'name')?.clash).toBe(true)
  })

  it('names day-plan lines one by one', () => {
    const t2 = {
      ...theirs,
      trip: { ...theirs.trip, dayPlan: { kind: 'week', days: [{ drivingHours: 5, hookup: false }] } },
    }
    const rows = conflictRows(base, mine, t2)
    expect(rows.find((r) => r.path === 'trip.dayPlan.days.0.drivingHours')?.label).toBe(
      'Day plan line 1: driving (h)',
    )
  })
})

describe('rebase (apply my edit again on a whole record)', () => {
  it('keeps their name and puts my night low on top', () => {
    const out = rebase(base, mine, theirs)
    expect(out.name).toBe('Summer month in Andalusia')
    expect(out.trip.nightLowC).toBe(16)
    expect(out.trip.dayHighC).toBe(35)
  })

  it('removes a field I removed, keeps one they added', () => {
    const b = { a: 1, b: 2 }
    const m = { a: 1 } as Record<string, number>
    const c = { a: 1, b: 2, c: 3 }
    expect(rebase(b, m, c)).toEqual({ a: 1, c: 3 })
  })

  it('passes null (remove the whole thing) through unchanged', () => {
    expect(rebase({ ratedW: 1000 }, null, { ratedW: 1200 })).toBeNull()
  })
})

describe('changedOnly (apply my edit again on a patch)', () => {
  it('keeps only the fields I changed', () => {
    expect(
      changedOnly({ name: 'Van', kind: 'van', notes: '' }, { name: 'Van', kind: 'boat', notes: '' }),
    ).toEqual({
      kind: 'boat',
    })
  })
})

describe('stableJson', () => {
  it('does not depend on key order', () => {
    expect(stableJson({ a: 1, b: { c: 2, d: 3 } })).toBe(stableJson({ b: { d: 3, c: 2 }, a: 1 }))
  })
})
