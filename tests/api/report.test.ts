/**
 * PDF report (issue 10): produced for each demo plan (data/examples), its text (parsed with poppler's
 * pdftotext) holds the key figures the results API gives, and its pages render to PNG with pdftoppm.
 * The rendered pages are kept in artifacts/report/ to look at.
 */
import { execFileSync } from 'node:child_process'
import { mkdirSync, mkdtempSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import { eq } from 'drizzle-orm'
import { reviewComments, reviews, scenarios, vehicleMemberships } from '../../server/db/schema/index'
import { seedUsers } from '../../server/seed/users'
import { seedVehicles } from '../../server/seed/vehicles'
import { seedBuildSheet } from '../../server/seed/buildsheet'
import { seedReviews } from '../../server/seed/reviews'
import { testContext, uniq } from '../support/context'
import { createUser, type TestUser } from '../support/factories'
import { examplePlan, storePlan, type ExampleName, type Send } from './results.fixture'

const ctx = testContext()
const app = createApp(ctx)
const work = mkdtempSync(join(tmpdir(), 'ohmward-report-'))
const artifacts = join(process.cwd(), 'artifacts', 'report')
afterAll(async () => {
  rmSync(work, { recursive: true, force: true })
  await ctx.pool.end()
})

const sender =
  (user: TestUser): Send =>
  async (method, path, body) => {
    const req = request(app)
      [method.toLowerCase() as 'get' | 'post' | 'put' | 'patch'](path)
      .set('Cookie', user.cookie)
    const res = body === undefined ? await req : await req.send(body as object)
    return { status: res.status, body: res.body }
  }

async function getPdf(user: TestUser, scenarioId: string): Promise<request.Response> {
  return request(app)
    .get(`/api/scenarios/${scenarioId}/report.pdf`)
    .set('Cookie', user.cookie)
    .buffer(true)
    .parse((res, cb) => {
      const chunks: Buffer[] = []
      res.on('data', (c: Buffer) => chunks.push(c))
      res.on('end', () => cb(null, Buffer.concat(chunks)))
    })
}

/** pdftotext -layout, with runs of spaces folded so figures read as one line. */
function pdfText(file: string): string {
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/[ \t]+/g, ' ')
}

const fmt = (x: number, digits = 0) =>
  x
    .toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits })
    .replace(/^-/, '\u2212')
const energy = (wh: number) => (Math.abs(wh) >= 1000 ? `${fmt(wh / 1000, 2)} kWh` : `${fmt(wh)} Wh`)

const EXAMPLES: ExampleName[] = ['winter-week-lofoten', 'summer-month-andalusia', 'cabin-autumn-overcast']

describe('GET /api/scenarios/:scenarioId/report.pdf', () => {
  let owner: TestUser
  let stranger: TestUser
  const stored = new Map<
    ExampleName,
    { vehicleId: string; scenarioId: string; vehicle: string; scenario: string }
  >()

  beforeAll(async () => {
    owner = await createUser(ctx)
    stranger = await createUser(ctx)
    for (const name of EXAMPLES) {
      const names = { vehicle: `Report van ${uniq()}`, scenario: `Demo ${name}` }
      stored.set(name, { ...(await storePlan(sender(owner), examplePlan(name), names)), ...names })
    }
    mkdirSync(artifacts, { recursive: true })
  })

  it('answers 401 without a session and 404 to someone not on the vehicle', async () => {
    const id = stored.get('winter-week-lofoten')!.scenarioId
    expect((await request(app).get(`/api/scenarios/${id}/report.pdf`)).status).toBe(401)
    const res = await request(app).get(`/api/scenarios/${id}/report.pdf`).set('Cookie', stranger.cookie)
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })

  it('answers 422 plan_incomplete for a vehicle without a battery bank', async () => {
    const v = await request(app)
      .post('/api/vehicles')
      .set('Cookie', owner.cookie)
      .send({ name: `Bare ${uniq()}`, kind: 'van', systemVoltageV: 12 })
    const sc = await request(app)
      .post(`/api/vehicles/${v.body.id}/scenarios`)
      .set('Cookie', owner.cookie)
      .send({ name: 'No pack', trip: examplePlan('winter-week-lofoten').trip })
    const res = await request(app).get(`/api/scenarios/${sc.body.id}/report.pdf`).set('Cookie', owner.cookie)
    expect(res.status).toBe(422)
    expect(res.body.error.code).toBe('plan_incomplete')
  })

  for (const name of EXAMPLES) {
    it(`makes a PDF for ${name} whose text holds the key figures and whose pages render to PNG`, async () => {
      const s = stored.get(name)!
      const res = await getPdf(owner, s.scenarioId)
      expect(res.status).toBe(200)
      expect(res.headers['content-type']).toContain('application/pdf')
      expect(res.headers['content-disposition']).toMatch(/^attachment; filename=".+report\.pdf"/)
      const pdf = res.body as Buffer
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-')

      const file = join(work, `${name}.pdf`)
      writeFileSync(file, pdf)
      const results = (
        await request(app).get(`/api/scenarios/${s.scenarioId}/results`).set('Cookie', owner.cookie)
      ).body.results
      const text = pdfText(file)

      // Labels from the stored data.
      expect(text).toContain(s.vehicle)
      expect(text).toContain(s.scenario)
      // The verdict line the engine's status leads to.
      const headline =
        results.verdict.status === 'short'
          ? /Runs short on day \d+ at \d\d:00|Cannot serve every load/
          : /Carries the trip/
      expect(text).toMatch(headline)
      // Key figures, formatted as the report formats them, from the results API.
      const s1 = results.summary
      expect(text).toContain(`Lowest state of charge`)
      expect(text).toContain(`${fmt(s1.lowestSocFraction * 100)} %`)
      expect(text).toContain(`${fmt(s1.finalSocFraction * 100)} %`)
      if (results.packNeeded.capacityAh !== null)
        expect(text).toContain(`${fmt(results.packNeeded.capacityAh)} Ah`)
      if (results.solarNeeded.peakPowerWp !== null)
        expect(text).toContain(`${fmt(results.solarNeeded.peakPowerWp)} Wp`)
      if (results.autonomy.days !== null) expect(text).toContain(`${fmt(results.autonomy.days, 1)} days`)
      expect(text).toContain(energy(s1.energyOutWh))
      expect(text).toContain(`${fmt(results.classicSizing.capacityAh)} Ah`)
      // Each section is there.
      for (const section of [
        'Charts',
        'Day by day',
        'Appliances',
        'Charge sources',
        'Build sheet',
        'Protection rules',
        'Cables',
      ])
        expect(text).toContain(section)
      expect(text).toContain('High-current DC can start fires')
      // Every appliance and every trip day.
      for (const a of examplePlan(name).appliances) expect(text).toContain(a.name)
      for (const d of results.days as { date: string }[]) expect(text).toContain(d.date)
      // No advisor section without any review.
      expect(text).not.toContain('Advisor’s comments')

      // Pages render (poppler's pdftoppm), one PNG per page, each with real content.
      const pages = Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file], { encoding: 'utf8' }))![1])
      expect(pages).toBeGreaterThanOrEqual(5)
      const prefix = join(artifacts, name)
      for (const f of readdirSync(artifacts)) if (f.startsWith(`${name}-`)) rmSync(join(artifacts, f))
      execFileSync('pdftoppm', ['-png', '-r', '60', file, prefix])
      const pngs = readdirSync(artifacts).filter((f) => f.startsWith(`${name}-`) && f.endsWith('.png'))
      expect(pngs).toHaveLength(pages)
      for (const png of pngs) expect(statSync(join(artifacts, png)).size).toBeGreaterThan(5000)
    })
  }

  it('includes the advisor’s comments (not the client’s) and the review verdict when there are any', async () => {
    const s = stored.get('winter-week-lofoten')!
    const advisor = await createUser(ctx, { role: 'advisor', displayName: `Advisor ${uniq()}` })
    const [review] = await ctx.db
      .insert(reviews)
      .values({
        vehicleId: s.vehicleId,
        scenarioId: s.scenarioId,
        scenarioName: s.scenario,
        requesterId: owner.id,
        advisorId: advisor.id,
        message: 'Please check the winter plan.',
        state: 'answered',
        verdict: 'sound_with_changes',
        summary: 'Add a second heater pad before February.',
      })
      .returning()
    await ctx.db.insert(reviewComments).values([
      {
        reviewId: review!.id,
        authorId: advisor.id,
        body: 'Fridge duty cycle looks low for a 50 L box.',
        pinKind: 'appliance',
        pinLabel: 'Compressor fridge 50 L',
      },
      { reviewId: review!.id, authorId: owner.id, body: 'Client question that stays out of the report.' },
      { reviewId: review!.id, authorId: null, kind: 'event', body: 'Payment received.' },
    ])
    const res = await getPdf(owner, s.scenarioId)
    expect(res.status).toBe(200)
    const file = join(work, 'with-review.pdf')
    writeFileSync(file, res.body as Buffer)
    const text = pdfText(file)
    expect(text).toContain('Advisor’s comments')
    expect(text).toContain(advisor.displayName)
    expect(text).toContain('Sound with the changes below')
    expect(text).toContain('Add a second heater pad before February.')
    expect(text).toContain('Fridge duty cycle looks low for a 50 L box.')
    expect(text).toContain('Compressor fridge 50 L')
    expect(text).not.toContain('Client question that stays out of the report.')
    expect(text).not.toContain('Payment received.')
  })
  it('makes a PDF for every scenario of the seeded demo van, with its build sheet, and advisor comments only when there are any', async () => {
    // The demo seed is idempotent (a second run adds nothing), so it can share the test database.
    await seedUsers(ctx.db)
    await seedVehicles(ctx.db)
    await seedBuildSheet(ctx.db)
    await seedReviews(ctx.db)
    const session = await ctx.lucia.createSession('demo-ines', {})
    const ines = {
      id: 'demo-ines',
      cookie: ctx.lucia.createSessionCookie(session.id).serialize().split(';')[0]!,
    } as TestUser
    const [membership] = await ctx.db
      .select()
      .from(vehicleMemberships)
      .where(eq(vehicleMemberships.userId, 'demo-ines'))
    const trips = await ctx.db.select().from(scenarios).where(eq(scenarios.vehicleId, membership!.vehicleId))
    expect(trips.length).toBeGreaterThanOrEqual(2)
    for (const trip of trips) {
      const res = await getPdf(ines, trip.id)
      expect(res.status).toBe(200)
      const file = join(work, `demo-${trip.id}.pdf`)
      writeFileSync(file, res.body as Buffer)
      const text = pdfText(file)
      expect(text).toContain(trip.name)
      expect(text).toMatch(/Carries the trip|Runs short on day|Cannot serve every load/)
      expect(text).toContain('Build sheet')
      const advisorComments = await ctx.db
        .select({
          id: reviewComments.id,
          body: reviewComments.body,
          authorId: reviewComments.authorId,
          advisorId: reviews.advisorId,
        })
        .from(reviewComments)
        .innerJoin(reviews, eq(reviews.id, reviewComments.reviewId))
        .where(eq(reviews.scenarioId, trip.id))
      const byAdvisor = advisorComments.filter((c) => c.authorId === c.advisorId)
      if (byAdvisor.length > 0) {
        expect(text).toContain('Advisor’s comments')
        // The first words of each advisor comment (long ones wrap across lines in the PDF text).
        for (const c of byAdvisor)
          expect(text.replace(/\s+/g, ' ')).toContain(c.body.replace(/\s+/g, ' ').slice(0, 30))
      } else {
        // The demo has an advisor profile but no review yet: no advisor section.
        expect(text).not.toContain('Advisor’s comments')
      }
      execFileSync('pdftoppm', [
        '-png',
        '-r',
        '60',
        '-f',
        '1',
        '-l',
        '1',
        file,
        join(artifacts, `demo-${trip.name.replace(/[^\w]+/g, '-')}`),
      ])
    }
  })
})
