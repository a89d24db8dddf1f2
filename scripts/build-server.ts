// `npm run build:server`: the production server bundle in dist-server/index.js (see scripts/lib/build-server.ts).
import { buildServer } from './lib/build-server'

console.log(`[ohmward] server bundle: ${await buildServer()}`)
