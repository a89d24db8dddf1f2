/**
 * The whole build sheet from a plan, the vehicle's settings and its parts list. Pure: the server stores and
 * serves it, the browser recomputes it on every edit.
 */
import type { Plan } from '../schemas/plan.ts'
import { fillPlanDefaults, type ResolvedPlan } from '../engine/presets.ts'
import { compareChemistries, type ChemistryOption } from '../engine/sizing/chemistry.ts'
import { protectionRules, type ProtectionOverrides, type ProtectionPlan } from './protection.ts'
import { computeRatings, type Ratings } from './ratings.ts'
import { defaultCableRuns, sizeCableRuns, type CableRun, type CableRunOverrides } from './runs.ts'
import { summariseParts, type PartLine, type PartsSummary } from './money.ts'
import { buildDiagram, type Diagram } from './diagram.ts'
import { buildChecklist, type ChecklistGroup } from './checklist.ts'
import { buildCautions, type Caution } from './cautions.ts'
import { MARGIN_RULE_TEXT } from './fuses.ts'

export interface BuildSheetInput {
  plan: Plan
  protection?: ProtectionOverrides
  cableRuns?: CableRunOverrides
  parts?: readonly PartLine[]
}

export interface BuildSheet {
  resolved: ResolvedPlan
  protection: ProtectionPlan
  ratings: Ratings
  cableRuns: CableRun[]
  parts: PartsSummary
  /** (ceiling − floor) × capacity × nominal voltage. [kWh] */
  usableKWh: number
  chemistry: ChemistryOption[]
  diagram: Diagram
  checklist: ChecklistGroup[]
  cautions: Caution[]
  marginRule: string
}

/**
 * The battery as the sheet uses it: the plan's bank with the user's heater and charge-current settings,
 * so ratings, diagram and rules all show the same numbers.
 */
function withSettings(plan: ResolvedPlan, p: ProtectionPlan): ResolvedPlan {
  const t = p.thresholds
  const heater = plan.battery.heater
    ? { ...plan.battery.heater, onBelowC: t.heaterOnBelowC.value, offAboveC: t.heaterOffAboveC.value }
    : null
  return { ...plan, battery: { ...plan.battery, heater, maxChargeCurrentA: t.maxChargeCurrentA.value } }
}

export function computeBuildSheet(input: BuildSheetInput): BuildSheet {
  const base = fillPlanDefaults(input.plan)
  const protection = protectionRules(base.battery, input.protection ?? {})
  const resolved = withSettings(base, protection)
  const b = resolved.battery
  const ratings = computeRatings(resolved, protection.thresholds)
  const cableRuns = sizeCableRuns(defaultCableRuns(ratings), input.cableRuns ?? {}, b.nominalVoltageV)
  const usableKWh = (b.capacityAh * b.nominalVoltageV * (b.socCeilingFraction - b.socFloorFraction)) / 1000
  return {
    resolved,
    protection,
    ratings,
    cableRuns,
    parts: summariseParts(input.parts ?? [], usableKWh),
    usableKWh,
    chemistry: compareChemistries(b),
    diagram: buildDiagram(resolved, ratings),
    checklist: buildChecklist(protection, ratings, cableRuns),
    cautions: buildCautions(b.chemistry, b.heater !== null),
    marginRule: MARGIN_RULE_TEXT,
  }
}
