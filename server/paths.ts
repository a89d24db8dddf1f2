import { existsSync } from 'node:fs'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'

/**
 * The project folder (the one holding package.json), found by walking up from this module. It works both from
 * the TypeScript sources (server/paths.ts) and from the production bundle (dist-server/index.js), so data files
 * are found by their path in the project, never relative to a source file.
 */
function findProjectRoot(start: string): string {
  let dir = start
  for (;;) {
    if (existsSync(join(dir, 'package.json')) && existsSync(join(dir, 'data'))) return dir
    const parent = dirname(dir)
    if (parent === dir) return process.cwd()
    dir = parent
  }
}

export const PROJECT_ROOT =
  process.env.OHMWARD_ROOT ?? findProjectRoot(dirname(fileURLToPath(import.meta.url)))

/** A path inside the project, e.g. projectPath('data', 'appliance-library.json'). */
export function projectPath(...parts: string[]): string {
  return resolve(PROJECT_ROOT, ...parts)
}
