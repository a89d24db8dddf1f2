import { describe, expect, it } from 'vitest'
import { detectShape, splitCsvLine } from './detect'
import { completeMapping, proposeMapping } from './mapping'
import { LogRowValidator, resolveColumns, ErrorList } from './validate'
import type { LogError, LogMapping, LogSample } from './types'

const HEADER =
  'Time,Pack voltage (V),Current (A),SOC (%),Temp (°C),Cell 1 (mV),Cell 2 (mV),Cell 3 (mV),Cell 4 (mV)'
const good = (min: number, extra: Partial<Record<'v' | 'i' | 'soc' | 't' | 'c1', string>> = {}) =>
  [
    `2026-01-12 08:${String(min).padStart(2, '0')}:00`,
    extra.v ?? '13.21',
    extra.i ?? '-3.1',
    extra.soc ?? '80',
    extra.t ?? '8.1',
    extra.c1 ?? '3302',
    '3303',
    '3301',
    '3305',
  ].join(',')

function mappingFor(text: string): LogMapping {
  const p = proposeMapping(detectShape(text, true)!)
  const m = completeMapping(p.mapping)
  if (!m.ok) throw new Error(JSON.stringify(m.fields))
  return m.mapping
}

/** Validate a whole text the way the server does (header, then each row). */
function run(text: string, mapping: LogMapping): { samples: LogSample[]; errors: LogError[] } {
  const lines = text.split('\n').filter((l) => l !== '')
  const rows = lines.map((l) => splitCsvLine(l, mapping.format.delimiter))
  const columns = mapping.format.hasHeader ? rows[0]! : rows[0]!.map((_, i) => `Column ${i + 1}`)
  const resolved = resolveColumns(mapping, columns, rows[0]!)
  if (!resolved.ok) return { samples: [], errors: resolved.errors }
  const v = new LogRowValidator(mapping, resolved.index, columns)
  const samples: LogSample[] = []
  const errors = new ErrorList()
  rows.slice(mapping.format.hasHeader ? 1 : 0).forEach((cells, i) => {
    const r = v.check(cells, i + (mapping.format.hasHeader ? 2 : 1))
    errors.add(r.errors)
    if (r.sample) samples.push(r.sample)
  })
  return { samples, errors: errors.items }
}

const base = [HEADER, good(0), good(1), good(2)].join('\n')
const mapping = mappingFor(base)

describe('LogRowValidator', () => {
  it('turns good rows into samples in SI units, current positive into the pack', () => {
    const { samples, errors } = run(base, mapping)
    expect(errors).toEqual([])
    expect(samples[0]).toEqual({
      tsMs: Date.UTC(2026, 0, 12, 8, 0),
      packVoltageV: 13.21,
      currentA: -3.1,
      socFraction: 0.8,
      temperaturesC: [8.1],
      cellVoltagesV: [3.302, 3.303, 3.301, 3.305],
    })
    const flipped = run(base, { ...mapping, currentSign: 'discharge-positive', utcOffsetMinutes: 60 })
    expect(flipped.samples[0]!.currentA).toBe(3.1)
    expect(flipped.samples[0]!.tsMs).toBe(Date.UTC(2026, 0, 12, 7, 0))
  })

  it('names a wrong delimiter', () => {
    const text = base.replaceAll(',', ';')
    const { errors } = run(text, mapping)
    expect(errors).toHaveLength(1)
    expect(errors[0]).toMatchObject({ row: 1, column: null, code: 'wrong_delimiter' })
    expect(errors[0]!.message).toMatch(/semicolon/)
  })

  it('names each missing column', () => {
    const text = base.replace('Current (A)', 'Amps')
    const { errors } = run(text, mapping)
    expect(errors).toEqual([
      expect.objectContaining({ row: 1, column: 'Current (A)', code: 'missing_column' }),
    ])
  })

  it('names text in a number field with row and column', () => {
    const { errors } = run([HEADER, good(0), good(1, { i: 'n/a' })].join('\n'), mapping)
    expect(errors).toEqual([
      {
        row: 3,
        column: 'Current (A)',
        code: 'not_a_number',
        message: expect.stringMatching(/“n\/a” is not a number/),
      },
    ])
  })

  it('names rows out of order, duplicated times and gaps', () => {
    const { errors } = run([HEADER, good(0), good(5), good(3), good(5), good(59)].join('\n'), {
      ...mapping,
      maxGapMinutes: 30,
    })
    expect(errors.map((e) => [e.row, e.code])).toEqual([
      [4, 'timestamp_out_of_order'],
      [5, 'timestamp_duplicate'],
      [6, 'gap'],
    ])
    expect(errors[2]!.message).toMatch(/54 min between row 3 and row 6/)
  })

  it('names impossible values, with a millivolt hint', () => {
    const { errors } = run(
      [
        HEADER,
        good(0, { v: '13210' }),
        good(1, { soc: '140' }),
        good(2, { c1: '9999' }),
        good(3, { t: '250' }),
        good(4, { i: '-5000' }),
      ].join('\n'),
      mapping,
    )
    expect(errors.map((e) => [e.row, e.column, e.code])).toEqual([
      [2, 'Pack voltage (V)', 'impossible_value'],
      [3, 'SOC (%)', 'impossible_value'],
      [4, 'Cell 1 (mV)', 'impossible_value'],
      [5, 'Temp (°C)', 'impossible_value'],
      [6, 'Current (A)', 'impossible_value'],
    ])
    expect(errors[0]!.message).toMatch(/millivolts/)
  })

  it('names bad times, empty required cells and short rows', () => {
    const { errors } = run(
      [
        HEADER,
        good(0),
        'yesterday,13.2,-1,80,8,3300,3300,3300,3300',
        good(2, { v: '' }),
        '2026-01-12 08:03:00,13.2',
      ].join('\n'),
      mapping,
    )
    expect(errors.map((e) => [e.row, e.code])).toEqual([
      [3, 'bad_timestamp'],
      [4, 'missing_value'],
      [5, 'column_count'],
    ])
  })

  it('adds up the cells when there is no pack voltage column', () => {
    const { samples } = run(base, { ...mapping, packVoltageColumn: null })
    expect(samples[0]!.packVoltageV).toBeCloseTo(13.211, 9)
  })
})

describe('ErrorList', () => {
  it('lists up to its limit and counts the rest', () => {
    const list = new ErrorList(2)
    list.add([1, 2, 3].map((row) => ({ row, column: null, code: 'gap' as const, message: '' })))
    expect(list.items).toHaveLength(2)
    expect(list.total).toBe(3)
  })
})
