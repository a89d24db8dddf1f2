/**
 * The command line: `npm run simulate -- <plan.json> [--summary]` on every example, and on bad plans.
 */
import { describe, it, expect } from 'vitest'
import { spawnSync } from 'node:child_process'
import { readdirSync, writeFileSync, mkdtempSync } from 'node:fs'
import { join } from 'node:path'
import { tmpdir } from 'node:os'

const ROOT = join(import.meta.dirname, '../..')
const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', join(ROOT, 'scripts/simulate.ts'), ...args], {
    cwd: ROOT,
    encoding: 'utf8',
  })

describe('npm run simulate', () => {
  const examples = readdirSync(join(ROOT, 'data/examples')).filter((f) => f.endsWith('.json'))

  it.each(examples)('prints a summary for data/examples/%s', (file) => {
    const r = run(join('data/examples', file), '--summary')
    expect(r.status, r.stderr).toBe(0)
    const out = JSON.parse(r.stdout)
    expect(out.verdict.status).toMatch(/^(carries|tight|short)$/)
    expect(out.series).toBeUndefined()
    expect(typeof out.summary.lowestSocFraction).toBe('number')
  })

  it('prints the full results, hourly series as number arrays', () => {
    const r = run('data/examples/winter-week-lofoten.json')
    expect(r.status, r.stderr).toBe(0)
    const out = JSON.parse(r.stdout)
    expect(out.series.socEndFraction).toHaveLength(7 * 24)
    expect(out.days).toHaveLength(7)
  })

  it('exits non-zero with the field errors for a bad plan', () => {
    const dir = mkdtempSync(join(tmpdir(), 'ohmward-plan-'))
    const file = join(dir, 'bad.json')
    writeFileSync(
      file,
      JSON.stringify({
        battery: { chemistry: 'lfp', cellsSeries: 4, cellsParallel: 1, capacityAh: -5 },
        appliances: [],
        sources: [],
        trip: {},
      }),
    )
    const r = run(file)
    expect(r.status).toBe(2)
    const err = JSON.parse(r.stderr)
    expect(err.error.fields['battery.capacityAh']).toEqual(['must be greater than 0'])
    expect(err.error.fields['trip.startDate']).toEqual(['is required'])
  })
})
