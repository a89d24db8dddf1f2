/**
 * Advisors and reviews (issue 8): profiles with exact decimal fees, the directory, a free review from request
 * to close with pinned comments, mails at each step, the inbox's unread counts, and access that ends with it.
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser } from '../support/factories'
import { advisorWithProfile, crewFixture, lastMail, type CrewFixture } from '../support/sharing'
import type { TestUser } from '../support/factories'

const ctx = testContext({ APP_URL: 'http://127.0.0.1:39998' })
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

describe('advisor profiles and the directory', () => {
  it('keeps the fee exact, names bad fields, refuses stale versions and member accounts', async () => {
    const adv = await createUser(ctx, { role: 'advisor', displayName: 'Zdenka Exact' })
    const body = {
      version: 0,
      headline: 'Boats and vans',
      bio: 'Marine electrician.',
      specialities: ['Boats', 'Boats', 'LFP'],
      feeAmount: '0.10',
      currency: 'NOK',
      accepting: true,
    }
    const created = await request(app)
      .put('/api/advisors/me')
      .set('Cookie', adv.cookie)
      .send(body)
      .expect(200)
    expect(created.body).toMatchObject({
      feeAmount: '0.10',
      currency: 'NOK',
      specialities: ['Boats', 'LFP'],
      version: 1,
    })
    const upd = await request(app)
      .put('/api/advisors/me')
      .set('Cookie', adv.cookie)
      .send({ ...body, version: 1, feeAmount: '1234.5' })
      .expect(200)
    expect(upd.body.feeAmount).toBe('1234.50')
    const stale = await request(app)
      .put('/api/advisors/me')
      .set('Cookie', adv.cookie)
      .send({ ...body, version: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body.error.current.feeAmount).toBe('1234.50')
    const bad = await request(app)
      .put('/api/advisors/me')
      .set('Cookie', adv.cookie)
      .send({ ...body, version: 2, feeAmount: '12.345', currency: 'XXX', bio: '' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['bio', 'currency', 'feeAmount'])
    const member = await createUser(ctx)
    await request(app).put('/api/advisors/me').set('Cookie', member.cookie).send(body).expect(403)

    const dir = await request(app).get('/api/advisors?q=Zdenka').set('Cookie', member.cookie).expect(200)
    expect(dir.body.items).toHaveLength(1)
    expect(dir.body.items[0]).toMatchObject({ displayName: 'Zdenka Exact', feeAmount: '1234.50' })
    await request(app).get('/api/advisors').expect(401)
    await request(app).get(`/api/advisors/${adv.id}`).set('Cookie', member.cookie).expect(200)
    await request(app).get(`/api/advisors/${member.id}`).set('Cookie', member.cookie).expect(404)
  })
})

describe('a free review from request to close', () => {
  let f: CrewFixture
  let adv: TestUser
  let id: string
  beforeAll(async () => {
    f = await crewFixture(ctx, app)
    adv = await advisorWithProfile(ctx, app, '0', 'EUR', 'Halvor Free')
  })

  it('a viewer cannot ask; the owner can; the advisor is mailed', async () => {
    const ask = {
      scenarioId: f.scenarioId,
      advisorId: adv.id,
      message: 'Will the fridge survive a dark week?',
    }
    await request(app).post('/api/reviews').set('Cookie', f.viewer.cookie).send(ask).expect(403)
    await request(app).post('/api/reviews').set('Cookie', f.outsider.cookie).send(ask).expect(404)
    const bad = await request(app)
      .post('/api/reviews')
      .set('Cookie', f.owner.cookie)
      .send({ ...ask, advisorId: f.editor.id })
    expect(bad.body.error.fields.advisorId).toBeDefined()
    const res = await request(app).post('/api/reviews').set('Cookie', f.owner.cookie).send(ask).expect(201)
    id = res.body.id
    expect(res.body).toMatchObject({
      state: 'requested',
      paymentState: 'none',
      feeAmount: '0.00',
      mySide: 'client',
    })
    await request(app).post('/api/reviews').set('Cookie', f.owner.cookie).send(ask).expect(409)
    expect((await lastMail(ctx, adv.email, 'review_requested'))?.textBody).toContain(
      'Will the fridge survive',
    )
  })

  it('while the review is open its advisor reads the vehicle and scenario through the vehicle routes, read-only (needs reviewAdvisorRole wired into server/modules/vehicles/access.ts, see docs/reviews.md)', async () => {
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', adv.cookie).expect(200)
    await request(app).get(`/api/scenarios/${f.scenarioId}`).set('Cookie', adv.cookie).expect(200)
    await request(app)
      .patch(`/api/vehicles/${f.vehicleId}`)
      .set('Cookie', adv.cookie)
      .send({ version: 1, name: 'x' })
      .expect(403)
  })

  it('the advisor comments on the fridge (which starts the review); the client is mailed and replies', async () => {
    const detail = await request(app).get(`/api/reviews/${id}`).set('Cookie', adv.cookie).expect(200)
    expect(detail.body.actions).toMatchObject({
      start: true,
      comment: true,
      answer: true,
      decline: true,
      pay: false,
    })
    const fridge = detail.body.pinTargets.find((t: { kind: string }) => t.kind === 'appliance')
    expect(fridge).toEqual({ kind: 'appliance', itemId: f.fridgeId, label: 'Compressor fridge 50 L' })
    expect(detail.body.snapshot.appliances).toEqual([
      {
        id: f.fridgeId,
        name: 'Compressor fridge 50 L',
        powerW: 45,
        supply: 'dc',
        quantity: 1,
        hoursPerDay: 24,
      },
    ])
    expect(detail.body.snapshot.sources[0]).toMatchObject({ kind: 'solar', ratingText: '400 Wp' })
    expect(detail.body.snapshot.trip).toMatchObject({ days: 3, nightLowC: -9 })
    const wrong = await request(app)
      .post(`/api/reviews/${id}/comments`)
      .set('Cookie', adv.cookie)
      .send({ body: 'x', pin: { kind: 'appliance', itemId: f.sourceId } })
    expect(wrong.body.error.fields['pin.itemId']).toBeDefined()
    const c = await request(app)
      .post(`/api/reviews/${id}/comments`)
      .set('Cookie', adv.cookie)
      .send({
        body: 'At −9 °C the fridge duty cycle drops; 0.25 is pessimistic, fine.',
        pin: { kind: 'appliance', itemId: f.fridgeId },
      })
      .expect(201)
    expect(c.body).toMatchObject({
      authorSide: 'advisor',
      pin: { kind: 'appliance', itemId: f.fridgeId, label: 'Compressor fridge 50 L' },
    })
    const mail = await lastMail(ctx, f.owner.email, 'review_comment')
    expect(mail?.subject).toContain('Compressor fridge 50 L')
    expect(mail?.textBody).toContain('http://127.0.0.1:39998/reviews/' + id)

    // inbox: one unread comment for the owner (plus the "started" line), none for the advisor
    const inbox = await request(app).get('/api/reviews').set('Cookie', f.owner.cookie).expect(200)
    const mine = inbox.body.items.find((r: { id: string }) => r.id === id)
    expect(mine).toMatchObject({ state: 'in_progress', unread: 2, mySide: 'client' })
    const advInbox = await request(app).get('/api/reviews').set('Cookie', adv.cookie).expect(200)
    expect(advInbox.body.items.find((r: { id: string }) => r.id === id)).toMatchObject({
      unread: 0,
      mySide: 'advisor',
    })
    await request(app).get(`/api/reviews/${id}`).set('Cookie', f.owner.cookie).expect(200)
    const read = await request(app).get('/api/reviews').set('Cookie', f.owner.cookie).expect(200)
    expect(read.body.items.find((r: { id: string }) => r.id === id).unread).toBe(0)

    // the viewer reads but cannot write; the editor replies; the advisor sees it unread and is mailed
    await request(app).get(`/api/reviews/${id}`).set('Cookie', f.viewer.cookie).expect(200)
    await request(app)
      .post(`/api/reviews/${id}/comments`)
      .set('Cookie', f.viewer.cookie)
      .send({ body: 'me too' })
      .expect(403)
    await request(app)
      .post(`/api/reviews/${id}/comments`)
      .set('Cookie', f.editor.cookie)
      .send({ body: 'Thanks! And the battery?', pin: { kind: 'battery' } })
      .expect(201)
    expect((await lastMail(ctx, adv.email, 'review_comment'))?.textBody).toContain('Thanks! And the battery?')
    const advInbox2 = await request(app).get('/api/reviews').set('Cookie', adv.cookie).expect(200)
    expect(advInbox2.body.items.find((r: { id: string }) => r.id === id).unread).toBe(1)
    await request(app).get(`/api/reviews/${id}`).set('Cookie', f.outsider.cookie).expect(404)
  })

  it('the advisor gives a verdict; the client closes; access ends', async () => {
    await request(app)
      .post(`/api/reviews/${id}/answer`)
      .set('Cookie', f.owner.cookie)
      .send({ verdict: 'sound', summary: 'x' })
      .expect(403)
    const bad = await request(app)
      .post(`/api/reviews/${id}/answer`)
      .set('Cookie', adv.cookie)
      .send({ verdict: 'great', summary: '' })
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['summary', 'verdict'])
    const ans = await request(app)
      .post(`/api/reviews/${id}/answer`)
      .set('Cookie', adv.cookie)
      .send({ verdict: 'sound_with_changes', summary: 'Add 100 Wp or a DC-DC charger.' })
      .expect(200)
    expect(ans.body).toMatchObject({
      state: 'answered',
      verdict: 'sound_with_changes',
      summary: 'Add 100 Wp or a DC-DC charger.',
    })
    expect((await lastMail(ctx, f.owner.email, 'review_answered'))?.textBody).toContain(
      'Sound with the changes below',
    )
    await request(app).post(`/api/reviews/${id}/cancel`).set('Cookie', f.owner.cookie).expect(409)
    const closed = await request(app)
      .post(`/api/reviews/${id}/close`)
      .set('Cookie', f.owner.cookie)
      .expect(200)
    expect(closed.body).toMatchObject({ state: 'closed', closeReason: 'done', actions: { comment: false } })
    expect(await lastMail(ctx, adv.email, 'review_closed')).not.toBeNull()
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', adv.cookie).expect(404)
    await request(app).get(`/api/scenarios/${f.scenarioId}`).set('Cookie', adv.cookie).expect(404)
    await request(app)
      .post(`/api/reviews/${id}/comments`)
      .set('Cookie', adv.cookie)
      .send({ body: 'one more' })
      .expect(409)
    // the thread stays readable to the advisor, without the vehicle's items
    const after = await request(app).get(`/api/reviews/${id}`).set('Cookie', adv.cookie).expect(200)
    expect(after.body.pinTargets).toEqual([])
    expect(after.body.snapshot).toBeNull()
  })

  it('an advisor the owner keeps as a member still reads after the review closes', async () => {
    const adv2 = await advisorWithProfile(ctx, app, '0', 'EUR', 'Kept Advisor')
    const r = await request(app)
      .post('/api/reviews')
      .set('Cookie', f.owner.cookie)
      .send({ scenarioId: f.scenarioId, advisorId: adv2.id, message: 'Look?' })
      .expect(201)
    await request(app).post(`/api/reviews/${r.body.id}/decline`).set('Cookie', adv2.cookie).expect(200)
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', adv2.cookie).expect(404)
    const inv = await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.owner.cookie)
      .send({ email: adv2.email, role: 'advisor' })
      .expect(201)
    expect(inv.body.role).toBe('advisor')
    const token = /\/invitations\/([a-z0-9]+)/.exec(
      (await lastMail(ctx, adv2.email, 'crew_invitation'))!.textBody,
    )![1]
    await request(app).post(`/api/invitations/${token}/accept`).set('Cookie', adv2.cookie).expect(200)
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', adv2.cookie).expect(200)
  })
})
