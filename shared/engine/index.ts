/**
 * The Ohmward engine: pure TypeScript, no DOM and no Node APIs.
 * Everything the CLI, the server and the browser need is exported from here.
 */
export {
  PlanSchema,
  parsePlan,
  applyScenarioUsage,
  windowLengthH,
  PLAN_FORMAT_VERSION,
  PLAN_LIMITS,
  CHEMISTRIES,
  APPLIANCE_CATEGORIES,
  SKY_KINDS,
  BatteryBankSchema,
  ApplianceSchema,
  ApplianceUsageSchema,
  ChargeSourceSchema,
  InverterSchema,
  TripSchema,
  DayPlanSchema,
  DayPlanEntrySchema,
} from '../schemas/plan.ts'
export type {
  Plan,
  PlanInput,
  PlanFieldErrors,
  ParsePlanResult,
  BatteryBank,
  Appliance,
  ApplianceUsage,
  ApplianceCategory,
  ChargeSource,
  SolarArray,
  DcDcCharger,
  ShoreCharger,
  GeneratorCharger,
  Inverter,
  Trip,
  DayPlan,
  DayPlanEntry,
  Chemistry,
} from '../schemas/plan.ts'
export { CHEMISTRY_PRESETS, PLAN_DEFAULTS, fillPlanDefaults, resolveBattery } from './presets.ts'
export type { ChemistryPreset, ResolvedPlan, ResolvedBattery } from './presets.ts'
