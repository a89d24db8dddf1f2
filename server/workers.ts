import type { AppContext } from './context'
import { startOutboxWorker } from './services/mail-worker'

export interface Workers {
  stop(): Promise<void>
}

/**
 * Background loops that drain durable queues in PostgreSQL (e.g. the mail outbox). Each worker is a function
 * returning its own stop(); add one line per worker.
 */
export function startBackgroundWorkers(ctx: AppContext): Workers {
  const running: Array<{ stop(): Promise<void> }> = []
  running.push(startOutboxWorker(ctx))
  return {
    async stop() {
      await Promise.all(running.map((w) => w.stop()))
    },
  }
}
