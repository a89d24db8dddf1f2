/**
 * `npm run bench:api`: load on the API over loopback with autocannon — 100 concurrent connections for 30 s
 * against the results endpoint and the main list endpoints, signed in as the demo owner — against the real
 * server process (production mode) on a throwaway, seeded PostgreSQL. Prints requests/s, p50, p99 and errors per
 * endpoint and the server's peak memory; the last line is one JSON object of these figures. Requests carry the
 * headers a browser sends (session cookie, Accept-Encoding), so the results answer comes gzip-compressed.
 * Targets on the 2-core machine: p99 ≤ 100 ms, no errors, peak memory ≤ 300 MB.
 *   BENCH_SECONDS=5 npm run bench:api   a shorter run
 */
import autocannon from 'autocannon'
import { startDatabase, startServerProcess } from './lib/harness'

const seconds = Number(process.env.BENCH_SECONDS ?? 30)
const connections = Number(process.env.BENCH_CONNECTIONS ?? 100)

const stack = await startDatabase({ seed: true })
const server = await startServerProcess(stack.dbUrl)
const figures: Record<string, number | string> = { connections, seconds }
try {
  const signIn = await fetch(server.url + '/api/auth/sign-in', {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: 'ines@demo.ohmward.local', password: 'van-life-demo-1' }),
  })
  if (!signIn.ok) throw new Error(`demo sign-in failed: ${signIn.status} ${await signIn.text()}`)
  const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? ''
  const list = (await (await fetch(server.url + '/api/scenarios', { headers: { cookie } })).json()) as {
    items: Array<{ id: string }>
  }
  const scenarioId = list.items[0]?.id
  if (!scenarioId) throw new Error('the demo has no scenario')
  const targets: Record<string, string> = {
    results: `/api/scenarios/${scenarioId}/results`,
    vehicles: '/api/vehicles',
    scenarios: '/api/scenarios',
  }
  // What Chromium sends with the client's fetch() of an API read: the session cookie and the encodings it
  // accepts (the results answer is gzip-compressed for such clients; lists are small and sent as they are).
  const browserHeaders = { cookie, accept: '*/*', 'accept-encoding': 'gzip, deflate, br, zstd' }
  // Warm the results cache/engine once, as a user opening the page would.
  await fetch(server.url + targets.results, { headers: { cookie } })
  let worstP99 = 0
  let totalErrors = 0
  for (const [name, path] of Object.entries(targets)) {
    const r = await autocannon({
      url: server.url + path,
      connections,
      duration: seconds,
      headers: browserHeaders,
    })
    const errors = r.errors + r.timeouts + r.non2xx
    console.log(
      `${name.padEnd(10)} ${Math.round(r.requests.average)} req/s  p50 ${r.latency.p50} ms  p99 ${r.latency.p99} ms  errors ${errors}`,
    )
    figures[`${name}_rps`] = Math.round(r.requests.average)
    figures[`${name}_p50_ms`] = r.latency.p50
    figures[`${name}_p99_ms`] = r.latency.p99
    figures[`${name}_errors`] = errors
    worstP99 = Math.max(worstP99, r.latency.p99)
    totalErrors += errors
  }
  figures.worst_p99_ms = worstP99
  figures.errors = totalErrors
  figures.peak_rss_mb = server.peakRssMB()
  console.log(`server peak memory ${figures.peak_rss_mb} MB`)
} finally {
  await server.stop()
  await stack.stop()
}
console.log(JSON.stringify(figures))
