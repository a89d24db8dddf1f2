import type { AppContext } from './context'

export interface Workers {
  stop(): Promise<void>
}

/**
 * Background loops that drain durable queues in PostgreSQL (e.g. the mail outbox). Each worker is a function
 * returning its own stop(); add one line per worker.
 */
export function startBackgroundWorkers(ctx: AppContext): Workers {
  const running: Array<{ stop(): Promise<void> }> = []
  void ctx
  return {
    async stop() {
      await Promise.all(running.map((w) => w.stop()))
    },
  }
}
