import { fileURLToPath } from 'node:url'
import { resolve } from 'node:path'

export const ROOT = fileURLToPath(new URL('../..', import.meta.url))
export const RUN_DIR = resolve(ROOT, 'data/run')
export const PG_DIR = resolve(process.env.OHMWARD_PG_DIR ?? resolve(ROOT, 'data/pg'))
export const PG_PORT = Number(process.env.OHMWARD_PG_PORT ?? 54329)
export const DB_NAME = process.env.OHMWARD_DB_NAME ?? 'ohmward'
