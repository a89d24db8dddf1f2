import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import { fileURLToPath } from 'node:url'
import { createApp } from '../../server/app'
import type { AppContext } from '../../server/context'
import { startBackgroundWorkers, type Workers } from '../../server/workers'
import { testContext } from './context'

export interface RunningServer {
  url: string
  ctx: AppContext
  close(): Promise<void>
}

const DIST = fileURLToPath(new URL('../../dist', import.meta.url))

/** The real app (API + built client + background workers) on a free loopback port, for browser tests. */
export async function startTestServer(envOverrides: Record<string, string> = {}): Promise<RunningServer> {
  const ctx = testContext(envOverrides)
  const app = createApp(ctx, { clientDir: DIST })
  const server: Server = await new Promise((ok) => {
    const s = app.listen(0, '127.0.0.1', () => ok(s))
  })
  const { port } = server.address() as AddressInfo
  const url = `http://127.0.0.1:${port}`
  ctx.env.APP_URL = url
  const workers: Workers = startBackgroundWorkers(ctx)
  return {
    url,
    ctx,
    async close() {
      await workers.stop()
      server.closeAllConnections()
      await new Promise<void>((ok) => server.close(() => ok()))
      await ctx.pool.end()
    },
  }
}
