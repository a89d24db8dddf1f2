/**
 * Demo log (invented): the sample log data/sample-logs/lingon-lofoten-2027-02.csv imported for the demo van
 * "Lingon" through the same path as an upload (pending file → import in one transaction), so the Logs page
 * opens with two weeks of data, the drifting-cell flag and a comparison with "Winter week in Lofoten".
 */
import { copyFile } from 'node:fs/promises'
import { randomUUID } from 'node:crypto'
import { readFileSync, statSync } from 'node:fs'
import { and, eq } from 'drizzle-orm'
import type pg from 'pg'
import type { Db } from '../db/client'
import { projectPath } from '../paths'
import { users, vehicleMemberships } from '../db/schema/index'
import { detectShape } from '../../shared/logs/detect'
import { completeMapping, proposeMapping } from '../../shared/logs/mapping'
import { importUpload } from '../modules/logs/logs.service'
import { ensurePendingDir, pendingFile, savePending } from '../modules/logs/pending'

const SAMPLE = projectPath('data', 'sample-logs', 'lingon-lofoten-2027-02.csv')

export async function seedLogs(db: Db): Promise<void> {
  const [ines] = await db
    .select({ id: users.id, displayName: users.displayName })
    .from(users)
    .where(eq(users.id, 'demo-ines'))
  if (!ines) return
  const [van] = await db
    .select({ vehicleId: vehicleMemberships.vehicleId })
    .from(vehicleMemberships)
    .where(and(eq(vehicleMemberships.userId, ines.id), eq(vehicleMemberships.role, 'owner')))
    .limit(1)
  if (!van) return
  const shape = detectShape(readFileSync(SAMPLE, 'utf8').slice(0, 64 * 1024), false)
  const proposal = shape ? completeMapping({ ...proposeMapping(shape).mapping, utcOffsetMinutes: 60 }) : null
  if (!proposal?.ok) throw new Error('the sample log no longer maps; run npm run logs:sample')
  const uploadId = randomUUID()
  ensurePendingDir()
  await copyFile(SAMPLE, pendingFile(uploadId))
  await savePending({
    uploadId,
    vehicleId: van.vehicleId,
    userId: ines.id,
    fileName: 'lingon-lofoten-2027-02.csv',
    sizeBytes: statSync(SAMPLE).size,
    createdAt: new Date().toISOString(),
  })
  await importUpload(
    { db, pool: (db as unknown as { $client: pg.Pool }).$client },
    ines,
    van.vehicleId,
    uploadId,
    proposal.mapping,
  )
}
