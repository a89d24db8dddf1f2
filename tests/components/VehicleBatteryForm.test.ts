// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { createPinia, setActivePinia } from 'pinia'
import type { BatteryBank } from '@shared/schemas/plan'
import VehicleBatteryForm from '../../src/components/vehicle/VehicleBatteryForm.vue'

function mountForm(bank: BatteryBank | null, readonly = false) {
  const pinia = createPinia()
  setActivePinia(pinia)
  return mount(VehicleBatteryForm, {
    props: {
      bank,
      readonly,
      fieldError: (p: string) => (p === 'capacityAh' ? 'must be greater than 0' : undefined),
    },
    global: { plugins: [[Quasar, {}], pinia] },
  })
}

describe('VehicleBatteryForm', () => {
  it('shows the caution, computes the bank from its cells, and saves the preset values explicitly', async () => {
    const w = mountForm(null)
    expect(w.find('.ow-caution').text()).toContain('licensed installer')
    // New bank: 4 LFP cells of 280 Ah in series → 12.8 V, 280 Ah, 3.58 kWh (3.2 V per cell, presets.ts).
    const summary = w.find('[data-test="battery-summary"]').text()
    expect(summary).toContain('4S1P')
    expect(summary).toContain('12.8 V')
    expect(summary).toContain('3.58 kWh')
    await w.find('form').trigger('submit')
    await flushPromises()
    const saved = w.emitted('save')?.[0]?.[0] as BatteryBank
    expect(saved).toMatchObject({
      chemistry: 'lfp',
      cellsSeries: 4,
      cellsParallel: 1,
      capacityAh: 280,
      socFloorFraction: 0.1,
    })
  })

  it("shows the server's message on the capacity field, and has no save button when read-only", () => {
    const bank: BatteryBank = { chemistry: 'agm', cellsSeries: 6, cellsParallel: 2, capacityAh: 200 }
    const w = mountForm(bank, true)
    expect(w.text()).toContain('must be greater than 0')
    expect(w.find('[data-test="battery-summary"]').text()).toContain('12 V')
    expect(w.find('[data-test="battery-save"]').exists()).toBe(false)
  })
})
