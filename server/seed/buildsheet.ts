/**
 * Demo parts list (invented items and rough prices, no real products) for the demo van "Lingon": the pack,
 * its protection, fuses and cables as the build sheet rates them for the winter scenario. Idempotent:
 * does nothing when the van is missing or already has parts.
 */
import { and, eq, like } from 'drizzle-orm'
import type { Db } from '../db/client'
import { parts, vehicleMemberships, vehicles } from '../db/schema/index'

interface DemoPart {
  name: string
  quantity: string
  unitPrice: string
  massKg: number | null
}

export const DEMO_PARTS: readonly DemoPart[] = [
  { name: 'LFP prismatic cell 3.2 V 200 Ah', quantity: '4', unitPrice: '92.50', massKg: 3.9 },
  {
    name: 'BMS 4S with charge- and load-enable outputs, 2 cell temperature sensors',
    quantity: '1',
    unitPrice: '79.90',
    massKg: 0.25,
  },
  { name: 'Charge-path disconnect, one direction, 100 A', quantity: '1', unitPrice: '64.00', massKg: 0.3 },
  { name: 'Load-path disconnect, one direction, 300 A', quantity: '1', unitPrice: '119.00', massKg: 0.6 },
  {
    name: 'Main fuse 300 A, high breaking capacity, with holder',
    quantity: '1',
    unitPrice: '58.40',
    massKg: 0.45,
  },
  { name: 'Battery monitor with shunt and relay output', quantity: '1', unitPrice: '89.00', massKg: 0.2 },
  {
    name: 'Bolt-down fuse 40 A with holder (solar controller, DC-DC)',
    quantity: '2',
    unitPrice: '9.80',
    massKg: 0.05,
  },
  { name: 'Bolt-down fuse 25 A with holder (mains charger)', quantity: '1', unitPrice: '9.80', massKg: 0.05 },
  { name: 'Bolt-down fuse 250 A with holder (inverter)', quantity: '1', unitPrice: '24.50', massKg: 0.2 },
  {
    name: 'Bolt-down fuse 20 A with holder (DC fuse panel feed)',
    quantity: '1',
    unitPrice: '9.80',
    massKg: 0.05,
  },
  { name: 'Blade fuse panel, 12 ways, with negative bar', quantity: '1', unitPrice: '21.90', massKg: 0.3 },
  { name: 'Busbar, 4 studs (one positive, one negative)', quantity: '2', unitPrice: '14.20', massKg: 0.25 },
  { name: 'Flexible cable 70 mm², red and black, per metre', quantity: '2', unitPrice: '17.60', massKg: 0.7 },
  { name: 'Flexible cable 50 mm², red and black, per metre', quantity: '2', unitPrice: '12.40', massKg: 0.5 },
  { name: 'Flexible twin cable 6 mm², per metre', quantity: '10', unitPrice: '2.15', massKg: 0.12 },
  { name: 'Flexible twin cable 1.5 mm², per metre', quantity: '25.5', unitPrice: '0.45', massKg: 0.04 },
  { name: 'Tinned copper lugs, assorted', quantity: '30', unitPrice: '0.60', massKg: 0.01 },
  {
    name: 'Heater pad 40 W with its own over-temperature cut-out',
    quantity: '1',
    unitPrice: '34.00',
    massKg: 0.2,
  },
  { name: 'Battery box lined with 25 mm PIR', quantity: '1', unitPrice: '45.00', massKg: 2.5 },
]

export async function seedBuildSheet(db: Db): Promise<void> {
  const [van] = await db
    .select({ id: vehicles.id })
    .from(vehicles)
    .innerJoin(vehicleMemberships, eq(vehicleMemberships.vehicleId, vehicles.id))
    .where(
      and(
        eq(vehicleMemberships.userId, 'demo-ines'),
        eq(vehicleMemberships.role, 'owner'),
        like(vehicles.name, 'Lingon%'),
      ),
    )
    .limit(1)
  if (!van) return
  const existing = await db.select({ id: parts.id }).from(parts).where(eq(parts.vehicleId, van.id)).limit(1)
  if (existing.length > 0) return
  for (const p of DEMO_PARTS) {
    await db
      .insert(parts)
      .values({ vehicleId: van.id, currency: 'EUR', updatedBy: 'demo-ines', note: '', ...p })
  }
}
