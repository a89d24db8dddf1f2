/**
 * Parts-list arithmetic with exact decimals (decimal.js 10.6.0). Money goes in and out as strings
 * ("12.30"); a JS number never holds a price. Line totals are rounded to the cent, half up
 * (the usual shop rule, common practice, no source), and totals are sums of the rounded lines, so a printed
 * sheet adds up line by line.
 */
import { Decimal } from 'decimal.js'

/** A price: up to 10 digits before the point and at most 2 after (fits numeric(12,2)). */
export const MONEY_PATTERN = /^\d{1,10}(\.\d{1,2})?$/
/** A quantity: up to 3 decimals (metres of cable, litres). */
export const QUANTITY_PATTERN = /^\d{1,7}(\.\d{1,3})?$/

export interface PartLine {
  id: string
  name: string
  /** Decimal string, e.g. "2" or "1.5". */
  quantity: string
  /** Decimal string with at most 2 decimals, e.g. "12.30". */
  unitPrice: string
  /** ISO 4217 code, e.g. "EUR". */
  currency: string
  /** Mass of one unit; null when unknown. [kg] */
  massKg: number | null
}

/** quantity × unit price, rounded to the cent (half up). */
export function lineTotal(quantity: string, unitPrice: string): string {
  return new Decimal(quantity)
    .times(new Decimal(unitPrice))
    .toDecimalPlaces(2, Decimal.ROUND_HALF_UP)
    .toFixed(2)
}

/** Exact sum of money strings. */
export function sumMoney(amounts: readonly string[]): string {
  return amounts.reduce((acc, a) => acc.plus(new Decimal(a)), new Decimal(0)).toFixed(2)
}

export interface CurrencyTotal {
  currency: string
  total: string
  /** total ÷ usable energy, rounded to the cent; null when the usable energy is unknown or zero. */
  perUsableKWh: string | null
  lineCount: number
}

export interface PartsSummary {
  lines: (PartLine & { lineTotal: string; lineMassKg: number | null })[]
  /** One total per currency: different currencies are never added together. */
  totals: CurrencyTotal[]
  /** Sum of quantity × unit mass over lines with a mass. [kg] */
  massTotalKg: number
  /** Lines without a mass (the total leaves them out). */
  linesWithoutMass: number
}

/**
 * Totals of a parts list.
 *
 * @param parts - the lines
 * @param usableKWh - the pack's usable energy, for cost per usable kWh [kWh]
 */
export function summariseParts(parts: readonly PartLine[], usableKWh: number | null): PartsSummary {
  const byCurrency = new Map<string, { total: Decimal; n: number }>()
  let mass = new Decimal(0)
  let linesWithoutMass = 0
  const lines = parts.map((p) => {
    const lt = lineTotal(p.quantity, p.unitPrice)
    const cur = byCurrency.get(p.currency) ?? { total: new Decimal(0), n: 0 }
    cur.total = cur.total.plus(lt)
    cur.n += 1
    byCurrency.set(p.currency, cur)
    let lineMassKg: number | null = null
    if (p.massKg === null) linesWithoutMass += 1
    else {
      const m = new Decimal(p.quantity).times(new Decimal(String(p.massKg)))
      mass = mass.plus(m)
      lineMassKg = m.toDecimalPlaces(3).toNumber()
    }
    return { ...p, lineTotal: lt, lineMassKg }
  })
  const totals = [...byCurrency.entries()]
    .sort(([a], [b]) => a.localeCompare(b))
    .map(([currency, { total, n }]) => ({
      currency,
      total: total.toFixed(2),
      perUsableKWh:
        usableKWh !== null && usableKWh > 0
          ? total
              .dividedBy(new Decimal(String(usableKWh)))
              .toDecimalPlaces(2, Decimal.ROUND_HALF_UP)
              .toFixed(2)
          : null,
      lineCount: n,
    }))
  return { lines, totals, massTotalKg: mass.toDecimalPlaces(3).toNumber(), linesWithoutMass }
}

/** "1234.5" → "1,234.50 EUR"-style text for a locale; formatting only (the value stays a string). */
export function formatMoney(amount: string, currency: string, locale = 'en-GB'): string {
  const [intPart, frac = '00'] = new Decimal(amount).toFixed(2).split('.')
  const grouped = new Intl.NumberFormat(locale, { maximumFractionDigits: 0 }).format(BigInt(intPart!))
  const sep = new Intl.NumberFormat(locale).format(1.5).charAt(1)
  return `${grouped}${sep}${frac} ${currency}`
}
