import { describe, expect, it } from 'vitest'
import { formatMoney, lineTotal, sumMoney, summariseParts, type PartLine } from './money.ts'

const part = (over: Partial<PartLine>): PartLine => ({
  id: 'p',
  name: 'Part',
  quantity: '1',
  unitPrice: '0.10',
  currency: 'EUR',
  massKg: null,
  ...over,
})

describe('exact money with decimal.js', () => {
  it('ten lines of 0.10 and ten of 0.20 make exactly 3.00 (float addition gives 3.0000000000000004)', () => {
    const floatSum = [...Array(10).fill(0.1), ...Array(10).fill(0.2)].reduce((a, b) => a + b, 0)
    expect(floatSum).not.toBe(3) // the failure we guard against
    const amounts = [...Array(10).fill('0.10'), ...Array(10).fill('0.20')]
    expect(sumMoney(amounts)).toBe('3.00')
  })

  it('a thousand alternating lines of 0.10 and 0.20 total exactly 150.00', () => {
    const parts = Array.from({ length: 1000 }, (_, i) =>
      part({ id: String(i), unitPrice: i % 2 ? '0.20' : '0.10' }),
    )
    const floatSum = parts.reduce((a, p) => a + Number(p.unitPrice), 0)
    expect(floatSum).not.toBe(150)
    const s = summariseParts(parts, null)
    expect(s.totals).toEqual([{ currency: 'EUR', total: '150.00', perUsableKWh: null, lineCount: 1000 }])
  })

  it('multiplies quantity × price exactly and rounds each line to the cent, half up', () => {
    expect(lineTotal('3', '0.10')).toBe('0.30') // 3 × 0.1 = 0.30000000000000004 in floats
    expect(lineTotal('1.5', '2.33')).toBe('3.50') // 3.495 → 3.50 (half up)
    expect(lineTotal('0.333', '1.00')).toBe('0.33')
    expect(lineTotal('12', '1234567.89')).toBe('14814814.68')
  })

  it('keeps currencies apart and gives cost per usable kWh', () => {
    const s = summariseParts(
      [
        part({ id: 'a', unitPrice: '899.00', currency: 'EUR' }),
        part({ id: 'b', quantity: '2', unitPrice: '45.50', currency: 'EUR' }),
        part({ id: 'c', unitPrice: '120.00', currency: 'NOK' }),
      ],
      3.3024,
    )
    const eur = s.totals.find((t) => t.currency === 'EUR')!
    expect(eur.total).toBe('990.00')
    expect(eur.perUsableKWh).toBe('299.78') // 990 / 3.3024 = 299.7820…
    expect(s.totals.map((t) => t.currency)).toEqual(['EUR', 'NOK'])
  })

  it('adds mass as quantity × unit mass without float noise, and counts lines with no mass', () => {
    const s = summariseParts(
      [
        part({ id: 'a', quantity: '3', massKg: 0.1 }),
        part({ id: 'b', quantity: '1', massKg: 0.2 }),
        part({ id: 'c', quantity: '2', massKg: null }),
      ],
      null,
    )
    expect(s.massTotalKg).toBe(0.5)
    expect(s.lines[0]!.lineMassKg).toBe(0.3)
    expect(s.linesWithoutMass).toBe(1)
  })

  it('formats without turning the amount into a float', () => {
    expect(formatMoney('1234567.5', 'EUR')).toBe('1,234,567.50 EUR')
    expect(formatMoney('9007199254740993.01', 'EUR')).toBe('9,007,199,254,740,993.01 EUR')
  })
})
