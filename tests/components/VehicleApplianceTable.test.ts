// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest'
import { mount } from '@vue/test-utils'
import { Quasar } from 'quasar'
import { createPinia, setActivePinia } from 'pinia'
import type { ApplianceRecord } from '@shared/schemas/vehicles'
import VehicleApplianceTable from '../../src/components/vehicle/VehicleApplianceTable.vue'

const meta = {
  vehicleId: '00000000-0000-4000-8000-000000000001',
  version: 1,
  updatedAt: '2026-12-02T01:00:00.000Z',
  updatedBy: null,
}
const rows: ApplianceRecord[] = [
  {
    ...meta,
    id: '00000000-0000-4000-8000-00000000000a',
    name: 'Fridge',
    category: 'fridge',
    supply: 'dc',
    powerW: 60,
    quantity: 1,
    dutyCycleFraction: 0.45,
    hoursPerDay: 24,
    startHour: 0,
    endHour: 0,
  },
  {
    ...meta,
    id: '00000000-0000-4000-8000-00000000000b',
    name: 'Laptop',
    category: 'electronics',
    supply: 'ac',
    powerW: 65,
    quantity: 1,
    hoursPerDay: 4,
    startHour: 9,
    endHour: 18,
  },
]

function mountTable(readonly = false) {
  const pinia = createPinia()
  setActivePinia(pinia)
  return mount(VehicleApplianceTable, {
    props: { rows, voltageV: 12.8, inverterEfficiencyFraction: 0.9, readonly },
    global: { plugins: [[Quasar, {}], pinia] },
  })
}

describe('VehicleApplianceTable', () => {
  it('shows each row with its Wh a day, and the totals at the bank in Wh and Ah', () => {
    const w = mountTable()
    expect(w.text()).toContain('Fridge')
    expect(w.find('[data-test="appliance-row-Fridge"]').text()).toContain('648')
    // 648 Wh DC + 260 Wh AC ÷ 0.9 = 936.9 Wh → 937 Wh; ÷ 12.8 V = 73.2 Ah.
    const totals = w.find('[data-test="appliance-totals"]').text()
    expect(totals).toContain('937 Wh')
    expect(totals).toContain('73.2 Ah')
    expect(totals).toContain('12.8 V')
  })

  it('emits a patch when DC/AC is switched, and offers no editing when read-only', async () => {
    const w = mountTable()
    const fridgeRow = w.find('[data-test="appliance-row-Fridge"]')
    const acButton = fridgeRow.findAll('button').find((b) => b.text() === 'AC')!
    await acButton.trigger('click')
    const patch = w.emitted('patch')
    expect(patch?.[0]?.[1]).toEqual({ supply: 'ac' })
    const ro = mountTable(true)
    expect(ro.findAll('button[aria-label^="Remove"]')).toHaveLength(0)
  })
})
