/**
 * Assemble the engine's Plan (shared/schemas/plan.ts) for a scenario: the vehicle's battery bank,
 * appliance inventory (with this scenario's usage), charge sources and inverter, plus the scenario's trip.
 * Used by GET /api/scenarios/:scenarioId/plan, and by reports and stored results.
 */
import { eq, sql, type SQL } from 'drizzle-orm'
import {
  applyScenarioUsage,
  parsePlan,
  PLAN_FORMAT_VERSION,
  type ApplianceUsage,
  type Plan,
} from '../../../shared/schemas/plan'
import type { VehicleRole } from '../../../shared/schemas/vehicles'
import { OPEN_REVIEW_STATES } from '../../../shared/schemas/reviews'
import type { Db } from '../../db/client'
import { preparedFor } from '../../db/prepared'
import { scenarios } from '../../db/schema/index'
import { HttpError, notFound } from '../../errors'
import { isId } from '../vehicles/access'
import type { DbOrTx } from '../vehicles/records'

/** 422: the scenario's vehicle is not complete enough to simulate; `fields` says what is missing or wrong. */
export const planIncomplete = (fields: Record<string, string[]>) =>
  new HttpError(
    422,
    'plan_incomplete',
    fields.battery?.some((m) => m.startsWith('is required'))
      ? 'This vehicle has no battery bank yet. Add one to run this scenario.'
      : 'This scenario cannot be run yet: some equipment or trip values need attention.',
    fields,
  )

/**
 * Everything a scenario's plan is made of — the scenario, its vehicle's name, battery bank, inverter,
 * appliances and charge sources in their list order, and this scenario's usage — as one JSON text from one
 * query. The results memo is keyed by the revision of these rows (revisionSql below), not by this text.
 * Column names are written out with their table: inside the subqueries a bare `vehicle_id` would be theirs.
 */
const snapshot = sql<string>`json_build_object(
  'scenarioName', scenarios.name,
  'trip', scenarios.trip,
  'vehicleName', (SELECT v.name FROM vehicles v WHERE v.id = scenarios.vehicle_id),
  'battery', (SELECT b.params FROM battery_banks b WHERE b.vehicle_id = scenarios.vehicle_id),
  'inverter', (SELECT i.params FROM inverters i WHERE i.vehicle_id = scenarios.vehicle_id),
  'appliances', COALESCE((SELECT json_agg(json_build_object('id', a.id, 'params', a.params) ORDER BY a.seq)
    FROM appliances a WHERE a.vehicle_id = scenarios.vehicle_id), '[]'::json),
  'sources', COALESCE((SELECT json_agg(json_build_object('id', c.id, 'params', c.params) ORDER BY c.seq)
    FROM charge_sources c WHERE c.vehicle_id = scenarios.vehicle_id), '[]'::json),
  'usage', COALESCE((SELECT json_object_agg(u.appliance_id, u.usage)
    FROM scenario_appliance_usage u WHERE u.scenario_id = scenarios.id), '{}'::json)
)::text`

interface Snapshot {
  scenarioName: string
  trip: unknown
  vehicleName: string | null
  battery: unknown
  inverter: unknown
  appliances: { id: string; params: Record<string, unknown> }[]
  sources: { id: string; params: Record<string, unknown> }[]
  usage: Record<string, ApplianceUsage>
}

/** The plan from a snapshot's text; 422 `plan_incomplete` when it is not a valid plan. */
export function planFromSnapshot(text: string): Plan {
  const s = JSON.parse(text) as Snapshot
  if (s.battery === null)
    throw planIncomplete({ battery: ['is required: add a battery bank to the vehicle'] })
  const inventory = s.appliances.map((r) => ({ id: r.id, ...r.params })) as unknown as Plan['appliances']
  const candidate = {
    formatVersion: PLAN_FORMAT_VERSION,
    name: `${s.vehicleName ?? 'Vehicle'} · ${s.scenarioName}`.slice(0, 200),
    battery: s.battery,
    appliances: applyScenarioUsage(inventory, s.usage),
    sources: s.sources.map((r) => ({ ...r.params, id: r.id })),
    inverter: s.inverter ?? null,
    trip: s.trip,
  }
  const parsed = parsePlan(candidate)
  if (!parsed.ok) throw planIncomplete(withRecordIds(parsed.fields, candidate))
  return parsed.plan
}

/**
 * The plan for a scenario. Does **not** check access: call `loadScenarioForUser(db, userId, scenarioId, 'read')`
 * (or `requireVehicleRole`) first. Throws 404 when the scenario does not exist, 422 `plan_incomplete` when
 * the combination is not a valid plan (no battery bank, an AC appliance without an inverter, …).
 * Works inside a transaction too.
 */
export async function buildPlanForScenario(db: Db | DbOrTx, scenarioId: string): Promise<Plan> {
  if (!isId(scenarioId)) throw notFound('That scenario')
  const [row] = await db.select({ snapshot }).from(scenarios).where(eq(scenarios.id, scenarioId)).limit(1)
  if (!row) throw notFound('That scenario')
  return planFromSnapshot(row.snapshot)
}

const openReviewStates: SQL = sql.join(
  OPEN_REVIEW_STATES.map((state) => sql`${state}`),
  sql`, `,
)

/**
 * The revision of everything a scenario's plan is made of, hashed (SHA-256, hex): each contributing row's
 * `xmin`, the id of the transaction that wrote that version of the row. PostgreSQL gives every inserted or
 * updated row version a new one and a deleted row leaves its list, so any edit to the scenario, its vehicle,
 * battery bank, inverter, appliances, charge sources or usage changes the revision, as a hash of their content
 * would, without assembling the ~6 kB snapshot on every request (bench:api). Every part is tagged, so a
 * missing inverter cannot be taken for a missing battery bank. It keys the results memo: an unrelated edit of
 * one of these rows only costs a recomputation.
 */
const revisionSql = sql<string>`encode(sha256(convert_to(concat_ws('|',
  's' || scenarios.xmin::text,
  'v' || COALESCE((SELECT v.xmin::text FROM vehicles v WHERE v.id = scenarios.vehicle_id), '-'),
  'b' || COALESCE((SELECT b.xmin::text FROM battery_banks b WHERE b.vehicle_id = scenarios.vehicle_id), '-'),
  'i' || COALESCE((SELECT i.xmin::text FROM inverters i WHERE i.vehicle_id = scenarios.vehicle_id), '-'),
  'a' || COALESCE((SELECT string_agg(a.id::text || ':' || a.xmin::text, ',' ORDER BY a.id)
    FROM appliances a WHERE a.vehicle_id = scenarios.vehicle_id), '-'),
  'c' || COALESCE((SELECT string_agg(c.id::text || ':' || c.xmin::text, ',' ORDER BY c.id)
    FROM charge_sources c WHERE c.vehicle_id = scenarios.vehicle_id), '-'),
  'u' || COALESCE((SELECT string_agg(u.appliance_id::text || ':' || u.xmin::text, ',' ORDER BY u.appliance_id)
    FROM scenario_appliance_usage u WHERE u.scenario_id = scenarios.id), '-')
), 'UTF8')), 'hex')`

/**
 * The user's role on the scenario's vehicle (a member's, or an open review's advisor) and the revision of the
 * rows its plan is made of: enough to serve memoised results without assembling or moving the plan (~6 kB).
 */
const digestForUser = preparedFor((db) =>
  db
    .select({
      scenarioId: scenarios.id,
      memberRole: sql<VehicleRole | null>`(SELECT m.role::text FROM vehicle_memberships m
        WHERE m.vehicle_id = scenarios.vehicle_id AND m.user_id = ${sql.placeholder('userId')})`,
      openReview: sql<boolean>`EXISTS (SELECT 1 FROM reviews r WHERE r.vehicle_id = scenarios.vehicle_id
        AND r.advisor_id = ${sql.placeholder('userId')} AND r.state::text IN (${openReviewStates}))`,
      digest: revisionSql,
    })
    .from(scenarios)
    .where(eq(scenarios.id, sql.placeholder('scenarioId')))
    .limit(1)
    .prepare('ohmward_plan_digest_for_user'),
)

/**
 * For read-only views of a scenario's plan (results): the revision of the plan's rows if the user may read
 * the scenario, in one prepared query. 404 when the scenario does not exist or the user is not on its vehicle,
 * exactly as `loadScenarioForUser(…, 'read')` answers.
 */
export async function loadPlanDigestForReader(
  db: Db,
  userId: string,
  scenarioId: string,
): Promise<{ scenarioId: string; role: VehicleRole; digest: string }> {
  if (!isId(scenarioId)) throw notFound('That scenario')
  const [row] = await digestForUser(db).execute({ userId, scenarioId })
  const role = row ? (row.memberRole ?? (row.openReview ? 'advisor' : null)) : null
  if (!row || !role) throw notFound('That scenario')
  return { scenarioId: row.scenarioId, role, digest: row.digest }
}

/**
 * The scenario's plan and the revision of the rows it was built from, read together (one query, one
 * snapshot of the database), so the two always belong together. No access check: see above.
 */
export async function loadPlanWithDigest(
  db: Db,
  scenarioId: string,
): Promise<{ plan: Plan; digest: string }> {
  if (!isId(scenarioId)) throw notFound('That scenario')
  const [row] = await db
    .select({ snapshot, digest: revisionSql })
    .from(scenarios)
    .where(eq(scenarios.id, scenarioId))
    .limit(1)
  if (!row) throw notFound('That scenario')
  return { plan: planFromSnapshot(row.snapshot), digest: row.digest }
}

/** `appliances.3.supply` → `appliances.<id>.supply`, so the client can point at the record itself. */
function withRecordIds(
  fields: Record<string, string[]>,
  plan: { appliances: { id: string }[]; sources: { id: string }[] },
): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const [key, messages] of Object.entries(fields)) {
    const renamed = key.replace(
      /^(appliances|sources)\.(\d+)(?=\.|$)/,
      (whole, list: string, index: string) => {
        const item = (list === 'appliances' ? plan.appliances : plan.sources)[Number(index)]
        return item ? `${list}.${item.id}` : whole
      },
    )
    ;(out[renamed] ??= []).push(...messages)
  }
  return out
}
