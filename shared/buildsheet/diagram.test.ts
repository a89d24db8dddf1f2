import { describe, expect, it } from 'vitest'
import { computeBuildSheet } from './sheet.ts'
import { testVan } from './testPlans.ts'

const sheetOf = (plan = testVan()) => computeBuildSheet({ plan })

describe('one-line diagram structure', () => {
  it('has one box per piece of equipment', () => {
    const d = sheetOf().diagram
    const ids = d.nodes.map((n) => n.id)
    expect(new Set(ids).size).toBe(ids.length)
    const count = (kind: string) => d.nodes.filter((n) => n.kind === kind).length
    expect(count('pack')).toBe(1)
    expect(count('bms')).toBe(1)
    expect(count('monitor')).toBe(1)
    expect(count('main-fuse')).toBe(1)
    expect(count('charge-disconnect')).toBe(1)
    expect(count('load-disconnect')).toBe(1)
    expect(count('source')).toBe(2) // roof solar + DC-DC
    expect(count('inverter')).toBe(1)
    expect(count('dc-panel')).toBe(1)
    expect(count('heater')).toBe(1)
    // one branch fuse per source, inverter, DC panel and heater
    expect(count('fuse')).toBe(2 + 1 + 1 + 1)
  })

  it('wires every edge between existing boxes, and control wires run from the BMS to both disconnects, the inverter and the heater', () => {
    const d = sheetOf().diagram
    const ids = new Set(d.nodes.map((n) => n.id))
    for (const e of d.edges) {
      expect(ids.has(e.from), e.id).toBe(true)
      expect(ids.has(e.to), e.id).toBe(true)
      expect(e.points.length).toBeGreaterThanOrEqual(2)
    }
    const control = d.edges.filter((e) => e.kind === 'control' && e.from === 'bms').map((e) => e.to)
    expect(control.sort()).toEqual(['charge-disconnect', 'heater', 'inverter', 'load-disconnect'])
  })

  it('updates when a source is added: a new source box, its fuse and its wires appear', () => {
    const plan = testVan()
    const before = sheetOf(plan).diagram
    plan.sources.push({ kind: 'shore', id: 'shore', name: 'Campsite charger', currentA: 25 })
    const after = sheetOf(plan).diagram
    expect(after.nodes.length).toBe(before.nodes.length + 2)
    expect(after.nodes.find((n) => n.id === 'source:shore')?.label).toBe('Campsite charger')
    expect(after.nodes.find((n) => n.id === 'fuse:source:shore')?.label).toBe('Fuse 35 A') // 25 × 1.25 = 31.25 → 35
    expect(after.edges.map((e) => e.id)).toEqual(
      expect.arrayContaining(['source:shore:to-fuse', 'fuse:source:shore:to-bus']),
    )
    // the charge-path disconnect now carries 85 A → 106.25 A → 125 A
    expect(after.nodes.find((n) => n.id === 'charge-disconnect')?.details[0]).toContain('125 A')
  })

  it('keeps every box inside the drawing and boxes in a row apart', () => {
    const plan = testVan()
    plan.sources.push({ kind: 'generator', id: 'gen', name: 'Generator', currentA: 20 })
    const d = sheetOf(plan).diagram
    for (const n of d.nodes) {
      expect(n.x, n.id).toBeGreaterThanOrEqual(0)
      expect(n.x + n.width, n.id).toBeLessThanOrEqual(d.width)
      expect(n.y + n.height, n.id).toBeLessThanOrEqual(d.height)
    }
    const row = d.nodes.filter(
      (n) => n.kind === 'source' || n.kind === 'inverter' || n.kind === 'dc-panel' || n.kind === 'heater',
    )
    const sorted = [...row].sort((a, b) => a.x - b.x)
    for (let i = 1; i < sorted.length; i++)
      expect(sorted[i]!.x).toBeGreaterThanOrEqual(sorted[i - 1]!.x + sorted[i - 1]!.width)
  })

  it('drops the heater and inverter boxes when the plan has neither', () => {
    const plan = testVan('agm')
    plan.inverter = null
    plan.appliances = plan.appliances.filter((a) => a.supply === 'dc')
    const d = sheetOf(plan).diagram
    expect(d.nodes.some((n) => n.kind === 'heater' || n.kind === 'inverter')).toBe(false)
    expect(d.nodes.find((n) => n.kind === 'bms')?.label).toBe('Battery protect relay')
  })
})
