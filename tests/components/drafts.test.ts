import { describe, expect, it } from 'vitest'
import {
  bankFromDraft,
  computedDefaults,
  draftFromBank,
  newBatteryDraft,
  presetFill,
} from '../../src/components/vehicle/batteryDraft'
import {
  daysToWeek,
  draftToInput,
  newScenarioDraft,
  resizeDays,
  validateDraft,
  weekToDays,
  weekdayMonday0,
} from '../../src/components/scenario/scenarioDraft'
import { applianceWhPerDay, inventoryTotals } from '../../src/components/vehicle/applianceMath'

describe('battery form working copy', () => {
  it('fills the LFP preset and computes the bank from its cells', () => {
    const d = { ...newBatteryDraft('lfp'), cellsParallel: 2 }
    expect(d.socFloorFraction).toBe(presetFill('lfp').socFloorFraction)
    const bank = bankFromDraft(d)
    expect(bank).toMatchObject({
      chemistry: 'lfp',
      cellsSeries: 4,
      cellsParallel: 2,
      cellCapacityAh: 280,
      capacityAh: 560,
    })
    // 4 × 3.2 V nominal (shared/engine/presets.ts LFP cellNominalV) × 560 Ah = 7168 Wh.
    expect(computedDefaults(d)?.energyWh).toBeCloseTo(7168, 6)
  })

  it('keeps an edited preset value, and leaves capacity-dependent defaults empty', () => {
    const d = { ...newBatteryDraft('lfp'), socFloorFraction: 0.2 }
    const bank = bankFromDraft(d)
    expect(bank.socFloorFraction).toBe(0.2)
    expect(bank.maxChargeCurrentA).toBeUndefined()
    expect(bank.heater?.powerW).toBeGreaterThan(0)
  })

  it('round-trips a stored bank, and a switched-off heater stays off', () => {
    const bank = bankFromDraft({ ...newBatteryDraft('agm'), heaterOn: false })
    expect(bank.heater).toBeNull()
    expect(bankFromDraft(draftFromBank(bank))).toEqual(bank)
  })
})

describe('appliance totals', () => {
  it('adds DC loads and AC loads through the inverter, in Wh and Ah a day', () => {
    // Energy balance E = q·(P·duty·h + P_standby·(24 − h)); the same formula as shared/engine/loads/profile.ts.
    const fridge = {
      powerW: 60,
      quantity: 1,
      hoursPerDay: 24,
      supply: 'dc' as const,
      dutyCycleFraction: 0.45,
    }
    const laptop = { powerW: 65, quantity: 1, hoursPerDay: 4, supply: 'ac' as const }
    const tv = { powerW: 30, quantity: 1, hoursPerDay: 2, supply: 'dc' as const, standbyW: 0.5 }
    expect(applianceWhPerDay(fridge)).toBeCloseTo(648, 9)
    expect(applianceWhPerDay(tv)).toBeCloseTo(60 + 11, 9)
    const t = inventoryTotals([fridge, laptop, tv], 12.8, 0.9)
    expect(t.dcWh).toBeCloseTo(719, 9)
    expect(t.acWh).toBeCloseTo(260, 9)
    expect(t.packWh).toBeCloseTo(719 + 260 / 0.9, 9)
    expect(t.packAh).toBeCloseTo((719 + 260 / 0.9) / 12.8, 9)
  })
})

describe('scenario working copy', () => {
  it('spells a week out per day from the start weekday, and folds it back', () => {
    expect(weekdayMonday0('2027-01-11')).toBe(0) // a Monday
    const week = [0, 1, 2, 3, 4, 5, 6].map((i) => ({ drivingHours: i, hookup: i === 6 }))
    const days = weekToDays(week, '2027-01-13', 9) // starts on a Wednesday
    expect(days.map((d) => d.drivingHours)).toEqual([2, 3, 4, 5, 6, 0, 1, 2, 3])
    expect(daysToWeek(days, '2027-01-13')).toEqual(week)
    expect(
      resizeDays(days, 11)
        .slice(9)
        .map((d) => d.drivingHours),
    ).toEqual([3, 3])
    expect(resizeDays(days, 3)).toHaveLength(3)
  })

  it('names the fields the shared schema refuses, with its messages', () => {
    const d = newScenarioDraft(new Date(Date.UTC(2026, 11, 2)))
    expect(d.startDate).toBe('2027-01-01')
    const errors = validateDraft({ ...d, dayHighC: -20, nightLowC: -5 })
    expect(errors['name']).toBe('must not be empty')
    expect(errors['trip.latitudeDeg']).toMatch(/pick a place/)
    expect(errors['trip.dayHighC']).toBe('must not be below the night low')
  })

  it('is valid once named and placed, and sends SI fields', () => {
    const d = {
      ...newScenarioDraft(new Date(Date.UTC(2026, 11, 2))),
      name: 'Winter week up north',
      place: { placeName: 'Tromsø, NO', latitudeDeg: 69.65, longitudeDeg: 18.96, timeZone: 'Europe/Oslo' },
    }
    expect(validateDraft(d)).toEqual({})
    expect(draftToInput(d).trip).toMatchObject({ latitudeDeg: 69.65, nightLowC: 5, startSocFraction: 1 })
  })
})
