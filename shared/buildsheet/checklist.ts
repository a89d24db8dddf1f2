/**
 * The installer's checklist: every protection rule, charger setting, device rating and cable, as items to
 * set up and tick off. Item ids are stable (derived from rule, fuse and run ids) so ticks survive recomputes.
 */
import type { ProtectionPlan, RuleAction } from './protection.ts'
import type { Ratings } from './ratings.ts'
import type { CableRun } from './runs.ts'
import { MARGIN_RULE_TEXT } from './fuses.ts'

export type ChecklistGroupId =
  'charge-path' | 'load-path' | 'inverter' | 'heater' | 'chargers' | 'devices' | 'cables' | 'final'

export interface ChecklistItem {
  id: string
  text: string
  /** The number(s) to set, in plain words. */
  value: string
  /** Where the numbers come from. */
  source: string
}

export interface ChecklistGroup {
  id: ChecklistGroupId
  title: string
  items: ChecklistItem[]
}

const GROUP_OF: Record<RuleAction, ChecklistGroupId> = {
  'charge-path-opens': 'charge-path',
  'load-path-opens': 'load-path',
  'inverter-off': 'inverter',
  'heater-on': 'heater',
  'heater-off': 'heater',
}

const TITLES: Record<ChecklistGroupId, string> = {
  'charge-path': 'Charge path opens when',
  'load-path': 'Load path opens when',
  inverter: 'Inverter turns off (remote input) when',
  heater: 'Heater pad',
  chargers: 'Charger settings',
  devices: 'Disconnects and fuses',
  cables: 'Cables',
  final: 'Before the first power-up',
}

const r1 = (x: number) => String(Math.round(x * 10) / 10)
const amps = (x: number | null) => (x === null ? 'no standard size fits' : `${r1(x)} A`)

export function buildChecklist(p: ProtectionPlan, r: Ratings, runs: readonly CableRun[]): ChecklistGroup[] {
  const groups = new Map<ChecklistGroupId, ChecklistItem[]>(
    (Object.keys(TITLES) as ChecklistGroupId[]).map((g) => [g, []]),
  )
  const push = (g: ChecklistGroupId, item: ChecklistItem) => groups.get(g)!.push(item)

  for (const rule of p.rules) {
    const sources = [...new Set(rule.keys.map((k) => p.thresholds[k].source))]
    push(GROUP_OF[rule.action], {
      id: `rule:${rule.id}`,
      text: `${rule.condition} — set on the ${rule.device}`,
      value: rule.release,
      source: sources.length > 0 ? sources.join('; ') : 'follows the load-path rules',
    })
  }
  for (const s of p.chargerSettings) {
    push('chargers', {
      id: `charger:${s.id}`,
      text: `${s.label} on every charger${r.sources.length ? ` (${r.sources.map((x) => x.name).join(', ')})` : ''}`,
      value: s.value,
      source:
        [...new Set(s.keys.map((k) => p.thresholds[k].source))].join('; ') || 'common practice, no source',
    })
  }
  push('devices', {
    id: 'device:charge-disconnect',
    text: 'Charge-path disconnect (one direction: blocks charging, lets loads draw)',
    value: `rated ≥ ${amps(r.chargeDisconnect.ratingA)} continuous (all chargers ${r1(r.totalChargeA)} A)`,
    source: MARGIN_RULE_TEXT,
  })
  push('devices', {
    id: 'device:load-disconnect',
    text: 'Load-path disconnect (one direction: blocks discharge, lets chargers charge)',
    value: `rated ≥ ${amps(r.loadDisconnect.ratingA)} continuous (largest load ${r1(r.maxLoadA)} A), and ${r1(r.loadDisconnect.surgeA)} A for the inverter's surge`,
    source: MARGIN_RULE_TEXT,
  })
  push('devices', {
    id: 'device:main-fuse',
    text: 'Main fuse on the pack positive, as close to the terminal as possible',
    value: `${amps(r.mainFuse.ratingA)} (from ${r1(r.mainFuse.continuousA)} A), breaking capacity above the pack's short-circuit current`,
    source: MARGIN_RULE_TEXT,
  })
  for (const f of r.branchFuses) {
    push('devices', {
      id: `device:${f.id}`,
      text: `Fuse: ${f.label}`,
      value: `${amps(f.ratingA)} (from ${r1(f.continuousA)} A)`,
      source: 'margin rule: 125 %, next standard size',
    })
  }
  for (const run of runs) {
    const m = run.sizing.metric
    const a = run.sizing.awg
    push('cables', {
      id: `cable:${run.id}`,
      text: `${run.label}, ${r1(run.oneWayLengthM)} m one way`,
      value: m
        ? `${m.areaMm2} mm²${a ? ` (or ${a.label} AWG)` : ''}, drop ${(m.dropFraction * 100).toFixed(1)} % of ${run.maxDropPercent} % allowed`
        : 'no standard size fits: shorten the run or use parallel conductors',
      source: 'IEC 60228 resistance at the conductor temperature; ABYC E-11 drop limits',
    })
  }
  const finals: [string, string][] = [
    ['final:polarity', 'Check polarity of every connection with a meter before closing the main fuse'],
    ['final:torque', "Tighten every lug and busbar bolt to its maker's torque; tug-test crimps"],
    ['final:bms-test', 'Test each rule: warm or cool a cell sensor and watch the path open and close'],
    ['final:installer', 'Have a licensed installer check the work against your local codes'],
  ]
  for (const [id, text] of finals)
    push('final', { id, text, value: '', source: 'common practice, no source' })

  return [...groups.entries()]
    .filter(([, items]) => items.length > 0)
    .map(([id, items]) => ({ id, title: TITLES[id], items }))
}
