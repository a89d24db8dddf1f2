/**
 * Appliance list CSV: export, import preview with row-level errors, nothing saved without confirmation,
 * all-or-nothing import in one transaction.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import Papa from 'papaparse'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { APPLIANCE_CSV_COLUMNS, ImportPreviewSchema, ImportResultSchema } from '../../shared/schemas/vehicles'
import { addMember, caller, fridge, laptop, vehicleInput } from './vehicles.fixtures'

const ctx = testContext()
const app = createApp(ctx)
const call = caller(app)
let owner: TestUser
let as: ReturnType<typeof call>
afterAll(() => ctx.pool.end())
beforeAll(async () => {
  owner = await createUser(ctx)
  as = call(owner)
})

const HEADER = 'name,category,supply,powerW,quantity,hoursPerDay,startHour,endHour,dutyCycleFraction,standbyW'
const GOOD = [HEADER, 'Fridge,fridge,dc,45,1,24,0,0,0.3,', 'Lights,lighting,DC,4,4,5,17,23,,0.1'].join('\n')
const BAD = [
  HEADER,
  'Fridge,fridge,dc,45,1,24,0,0,0.3,', // line 2: fine
  'Kettle,cooking,mains,abc,1,0.1,7,9,,', // line 3: supply and powerW wrong
  ',lighting,dc,4,1,30,0,0,,', // line 4: name missing, 30 h
  '',
  'Fan,ventilation,dc,12,1,6,20,22,,', // line 6: 6 h in a 2 h window
].join('\n')

async function newVehicle(): Promise<string> {
  return (await as('post', '/api/vehicles', vehicleInput).expect(201)).body.id
}
const count = async (id: string) =>
  (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items.length

describe('GET /api/vehicles/:id/appliances.csv', () => {
  it('exports the inventory with the documented header, formulas defused', async () => {
    const id = await newVehicle()
    await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)
    await as('post', `/api/vehicles/${id}/appliances`, { ...laptop, name: '=HYPERLINK("x")' }).expect(201)
    const res = await as('get', `/api/vehicles/${id}/appliances.csv`).expect(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toBe('attachment; filename="test-van-appliances.csv"')
    const parsed = Papa.parse<Record<string, string>>(res.text.trim(), { header: true })
    expect(parsed.meta.fields).toEqual([...APPLIANCE_CSV_COLUMNS])
    expect(parsed.data[0]).toMatchObject({
      name: 'Compressor fridge',
      powerW: '45',
      dutyCycleFraction: '0.3',
      standbyW: '',
    })
    expect(parsed.data[1]!.name).toBe(`'=HYPERLINK("x")`)
  })

  it('re-imports its own export unchanged', async () => {
    const id = await newVehicle()
    await as('post', `/api/vehicles/${id}/appliances`, fridge).expect(201)
    await as('post', `/api/vehicles/${id}/appliances`, { ...laptop, name: '-12 V socket' }).expect(201)
    const csv = (await as('get', `/api/vehicles/${id}/appliances.csv`).expect(200)).text
    const other = await newVehicle()
    const res = await as('post', `/api/vehicles/${other}/appliances/import`, { csv, confirm: true }).expect(
      201,
    )
    const created = ImportResultSchema.parse(res.body).created
    expect(created.map((a) => a.name)).toEqual(['Compressor fridge', '-12 V socket'])
    expect(created[0]).toMatchObject(fridge)
  })
})

describe('POST /api/vehicles/:id/appliances/import', () => {
  it('previews good rows without saving anything', async () => {
    const id = await newVehicle()
    const res = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: GOOD,
      confirm: false,
    }).expect(200)
    const preview = ImportPreviewSchema.parse(res.body)
    expect(preview.errors).toEqual([])
    expect(preview.rows.map((r) => r.row)).toEqual([2, 3])
    expect(preview.rows[1]!.appliance).toMatchObject({ name: 'Lights', supply: 'dc', standbyW: 0.1 })
    expect(preview.rows[1]!.appliance).not.toHaveProperty('dutyCycleFraction')
    expect(await count(id)).toBe(0)
  })

  it('lists each bad row with its line and column', async () => {
    const id = await newVehicle()
    const res = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: BAD,
      confirm: false,
    }).expect(200)
    const { rows, errors } = ImportPreviewSchema.parse(res.body)
    expect(rows.map((r) => [r.row, r.appliance === null])).toEqual([
      [2, false],
      [3, true],
      [4, true],
      [6, true],
    ])
    const at = (row: number) =>
      errors
        .filter((e) => e.row === row)
        .map((e) => e.column)
        .sort()
    expect(at(3)).toEqual(['powerW', 'supply'])
    expect(errors.find((e) => e.row === 3 && e.column === 'powerW')!.message).toBe('“abc” is not a number')
    expect(at(4)).toEqual(['hoursPerDay', 'name'])
    expect(errors.find((e) => e.row === 4 && e.column === 'name')!.message).toBe('is required')
    expect(at(6)).toEqual(['hoursPerDay'])
    expect(await count(id)).toBe(0)
  })

  it('saves nothing when confirmed with bad rows (400), and keeps the existing inventory', async () => {
    const id = await newVehicle()
    await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)
    const res = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: BAD,
      confirm: true,
      mode: 'replace',
    }).expect(400)
    expect(res.body.error.code).toBe('import_invalid')
    expect(res.body.error.errors.length).toBe(5)
    const items = (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items
    expect(items.map((a: { name: string }) => a.name)).toEqual(['Laptop'])
    const history = (await as('get', `/api/vehicles/${id}/history`).expect(200)).body
    expect(history.items.some((h: { action: string }) => h.action === 'import')).toBe(false)
  })

  it('saves every row in one go when confirmed without errors, appending or replacing', async () => {
    const id = await newVehicle()
    await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)
    const appended = ImportResultSchema.parse(
      (await as('post', `/api/vehicles/${id}/appliances/import`, { csv: GOOD, confirm: true }).expect(201))
        .body,
    )
    expect(appended).toMatchObject({ saved: true, mode: 'append', removed: 0 })
    expect(await count(id)).toBe(3)
    const replaced = ImportResultSchema.parse(
      (
        await as('post', `/api/vehicles/${id}/appliances/import`, {
          csv: GOOD,
          confirm: true,
          mode: 'replace',
        }).expect(201)
      ).body,
    )
    expect(replaced).toMatchObject({ removed: 3 })
    const names = (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items.map(
      (a: { name: string }) => a.name,
    )
    expect(names).toEqual(['Fridge', 'Lights'])
    const history = (await as('get', `/api/vehicles/${id}/history?limit=1`).expect(200)).body.items[0]
    expect(history).toMatchObject({
      entity: 'appliance',
      action: 'import',
      summary: 'Imported 2 appliances from a CSV file, replacing 3',
    })
  })

  it('rolls the whole import back when a row fails in the database', async () => {
    const id = await newVehicle()
    // A trigger that refuses the second row stands in for any failure half-way through the insert.
    await ctx.pool.query(`CREATE OR REPLACE FUNCTION ow_test_refuse() RETURNS trigger AS $$
      BEGIN IF NEW.params->>'name' = 'Lights' AND NEW.vehicle_id = '${id}' THEN RAISE EXCEPTION 'refused'; END IF; RETURN NEW; END $$ LANGUAGE plpgsql`)
    await ctx.pool.query(
      `CREATE TRIGGER ow_test_refuse BEFORE INSERT ON appliances FOR EACH ROW EXECUTE FUNCTION ow_test_refuse()`,
    )
    try {
      await as('post', `/api/vehicles/${id}/appliances`, laptop).expect(201)
      await as('post', `/api/vehicles/${id}/appliances/import`, {
        csv: GOOD,
        confirm: true,
        mode: 'replace',
      }).expect(500)
    } finally {
      await ctx.pool.query('DROP TRIGGER ow_test_refuse ON appliances')
      await ctx.pool.query('DROP FUNCTION ow_test_refuse()')
    }
    const names = (await as('get', `/api/vehicles/${id}/appliances`).expect(200)).body.items.map(
      (a: { name: string }) => a.name,
    )
    expect(names).toEqual(['Laptop'])
  })

  it('names a missing or unknown column and an empty file', async () => {
    const id = await newVehicle()
    const res = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: 'name,category,supply,watts,quantity,hoursPerDay,startHour,endHour\nA,other,dc,5,1,1,0,0',
      confirm: false,
    }).expect(200)
    const header = res.body.errors.filter((e: { row: number }) => e.row === 1)
    expect(header.map((e: { column: string }) => e.column).sort()).toEqual(['powerW', 'watts'])
    const empty = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: '',
      confirm: false,
    }).expect(200)
    expect(empty.body.errors).toEqual([expect.objectContaining({ row: 0, column: null })])
    const noRows = await as('post', `/api/vehicles/${id}/appliances/import`, {
      csv: HEADER,
      confirm: true,
    }).expect(400)
    expect(noRows.body.error.errors[0].message).toMatch(/no appliances/)
    const badBody = await as('post', `/api/vehicles/${id}/appliances/import`, { csv: 5 }).expect(400)
    expect(Object.keys(badBody.body.error.fields).sort()).toEqual(['confirm', 'csv'])
  })

  it('refuses viewers (403) and strangers (404)', async () => {
    const id = await newVehicle()
    const viewer = await createUser(ctx)
    await addMember(ctx, id, viewer.id, 'viewer')
    await call(viewer)('post', `/api/vehicles/${id}/appliances/import`, { csv: GOOD, confirm: true }).expect(
      403,
    )
    await call(await createUser(ctx))('post', `/api/vehicles/${id}/appliances/import`, {
      csv: GOOD,
      confirm: true,
    }).expect(404)
    expect(await count(id)).toBe(0)
  })
})
