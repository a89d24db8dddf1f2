/**
 * Local fake of the payment provider's API, for `npm start` and `npm test` (loopback only).
 *
 * The app talks to it through the provider's official Node SDK (`stripe`), pointed here with
 * `{ host, port, protocol: 'http' }`. It implements only what the app calls:
 *
 *   POST /v1/checkout/sessions          create a hosted checkout session (form-encoded, as the SDK sends)
 *   GET  /v1/checkout/sessions/:id      read it back
 *   GET  /v1/payment_intents/:id        the payment behind a paid session
 *   POST /v1/refunds                    refund a payment intent in full (then a `charge.refunded` event)
 *
 * and the hosted page a payer sees:
 *
 *   GET  /pay/:sessionId                our own simple page with "Pay" and "Decline"
 *   POST /pay/:sessionId/pay            → `checkout.session.completed` (paid), then 303 to success_url
 *   POST /pay/:sessionId/decline        → `checkout.session.async_payment_failed`, then 303 to cancel_url
 *
 * Events are signed exactly as the provider does: header `Stripe-Signature: t=<unix>,v1=<hex HMAC-SHA256 of
 * "<t>.<payload>" with the webhook secret>`, made with the SDK's own `webhooks.generateTestHeaderString`.
 * They go to the URL in the session's `metadata.ohmward_webhook_url` (the app sets it to its own
 * `/api/webhooks/payments`), else to env OHMWARD_FAKE_STRIPE_WEBHOOK_URL. Delivery is retried 3 times.
 *
 * Test helpers (not part of the provider's API): GET /_fake/events (every event sent, newest last) and
 * POST /_fake/events/:id/resend (deliver an event again, byte for byte, with a fresh signature: a replay).
 *
 * Env: PORT (required), STRIPE_WEBHOOK_SECRET (default whsec_ohmward_local, the app's default too).
 * Prints "ready" when listening.
 */
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import { randomBytes } from 'node:crypto'
import Stripe from 'stripe'

const PORT = Number(process.env.PORT ?? 12111)
const SECRET = process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_ohmward_local'
const FALLBACK_WEBHOOK = process.env.OHMWARD_FAKE_STRIPE_WEBHOOK_URL
const stripe = new Stripe('sk_test_fake_signer', { telemetry: false })

type Json = Record<string, unknown>

interface Session {
  id: string
  object: 'checkout.session'
  mode: string
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  client_reference_id: string | null
  customer_email: string | null
  metadata: Record<string, string>
  payment_intent: string | null
  success_url: string
  cancel_url: string
  url: string | null
  created: number
  livemode: false
  line_items_summary: { name: string; amount: number; quantity: number }[]
}

interface SentEvent {
  id: string
  type: string
  payload: string
  url: string | null
  delivered: boolean
  lastStatus: number | null
}

const sessions = new Map<string, Session>()
const intents = new Map<string, { id: string; sessionId: string; amount: number; refunded: boolean }>()
const refunds = new Map<string, Json>()
const idempotent = new Map<string, { status: number; body: string }>()
const events: SentEvent[] = []

const newId = (prefix: string) => `${prefix}_test_${randomBytes(12).toString('hex')}`
const now = () => Math.floor(Date.now() / 1000)

/** Parse the SDK's form encoding (`a[b][0][c]=1`) into nested objects/arrays. */
function parseForm(body: string): Json {
  const out: Json = {}
  for (const [rawKey, value] of new URLSearchParams(body)) {
    const parts = rawKey.split(/\[|\]\[|\]/).filter((p) => p !== '')
    let node: Record<string, unknown> | unknown[] = out
    parts.forEach((part, i) => {
      const last = i === parts.length - 1
      const nextIsIndex = !last && /^\d+$/.test(parts[i + 1]!)
      const key: string | number = Array.isArray(node) ? Number(part) : part
      const container = node as Record<string | number, unknown>
      if (last) container[key] = value
      else {
        container[key] ??= nextIsIndex ? [] : {}
        node = container[key] as Record<string, unknown> | unknown[]
      }
    })
  }
  return out
}

function send(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body)
  res.writeHead(status, { 'content-type': 'application/json', 'request-id': newId('req') })
  res.end(text)
}

function stripeError(res: ServerResponse, status: number, message: string, param?: string): void {
  send(res, status, {
    error: { type: 'invalid_request_error', message, ...(param ? { param } : {}) },
  })
}

async function readBody(req: IncomingMessage): Promise<string> {
  const chunks: Buffer[] = []
  for await (const c of req) chunks.push(c as Buffer)
  return Buffer.concat(chunks).toString('utf8')
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`)
}

function money(minor: number, currency: string): string {
  const digits = ['jpy', 'krw', 'isk'].includes(currency) ? 0 : 2
  return `${(minor / 10 ** digits).toFixed(digits)} ${currency.toUpperCase()}`
}

async function deliver(ev: SentEvent): Promise<void> {
  if (!ev.url) return
  for (let attempt = 1; attempt <= 3; attempt++) {
    const header = stripe.webhooks.generateTestHeaderString({ payload: ev.payload, secret: SECRET })
    try {
      const r = await fetch(ev.url, {
        method: 'POST',
        headers: { 'content-type': 'application/json', 'stripe-signature': header },
        body: ev.payload,
      })
      ev.lastStatus = r.status
      if (r.ok) {
        ev.delivered = true
        return
      }
    } catch {
      ev.lastStatus = null
    }
    await new Promise((ok) => setTimeout(ok, 200 * attempt))
  }
}

async function emit(type: string, object: Json, webhookUrl: string | null): Promise<SentEvent> {
  const id = newId('evt')
  const payload = JSON.stringify(
    {
      id,
      object: 'event',
      api_version: '2026-10-28.endive',
      created: now(),
      type,
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      data: { object },
    },
    null,
    2,
  )
  const ev: SentEvent = {
    id,
    type,
    payload,
    url: webhookUrl ?? FALLBACK_WEBHOOK ?? null,
    delivered: false,
    lastStatus: null,
  }
  events.push(ev)
  await deliver(ev)
  return ev
}

const webhookFor = (s: Session) => s.metadata.ohmward_webhook_url ?? null

function createSession(form: Json, base: string): Session | string {
  const items = (form.line_items as Json[] | undefined) ?? []
  if (!items.length) return 'line_items'
  let amount = 0
  let currency = ''
  const summary: Session['line_items_summary'] = []
  for (const item of items) {
    const pd = item.price_data as Json | undefined
    const unit = Number(pd?.unit_amount)
    const qty = Number(item.quantity ?? 1)
    if (!pd || !Number.isInteger(unit) || unit < 0) return 'line_items[0][price_data][unit_amount]'
    currency = String(pd.currency ?? '').toLowerCase()
    if (!/^[a-z]{3}$/.test(currency)) return 'line_items[0][price_data][currency]'
    amount += unit * qty
    summary.push({
      name: String((pd.product_data as Json | undefined)?.name ?? 'Item'),
      amount: unit,
      quantity: qty,
    })
  }
  if (!form.success_url) return 'success_url'
  if (!form.cancel_url) return 'cancel_url'
  const id = newId('cs')
  return {
    id,
    object: 'checkout.session',
    mode: String(form.mode ?? 'payment'),
    status: 'open',
    payment_status: 'unpaid',
    amount_total: amount,
    currency,
    client_reference_id: (form.client_reference_id as string | undefined) ?? null,
    customer_email: (form.customer_email as string | undefined) ?? null,
    metadata: (form.metadata as Record<string, string> | undefined) ?? {},
    payment_intent: null,
    success_url: String(form.success_url),
    cancel_url: String(form.cancel_url),
    url: `${base}/pay/${id}`,
    created: now(),
    livemode: false,
    line_items_summary: summary,
  }
}

function page(s: Session): string {
  const lines = s.line_items_summary
    .map((l) => `<li>${escapeHtml(l.name)} <span>${money(l.amount * l.quantity, s.currency)}</span></li>`)
    .join('')
  const closed = s.status !== 'open'
  return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>Test payment · local fake</title>
<style>
body{font-family:system-ui,sans-serif;background:#eef1f4;margin:0;padding:24px;color:#1d2430}
main{max-width:420px;margin:0 auto;background:#fff;border:1px solid #cfd6de;border-radius:8px;padding:20px}
h1{font-size:20px;margin:0 0 4px} .note{color:#5b6675;font-size:14px}
ul{list-style:none;padding:0} li{display:flex;justify-content:space-between;padding:6px 0;border-bottom:1px solid #e5e9ee}
.total{font-weight:700;font-size:18px;display:flex;justify-content:space-between;margin:12px 0 20px}
form{display:inline} button{font-size:16px;padding:10px 18px;border-radius:6px;border:1px solid #333;cursor:pointer;margin-right:8px}
.pay{background:#234;color:#fff}.decline{background:#fff}
</style></head><body><main>
<h1>Test payment</h1>
<p class="note">This is the local stand-in for the payment provider. No real money moves.</p>
<ul>${lines}</ul>
<div class="total"><span>Total</span><span data-test="amount">${money(s.amount_total, s.currency)}</span></div>
${
  closed
    ? `<p data-test="closed">This payment is ${s.payment_status === 'paid' ? 'already paid' : 'closed'}.</p>`
    : `<form method="post" action="/pay/${s.id}/pay"><button class="pay" type="submit">Pay</button></form>
<form method="post" action="/pay/${s.id}/decline"><button class="decline" type="submit">Decline</button></form>`
}
</main></body></html>`
}

function redirect(res: ServerResponse, url: string, s: Session): void {
  res.writeHead(303, { location: url.replace('{CHECKOUT_SESSION_ID}', s.id) })
  res.end()
}

const server = createServer(async (req, res) => {
  try {
    const url = new URL(req.url ?? '/', `http://${req.headers.host ?? '127.0.0.1'}`)
    const base = `http://${req.headers.host ?? `127.0.0.1:${PORT}`}`
    const path = url.pathname
    const method = req.method ?? 'GET'

    // ---- hosted page ----
    let m = /^\/pay\/([\w]+)(?:\/(pay|decline))?$/.exec(path)
    if (m) {
      const s = sessions.get(m[1]!)
      if (!s) {
        res.writeHead(404, { 'content-type': 'text/plain' })
        res.end('No such payment.')
        return
      }
      if (method === 'GET' && !m[2]) {
        res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' })
        res.end(page(s))
        return
      }
      if (method === 'POST' && m[2]) {
        await readBody(req)
        if (s.status !== 'open') return redirect(res, s.cancel_url, s)
        if (m[2] === 'pay') {
          const pi = newId('pi')
          intents.set(pi, { id: pi, sessionId: s.id, amount: s.amount_total, refunded: false })
          s.status = 'complete'
          s.payment_status = 'paid'
          s.payment_intent = pi
          await emit('checkout.session.completed', { ...s }, webhookFor(s))
          return redirect(res, s.success_url, s)
        }
        s.status = 'expired'
        await emit('checkout.session.async_payment_failed', { ...s }, webhookFor(s))
        return redirect(res, s.cancel_url, s)
      }
    }

    // ---- test helpers ----
    if (method === 'GET' && path === '/_fake/events') {
      return send(res, 200, {
        data: events.map((e) => ({
          id: e.id,
          type: e.type,
          url: e.url,
          delivered: e.delivered,
          lastStatus: e.lastStatus,
        })),
      })
    }
    m = /^\/_fake\/events\/([\w]+)\/resend$/.exec(path)
    if (method === 'POST' && m) {
      const ev = events.find((e) => e.id === m![1])
      if (!ev) return stripeError(res, 404, 'No such event')
      await deliver(ev)
      return send(res, 200, { id: ev.id, delivered: ev.delivered, lastStatus: ev.lastStatus })
    }

    // ---- the provider's API ----
    if (!path.startsWith('/v1/'))
      return stripeError(res, 404, `Unrecognized request URL (${method}: ${path})`)
    const auth = req.headers.authorization ?? ''
    if (!/^Bearer sk_(test|live)_\S+$/.test(auth)) {
      return send(res, 401, {
        error: { type: 'invalid_request_error', message: 'Invalid API Key provided.' },
      })
    }
    const body = method === 'POST' ? await readBody(req) : ''
    const idemKey = method === 'POST' ? (req.headers['idempotency-key'] as string | undefined) : undefined
    if (idemKey && idempotent.has(`${path}:${idemKey}`)) {
      const hit = idempotent.get(`${path}:${idemKey}`)!
      res.writeHead(hit.status, { 'content-type': 'application/json', 'idempotent-replayed': 'true' })
      res.end(hit.body)
      return
    }
    const remember = (status: number, obj: unknown) => {
      if (idemKey) idempotent.set(`${path}:${idemKey}`, { status, body: JSON.stringify(obj) })
      send(res, status, obj)
    }
    const form = parseForm(body)

    if (method === 'POST' && path === '/v1/checkout/sessions') {
      const s = createSession(form, base)
      if (typeof s === 'string') return stripeError(res, 400, `Missing or invalid parameter: ${s}`, s)
      sessions.set(s.id, s)
      return remember(200, s)
    }
    m = /^\/v1\/checkout\/sessions\/([\w]+)$/.exec(path)
    if (method === 'GET' && m) {
      const s = sessions.get(m[1]!)
      return s ? send(res, 200, s) : stripeError(res, 404, `No such checkout.session: '${m[1]}'`, 'session')
    }
    m = /^\/v1\/payment_intents\/([\w]+)$/.exec(path)
    if (method === 'GET' && m) {
      const pi = intents.get(m[1]!)
      if (!pi) return stripeError(res, 404, `No such payment_intent: '${m[1]}'`, 'intent')
      const s = sessions.get(pi.sessionId)!
      return send(res, 200, {
        id: pi.id,
        object: 'payment_intent',
        amount: pi.amount,
        amount_received: pi.amount,
        currency: s.currency,
        status: 'succeeded',
        metadata: s.metadata,
      })
    }
    if (method === 'POST' && path === '/v1/refunds') {
      const piId = String(form.payment_intent ?? '')
      const pi = intents.get(piId)
      if (!pi) return stripeError(res, 400, `No such payment_intent: '${piId}'`, 'payment_intent')
      if (pi.refunded) {
        return send(res, 400, {
          error: {
            type: 'invalid_request_error',
            code: 'charge_already_refunded',
            message: 'This charge has already been refunded.',
          },
        })
      }
      const s = sessions.get(pi.sessionId)!
      pi.refunded = true
      const refund = {
        id: newId('re'),
        object: 'refund',
        amount: pi.amount,
        currency: s.currency,
        payment_intent: pi.id,
        status: 'succeeded',
        reason: form.reason ?? null,
        metadata: (form.metadata as Json | undefined) ?? {},
        created: now(),
      }
      refunds.set(refund.id, refund)
      remember(200, refund)
      // The provider confirms the refund by an event shortly after the API call answered.
      setTimeout(() => {
        void emit(
          'charge.refunded',
          {
            id: newId('ch'),
            object: 'charge',
            amount: pi.amount,
            amount_refunded: pi.amount,
            currency: s.currency,
            payment_intent: pi.id,
            refunded: true,
            metadata: s.metadata,
          },
          webhookFor(s),
        )
      }, 50)
      return
    }
    return stripeError(res, 404, `Unrecognized request URL (${method}: ${path})`)
  } catch (err) {
    send(res, 500, { error: { type: 'api_error', message: (err as Error).message } })
  }
})

server.listen(PORT, '127.0.0.1', () => {
  console.log(`payments fake ready on http://127.0.0.1:${PORT}`)
})
process.on('SIGTERM', () => server.close(() => process.exit(0)))
