import { describe, expect, it } from 'vitest'
import { detectDelimiter, detectShape, parseNumber, splitCsvLine } from './detect'
import { detectTimestampFormat, parseTimestampMs, localDate } from './timestamp'

describe('splitCsvLine', () => {
  it('keeps quoted delimiters and doubled quotes', () => {
    expect(splitCsvLine('a,"b,c","d ""e"""', ',')).toEqual(['a', 'b,c', 'd "e"'])
  })
})

describe('detectDelimiter / detectShape', () => {
  it('finds a semicolon file with decimal commas and a header', () => {
    const text =
      'Zeit;Spannung;Strom;SOC\n2026-01-12 08:00:00;13,21;-2,5;88\n2026-01-12 08:01:00;13,20;-2,6;88\n'
    const shape = detectShape(text, true)!
    expect(shape.format).toEqual({ delimiter: ';', hasHeader: true, decimalSeparator: ',' })
    expect(shape.columns).toEqual(['Zeit', 'Spannung', 'Strom', 'SOC'])
    expect(shape.rows).toHaveLength(2)
  })
  it('finds tabs and a file without a header', () => {
    const text = '1736668800\t13.2\t-1.0\n1736668860\t13.2\t-1.1\n'
    const shape = detectShape(text, true)!
    expect(shape.format).toEqual({ delimiter: '\t', hasHeader: false, decimalSeparator: '.' })
    expect(shape.columns).toEqual(['Column 1', 'Column 2', 'Column 3'])
  })
  it('drops a cut last line of a partial sample', () => {
    const shape = detectShape('t,v\n2026-01-01 00:00,13.1\n2026-01-01 00:01,13', false)!
    expect(shape.rows).toEqual([['2026-01-01 00:00', '13.1']])
  })
  it('gives null when nothing splits', () => {
    expect(detectDelimiter(['hello', 'world'])).toBeNull()
  })
})

describe('parseNumber', () => {
  it('reads dots, decimal commas when chosen, and refuses text', () => {
    expect(parseNumber('-12.5', '.')).toBe(-12.5)
    expect(parseNumber('3,25', ',')).toBe(3.25)
    expect(parseNumber('3,25', '.')).toBeNaN()
    expect(parseNumber('n/a', '.')).toBeNaN()
    expect(parseNumber('  ', '.')).toBeNull()
  })
})

describe('timestamps', () => {
  it('parses year-month-day with and without a zone', () => {
    expect(parseTimestampMs('2026-01-12T08:30:00Z', 'ymd', 60)).toBe(Date.UTC(2026, 0, 12, 8, 30))
    expect(parseTimestampMs('2026-01-12 08:30:00', 'ymd', 60)).toBe(Date.UTC(2026, 0, 12, 7, 30))
    expect(parseTimestampMs('2026/01/12 08:30:00.500+02:00', 'ymd', 0)).toBe(
      Date.UTC(2026, 0, 12, 6, 30, 0, 500),
    )
    expect(parseTimestampMs('2026-02-31 08:30', 'ymd', 0)).toBeNull()
  })
  it('parses day-first, month-first (with AM/PM) and Unix time', () => {
    expect(parseTimestampMs('13/01/2026 08:30', 'dmy', 0)).toBe(Date.UTC(2026, 0, 13, 8, 30))
    expect(parseTimestampMs('01/13/2026 08:30:15 PM', 'mdy', 0)).toBe(Date.UTC(2026, 0, 13, 20, 30, 15))
    expect(parseTimestampMs('1768206600', 'epoch-s', 0)).toBe(1768206600000)
    expect(parseTimestampMs('1768206600000', 'epoch-ms', 0)).toBe(1768206600000)
    expect(parseTimestampMs('yesterday', 'dmy', 0)).toBeNull()
  })
  it('detects formats, day order by a part above 12, and by time running forward', () => {
    expect(detectTimestampFormat(['2026-01-12 08:00', '2026-01-12 08:01'])?.format).toBe('ymd')
    expect(detectTimestampFormat(['1768206600', '1768206660'])?.format).toBe('epoch-s')
    expect(detectTimestampFormat(['1768206600000'])?.format).toBe('epoch-ms')
    expect(detectTimestampFormat(['13/01/2026 08:00'])).toMatchObject({ format: 'dmy', ambiguous: false })
    expect(detectTimestampFormat(['01/13/2026 08:00'])).toMatchObject({ format: 'mdy', ambiguous: false })
    // Day-first: 12 Jan → 1 Feb runs forward; month-first: 1 Dec → 2 Jan runs backwards.
    expect(detectTimestampFormat(['12/01/2026 08:00', '01/02/2026 08:00'])?.format).toBe('dmy')
    expect(detectTimestampFormat(['2026-01-12T08:00:00+01:00'])?.explicitOffsetMinutes).toBe(60)
    expect(detectTimestampFormat(['hello'])).toBeNull()
  })
  it('cuts days on the monitor clock', () => {
    expect(localDate(Date.UTC(2026, 0, 12, 23, 30), 60)).toBe('2026-01-13')
    expect(localDate(Date.UTC(2026, 0, 12, 0, 30), -60)).toBe('2026-01-11')
  })
})
