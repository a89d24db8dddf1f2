import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import pg from 'pg'
import { startDatabase, startServerProcess, type Stack, type ServerProcess } from '../../scripts/lib/harness'
import { startCluster, stopCluster } from '../../scripts/lib/pg'

/**
 * Faults, on a throwaway cluster of their own (restarting the shared test database would break other files):
 * - PostgreSQL restarts under a running server: the server answers 503 in the error shape meanwhile, recovers
 *   by itself, and nothing is half-applied;
 * - the server is killed (SIGKILL) in the middle of multi-row writes: each write is all there or not at all.
 */
describe('faults', () => {
  let stack: Stack
  let server: ServerProcess
  let cookie = ''
  let admin: pg.Client

  const call = (method: string, path: string, body?: unknown) =>
    fetch(server.url + path, {
      method,
      headers: { cookie, ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
    })

  const counts = async () => {
    const r = await admin.query<{ vehicles: number; owners: number }>(
      `SELECT (SELECT count(*)::int FROM vehicles) AS vehicles,
              (SELECT count(DISTINCT vehicle_id)::int FROM vehicle_memberships WHERE role = 'owner') AS owners`,
    )
    return r.rows[0]!
  }

  beforeAll(async () => {
    stack = await startDatabase({ seed: true })
    server = await startServerProcess(stack.dbUrl)
    const res = await call('POST', '/api/auth/sign-in', {
      email: 'ines@demo.ohmward.local',
      password: 'van-life-demo-1',
    })
    expect(res.status).toBe(200)
    cookie = (res.headers.get('set-cookie') ?? '').split(';')[0]!
  }, 240_000)

  afterAll(async () => {
    await admin?.end().catch(() => {})
    await server?.stop()
    await stack?.stop()
  })

  it('recovers from a database restart without a server restart, with nothing half-applied', async () => {
    expect((await call('GET', '/api/health')).status).toBe(200)
    stopCluster(stack.cluster)

    const health = await call('GET', '/api/health')
    expect(health.status).toBe(503)
    const write = await call('POST', '/api/vehicles', {
      name: 'Written while down',
      kind: 'van',
      systemVoltageV: 12,
    })
    expect(write.status).toBeGreaterThanOrEqual(500)
    expect((await write.json()) as unknown).toMatchObject({
      error: { code: expect.any(String), message: expect.any(String) },
    })

    startCluster(stack.cluster)
    admin = new pg.Client({ connectionString: stack.dbUrl })
    await admin.connect()
    const before = await counts()
    expect(before.vehicles).toBe(before.owners) // the failed create left no vehicle without its owner
    const names = await admin.query("SELECT 1 FROM vehicles WHERE name = 'Written while down'")
    expect(names.rowCount).toBe(0)

    // The same process serves again: the pool replaced its dead connections.
    let status = 0
    for (let i = 0; i < 20 && status !== 200; i++) {
      status = (await call('GET', '/api/health')).status
      if (status !== 200) await new Promise((r) => setTimeout(r, 250))
    }
    expect(status).toBe(200)
    const created = await call('POST', '/api/vehicles', {
      name: 'After the restart',
      kind: 'van',
      systemVoltageV: 12,
    })
    expect(created.status).toBe(201)
    const after = await counts()
    expect(after.vehicles).toBe(before.vehicles + 1)
    expect(after.owners).toBe(after.vehicles)
  })

  it('a server killed during multi-row imports leaves each import whole or absent', async () => {
    const rows = [
      'name,category,supply,powerW,quantity,hoursPerDay,startHour,endHour,dutyCycleFraction,standbyW',
    ]
    for (let i = 0; i < 150; i++) rows.push(`Light ${i},lighting,dc,3,1,2,18,22,,`)
    const csv = rows.join('\n')
    const vehicleIds: string[] = []
    for (let i = 0; i < 8; i++) {
      const res = await call('POST', '/api/vehicles', {
        name: `Kill test ${i}`,
        kind: 'van',
        systemVoltageV: 12,
      })
      expect(res.status).toBe(201)
      vehicleIds.push(((await res.json()) as { id: string }).id)
    }
    const inFlight = vehicleIds.map((id) =>
      call('POST', `/api/vehicles/${id}/appliances/import`, { csv, confirm: true }).then(
        (r) => r.status,
        () => 0, // the connection died with the server
      ),
    )
    // Kill as soon as the first import has committed, so the others are caught mid-way.
    const killBy = Date.now() + 30_000
    while (Date.now() < killBy) {
      const any = await admin.query('SELECT 1 FROM appliances WHERE vehicle_id = ANY($1) LIMIT 1', [
        vehicleIds,
      ])
      if (any.rowCount) break
      await new Promise((r) => setTimeout(r, 10))
    }
    server.child.kill('SIGKILL')
    const statuses = await Promise.all(inFlight)

    const perVehicle = await admin.query<{ vehicle_id: string; n: number }>(
      'SELECT vehicle_id, count(*)::int AS n FROM appliances WHERE vehicle_id = ANY($1) GROUP BY vehicle_id',
      [vehicleIds],
    )
    for (const row of perVehicle.rows) expect(row.n).toBe(150)
    // Every import the server confirmed is fully there.
    const confirmed = vehicleIds.filter((_, i) => statuses[i] === 201)
    for (const id of confirmed) expect(perVehicle.rows.find((r) => r.vehicle_id === id)?.n).toBe(150)
  })
})
