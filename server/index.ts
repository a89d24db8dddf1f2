import type { AddressInfo } from 'node:net'
import { loadEnv } from './env'
import { buildContext } from './build-context'
import { createApp } from './app'
import { startBackgroundWorkers } from './workers'
import { createHttpServer } from './http-server'

/** Entry point: read the environment, build the app, listen, and shut down gracefully. */
async function main(): Promise<void> {
  const env = loadEnv()
  const ctx = buildContext(env)
  const app = createApp(ctx, { clientDir: process.env.OHMWARD_CLIENT_DIR ?? 'dist' })
  const server = createHttpServer(app).listen(env.PORT, env.HOST)
  await new Promise<void>((ok, fail) => {
    server.once('listening', ok)
    server.once('error', fail)
  })
  const { port } = server.address() as AddressInfo
  const url = `http://${env.HOST}:${port}`
  ctx.log.info({ url }, 'listening')
  console.log(`Ohmward is running at ${url}`)
  const workers = startBackgroundWorkers(ctx)

  let stopping = false
  const shutdown = (signal: string) => {
    if (stopping) return
    stopping = true
    ctx.log.info({ signal }, 'shutting down')
    // Stop accepting, let running requests finish, then close the pool.
    server.close(async () => {
      await workers.stop()
      await ctx.pool.end().catch(() => {})
      process.exit(0)
    })
    server.closeIdleConnections()
    setTimeout(() => process.exit(1), 10_000).unref()
  }
  process.on('SIGTERM', () => shutdown('SIGTERM'))
  process.on('SIGINT', () => shutdown('SIGINT'))
}

main().catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
