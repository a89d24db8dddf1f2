// @vitest-environment happy-dom
/**
 * Saving the battery form keeps what the form does not show. The stored bank of the winter example has an
 * insulated box (enclosure) that the form has no field for; before this, changing only the capacity in the
 * form (as the first-time buyer does when following Pack needed) saved the bank without its box, so the
 * thermal model silently fell back to the default and the heater energy changed.
 */
import { describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { createPinia, setActivePinia } from 'pinia'
import type { BatteryBank, Plan } from '@shared/schemas/plan'
import { bankFromDraft, draftFromBank } from '../../src/components/vehicle/batteryDraft'
import VehicleBatteryForm from '../../src/components/vehicle/VehicleBatteryForm.vue'
import winterRaw from '../../data/examples/winter-week-lofoten.json?raw'

const winter = JSON.parse(winterRaw) as Plan

const stored: BatteryBank = {
  ...winter.battery,
  pricePerKWh: 420,
  cycleLifeCycles: 4000,
  cycleLifeDodFraction: 0.8,
  nominalVoltageV: 12.8,
  chargeVoltageV: 14.2,
  specificHeatJPerKgK: 1100,
}

describe('battery form: fields it does not show', () => {
  it('keeps the box, price, cycle life and voltages when only the capacity changes', () => {
    expect(stored.enclosure).toEqual({ areaM2: 0.5, thicknessM: 0.025, conductivityWPerMK: 0.025 })
    const draft = draftFromBank(stored)
    draft.cellCapacityAh = 268
    const saved = bankFromDraft(draft, stored)
    expect(saved.capacityAh).toBe(268)
    expect(saved.enclosure).toEqual(stored.enclosure)
    expect(saved).toMatchObject({
      pricePerKWh: 420,
      cycleLifeCycles: 4000,
      cycleLifeDodFraction: 0.8,
      nominalVoltageV: 12.8,
      chargeVoltageV: 14.2,
      specificHeatJPerKgK: 1100,
      massKg: 22,
      heater: { powerW: 40, onBelowC: 3, offAboveC: 6 },
    })
    // A copy, not the stored object itself.
    expect(saved.enclosure).not.toBe(stored.enclosure)
  })

  it('drops chemistry-specific figures when the chemistry changes, and the voltage when the cells do', () => {
    const toAgm = { ...draftFromBank(stored), chemistry: 'agm' as const, cellsSeries: 6 }
    const agm = bankFromDraft(toAgm, stored)
    expect(agm.enclosure).toEqual(stored.enclosure) // the box is the same box
    for (const k of [
      'pricePerKWh',
      'cycleLifeCycles',
      'cycleLifeDodFraction',
      'chargeVoltageV',
      'specificHeatJPerKgK',
      'nominalVoltageV',
    ] as const)
      expect(agm[k], k).toBeUndefined()

    const to24V = { ...draftFromBank(stored), cellsSeries: 8 }
    const lfp24 = bankFromDraft(to24V, stored)
    expect(lfp24.nominalVoltageV).toBeUndefined()
    expect(lfp24.pricePerKWh).toBe(420)
  })

  it('a new bank (nothing stored) has only what the form holds', () => {
    const draft = draftFromBank({ chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, cellCapacityAh: 100 })
    const saved = bankFromDraft(draft)
    expect(saved.enclosure).toBeUndefined()
    expect(saved.capacityAh).toBe(100)
  })
})

describe('battery form component', () => {
  it('saves a stored bank with its box after only the capacity was changed', async () => {
    const pinia = createPinia()
    setActivePinia(pinia)
    const w = mount(VehicleBatteryForm, {
      props: { bank: stored },
      global: { plugins: [[Quasar, {}], pinia] },
    })
    await w.find('[data-test="battery-cell-ah"] input, input[data-test="battery-cell-ah"]').setValue('268')
    await w.find('form').trigger('submit')
    await flushPromises()
    const saved = w.emitted('save')?.[0]?.[0] as BatteryBank
    expect(saved.capacityAh).toBe(268)
    expect(saved.enclosure).toEqual(stored.enclosure)
    expect(saved.pricePerKWh).toBe(420)
  })
})
