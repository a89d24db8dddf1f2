/**
 * Uploads waiting for the user's confirmation: the file on disk in a temporary folder and a small JSON
 * note beside it. Nothing is written to the database until the import succeeds.
 */
import { mkdirSync } from 'node:fs'
import { readdir, readFile, rm, stat, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export const PENDING_DIR = process.env.OHMWARD_LOG_UPLOAD_DIR ?? join(tmpdir(), 'ohmward-log-uploads')
/** A pending upload older than this is removed. [ms] */
const MAX_AGE_MS = 24 * 3600 * 1000

export interface PendingUpload {
  uploadId: string
  vehicleId: string
  userId: string
  fileName: string
  sizeBytes: number
  createdAt: string
}

export function ensurePendingDir(): string {
  mkdirSync(PENDING_DIR, { recursive: true })
  return PENDING_DIR
}

const UUID_RE = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

export const pendingFile = (uploadId: string) => join(PENDING_DIR, `${uploadId}.csv`)
const noteFile = (uploadId: string) => join(PENDING_DIR, `${uploadId}.json`)

export async function savePending(p: PendingUpload): Promise<void> {
  await writeFile(noteFile(p.uploadId), JSON.stringify(p))
}

export async function loadPending(uploadId: string): Promise<PendingUpload | null> {
  if (!UUID_RE.test(uploadId)) return null
  try {
    return JSON.parse(await readFile(noteFile(uploadId), 'utf8')) as PendingUpload
  } catch {
    return null
  }
}

export async function removePending(uploadId: string): Promise<void> {
  await Promise.all([rm(pendingFile(uploadId), { force: true }), rm(noteFile(uploadId), { force: true })])
}

/** Remove pending uploads nobody confirmed within a day. */
export async function sweepPending(now = Date.now()): Promise<void> {
  let names: string[]
  try {
    names = await readdir(PENDING_DIR)
  } catch {
    return
  }
  for (const name of names) {
    const path = join(PENDING_DIR, name)
    try {
      if (now - (await stat(path)).mtimeMs > MAX_AGE_MS) await rm(path, { force: true })
    } catch {
      /* already gone */
    }
  }
}
