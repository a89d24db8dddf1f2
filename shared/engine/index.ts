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
export { simulate, analysePlan, verdictFor, TIGHT_MARGIN_FRACTION } from './simulate.ts'
export type {
  SimulationResult,
  Analysis,
  TripSummary,
  Verdict,
  VerdictStatus,
  SimulateOptions,
} from './simulate.ts'
export { resultsToJson, tripMoment } from './results.ts'
export type { Jsonified } from './results.ts'
export { prepareTrip, LOAD_CATEGORIES, SOURCE_KINDS } from './prepare.ts'
export type { PreparedTrip, LoadCategory, SourceKind } from './prepare.ts'
export { runPack } from './battery/run.ts'
export type { HourlySeries, DayRow, RunTotals, RunOptions } from './battery/run.ts'
export { autonomy, packNeeded, solarNeeded, SOLAR_FULL_TOLERANCE_FRACTION } from './sizing/search.ts'
export type { AutonomyResult, PackNeededResult, SolarNeededResult } from './sizing/search.ts'
export {
  classicBatterySizing,
  temperatureCorrectionIeee485,
  CLASSIC_METHOD_SOURCE,
} from './sizing/classic.ts'
export type { ClassicSizingResult } from './sizing/classic.ts'
export { compareChemistries, capacityForUsableEnergyAh } from './sizing/chemistry.ts'
export type { ChemistryOption } from './sizing/chemistry.ts'
