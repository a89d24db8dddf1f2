/**
 * The local fake SMTP server (`npm start`, `npm run dev` and `npm test` run it on loopback).
 * - SMTP on SMTP_PORT (no auth, no TLS) accepts every message and keeps the last 500 in memory.
 * - A JSON API on SMTP_API_PORT: GET /messages[?to=addr] (newest first), GET /messages/:id,
 *   DELETE /messages, DELETE /messages/:id.
 * Prints "ready" when both listen. Tests can also import startMailFake() and run one in-process.
 */
import { createServer, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'
import { fileURLToPath } from 'node:url'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

export interface StoredMessage {
  id: string
  from: string
  to: string[]
  subject: string
  date: string
  text: string
}

export interface MailFake {
  smtpPort: number
  apiPort: number
  messages: StoredMessage[]
  /** Stop accepting SMTP connections (the API stays up), e.g. to test the outbox's retries. */
  stopSmtp(): Promise<void>
  startSmtp(): Promise<void>
  close(): Promise<void>
}

const KEEP = 500

export async function startMailFake(opts: {
  smtpPort: number
  apiPort: number
  host?: string
}): Promise<MailFake> {
  const host = opts.host ?? '127.0.0.1'
  const messages: StoredMessage[] = []
  let seq = 0

  const makeSmtp = () =>
    new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      size: 5 * 1024 * 1024,
      onData(stream, session, callback) {
        simpleParser(stream)
          .then((parsed) => {
            const envelopeTo = session.envelope.rcptTo.map((r) => r.address.toLowerCase())
            messages.unshift({
              id: String(++seq),
              from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
              to: envelopeTo,
              subject: parsed.subject ?? '',
              date: new Date().toISOString(),
              text: parsed.text ?? '',
            })
            messages.splice(KEEP)
            callback()
          })
          .catch((err: Error) => callback(err))
      },
    })

  let smtp: SMTPServer | null = null
  let smtpPort = opts.smtpPort
  const startSmtp = async () => {
    if (smtp) return
    const s = makeSmtp()
    await new Promise<void>((ok, fail) => {
      s.once('error', fail)
      s.listen(smtpPort, host, () => ok())
    })
    s.on('error', () => {})
    smtp = s
    smtpPort = ((s as unknown as { server: Server }).server.address() as AddressInfo).port
  }
  const stopSmtp = async () => {
    const s = smtp
    smtp = null
    if (s) await new Promise<void>((ok) => s.close(() => ok()))
  }

  const api = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://x')
    const send = (status: number, body?: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' })
      res.end(body === undefined ? undefined : JSON.stringify(body))
    }
    const m = /^\/messages(?:\/([^/]+))?$/.exec(url.pathname)
    if (!m) return send(404, { error: { code: 'not_found', message: 'No such path.' } })
    const id = m[1]
    if (req.method === 'GET' && !id) {
      const to = url.searchParams.get('to')?.toLowerCase()
      return send(200, { messages: to ? messages.filter((x) => x.to.includes(to)) : messages })
    }
    if (req.method === 'GET' && id) {
      const msg = messages.find((x) => x.id === id)
      return msg
        ? send(200, { message: msg })
        : send(404, { error: { code: 'not_found', message: 'No such message.' } })
    }
    if (req.method === 'DELETE' && !id) {
      messages.splice(0)
      res.writeHead(204).end()
      return
    }
    if (req.method === 'DELETE' && id) {
      const i = messages.findIndex((x) => x.id === id)
      if (i >= 0) messages.splice(i, 1)
      res.writeHead(204).end()
      return
    }
    send(405, { error: { code: 'method', message: 'Not allowed.' } })
  })
  await new Promise<void>((ok, fail) => {
    api.once('error', fail)
    api.listen(opts.apiPort, host, () => ok())
  })
  await startSmtp()

  return {
    get smtpPort() {
      return smtpPort
    },
    apiPort: (api.address() as AddressInfo).port,
    messages,
    stopSmtp,
    startSmtp,
    async close() {
      await stopSmtp()
      api.closeAllConnections()
      await new Promise<void>((ok) => api.close(() => ok()))
    },
  }
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const fake = await startMailFake({
    smtpPort: Number(process.env.SMTP_PORT ?? 2525),
    apiPort: Number(process.env.SMTP_API_PORT ?? 2526),
  })
  console.log(
    `fake mail ready: SMTP on 127.0.0.1:${fake.smtpPort}, messages at http://127.0.0.1:${fake.apiPort}/messages`,
  )
  const stop = () => void fake.close().then(() => process.exit(0))
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}
