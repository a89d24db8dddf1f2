/**
 * A vehicle's crew (issue 8): invitations by e-mail (single use, hashed, expiring, bound to the address),
 * role changes, removal, leaving, ownership transfer; every change in the vehicle's history; two editors
 * never overwrite each other (409 with the current record).
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import { eq } from 'drizzle-orm'
import { createApp } from '../../server/app'
import { testContext } from '../support/context'
import { createUser } from '../support/factories'
import { crewFixture, lastMail, type CrewFixture } from '../support/sharing'
import { vehicleInvitations } from '../../server/db/schema/index'
import { hashToken } from '../../server/auth/tokens'

const ctx = testContext({ APP_URL: 'http://127.0.0.1:39999' })
const app = createApp(ctx)
afterAll(() => ctx.pool.end())

async function invite(f: CrewFixture, email: string, role = 'editor') {
  const res = await request(app)
    .post(`/api/vehicles/${f.vehicleId}/invitations`)
    .set('Cookie', f.owner.cookie)
    .send({ email, role })
  expect(res.status).toBe(201)
  const mail = await lastMail(ctx, email.toLowerCase(), 'crew_invitation')
  const token = /\/invitations\/([a-z0-9]+)/.exec(mail!.textBody)![1]!
  return { id: res.body.id as string, token, mail: mail! }
}

const history = async (f: CrewFixture, cookie = f.owner.cookie) =>
  (await request(app).get(`/api/vehicles/${f.vehicleId}/history?limit=100`).set('Cookie', cookie).expect(200))
    .body.items as {
    entity: string
    summary: string
    actor: { displayName: string } | null
  }[]

describe('invitations', () => {
  let f: CrewFixture
  beforeAll(async () => {
    f = await crewFixture(ctx, app)
  })

  it('mails a single-use link whose token is stored only as a hash; the invitee joins with the role', async () => {
    const partner = await createUser(ctx, { displayName: 'Sigrid Partner' })
    const { id, token, mail } = await invite(f, partner.email.toUpperCase(), 'editor')
    expect(mail.subject).toContain('Sprinter')
    expect(mail.textBody).toContain('http://127.0.0.1:39999/invitations/')
    const [row] = await ctx.db.select().from(vehicleInvitations).where(eq(vehicleInvitations.id, id))
    expect(row!.tokenHash).toBe(hashToken(token))
    expect(row!.tokenHash).not.toContain(token)
    expect(row!.email).toBe(partner.email)

    const preview = await request(app).get(`/api/invitations/${token}`).expect(200)
    expect(preview.body).toMatchObject({
      role: 'editor',
      status: 'pending',
      invitedBy: 'Ingrid Owner',
      email: partner.email,
    })

    await request(app).post(`/api/invitations/${token}/accept`).expect(401)
    const ok = await request(app)
      .post(`/api/invitations/${token}/accept`)
      .set('Cookie', partner.cookie)
      .expect(200)
    expect(ok.body).toEqual({ vehicleId: f.vehicleId, role: 'editor' })
    const crew = await request(app)
      .get(`/api/vehicles/${f.vehicleId}/crew`)
      .set('Cookie', partner.cookie)
      .expect(200)
    expect(crew.body.members.find((m: { userId: string }) => m.userId === partner.id).role).toBe('editor')
    expect((await lastMail(ctx, f.owner.email, 'crew_joined'))?.textBody).toContain('Sigrid Partner')

    // reused link refused
    const again = await request(app).post(`/api/invitations/${token}/accept`).set('Cookie', partner.cookie)
    expect(again.status).toBe(410)
    expect(again.body.error.code).toBe('invitation_used')
    const h = await history(f)
    expect(
      h.some((e) => e.entity === 'membership' && e.summary === `Invited ${partner.email} as editor`),
    ).toBe(true)
    expect(
      h.some(
        (e) => e.summary === 'Sigrid Partner joined as editor' && e.actor?.displayName === 'Sigrid Partner',
      ),
    ).toBe(true)
  })

  it('refuses an expired link', async () => {
    const late = await createUser(ctx)
    const { id, token } = await invite(f, late.email, 'viewer')
    await ctx.db
      .update(vehicleInvitations)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(vehicleInvitations.id, id))
    const res = await request(app).post(`/api/invitations/${token}/accept`).set('Cookie', late.cookie)
    expect(res.status).toBe(410)
    expect(res.body.error.code).toBe('invitation_expired')
    expect((await request(app).get(`/api/invitations/${token}`)).body.status).toBe('expired')
    await request(app).get(`/api/vehicles/${f.vehicleId}/crew`).set('Cookie', late.cookie).expect(404)
  })

  it('an invitation for another address cannot be taken by a different account, and stays usable by the right one', async () => {
    const invitee = await createUser(ctx)
    const thief = await createUser(ctx)
    const { token } = await invite(f, invitee.email, 'viewer')
    const res = await request(app).post(`/api/invitations/${token}/accept`).set('Cookie', thief.cookie)
    expect(res.status).toBe(403)
    expect(res.body.error.code).toBe('wrong_account')
    await request(app).get(`/api/vehicles/${f.vehicleId}/crew`).set('Cookie', thief.cookie).expect(404)
    await request(app).post(`/api/invitations/${token}/accept`).set('Cookie', invitee.cookie).expect(200)
  })

  it('a new invitation to the same address retires the older link; unknown and withdrawn links are refused', async () => {
    const person = await createUser(ctx)
    const first = await invite(f, person.email, 'viewer')
    const second = await invite(f, person.email, 'editor')
    expect(
      (await request(app).post(`/api/invitations/${first.token}/accept`).set('Cookie', person.cookie)).body
        .error.code,
    ).toBe('invitation_revoked')
    await request(app)
      .delete(`/api/vehicles/${f.vehicleId}/invitations/${second.id}`)
      .set('Cookie', f.owner.cookie)
      .expect(204)
    expect(
      (await request(app).post(`/api/invitations/${second.token}/accept`).set('Cookie', person.cookie))
        .status,
    ).toBe(410)
    await request(app).post(`/api/invitations/notatoken/accept`).set('Cookie', person.cookie).expect(404)
    await request(app).get(`/api/invitations/notatoken`).expect(404)
  })

  it('only the owner invites; bad input is named; members cannot be invited twice', async () => {
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.editor.cookie)
      .send({ email: 'x@example.org', role: 'viewer' })
      .expect(403)
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.outsider.cookie)
      .send({ email: 'x@example.org', role: 'viewer' })
      .expect(404)
    const bad = await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.owner.cookie)
      .send({ email: 'nope', role: 'owner' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['email', 'role'])
    const dup = await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.owner.cookie)
      .send({ email: f.viewer.email, role: 'editor' })
    expect(dup.status).toBe(409)
    expect(dup.body.error.code).toBe('already_member')
  })
})

describe('roles, removal, leaving, transfer', () => {
  let f: CrewFixture
  beforeAll(async () => {
    f = await crewFixture(ctx, app)
  })

  it('the owner changes a role and removes a member; each change is in the history and mailed', async () => {
    await request(app)
      .patch(`/api/vehicles/${f.vehicleId}/members/${f.viewer.id}`)
      .set('Cookie', f.editor.cookie)
      .send({ role: 'editor' })
      .expect(403)
    const res = await request(app)
      .patch(`/api/vehicles/${f.vehicleId}/members/${f.viewer.id}`)
      .set('Cookie', f.owner.cookie)
      .send({ role: 'editor' })
      .expect(200)
    expect(res.body.members.find((m: { userId: string }) => m.userId === f.viewer.id).role).toBe('editor')
    expect((await lastMail(ctx, f.viewer.email, 'crew_role_changed'))?.subject).toContain('editor')
    await request(app)
      .patch(`/api/vehicles/${f.vehicleId}/members/${f.owner.id}`)
      .set('Cookie', f.owner.cookie)
      .send({ role: 'viewer' })
      .expect(400)

    await request(app)
      .delete(`/api/vehicles/${f.vehicleId}/members/${f.viewer.id}`)
      .set('Cookie', f.owner.cookie)
      .expect(204)
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', f.viewer.cookie).expect(404)
    const h = await history(f)
    expect(h.map((e) => e.summary)).toEqual(
      expect.arrayContaining([
        'Changed Vera Viewer’s role from viewer to editor',
        'Removed Vera Viewer (editor) from the crew',
      ]),
    )
  })

  it('a member leaves; the owner cannot leave without handing over', async () => {
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/leave`)
      .set('Cookie', f.advisorMember.cookie)
      .expect(204)
    await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', f.advisorMember.cookie).expect(404)
    const own = await request(app).post(`/api/vehicles/${f.vehicleId}/leave`).set('Cookie', f.owner.cookie)
    expect(own.status).toBe(400)
    expect(own.body.error.code).toBe('owner_cannot_leave')
    expect((await history(f)).some((e) => e.summary === 'Aksel Advisor left the crew (was advisor)')).toBe(
      true,
    )
  })

  it('the owner hands the vehicle over: the new owner manages the crew, the old one stays as editor', async () => {
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/transfer`)
      .set('Cookie', f.owner.cookie)
      .send({ userId: f.outsider.id })
      .expect(400)
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/transfer`)
      .set('Cookie', f.editor.cookie)
      .send({ userId: f.editor.id })
      .expect(403)
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/transfer`)
      .set('Cookie', f.owner.cookie)
      .send({ userId: f.editor.id })
      .expect(200)
    const crew = await request(app)
      .get(`/api/vehicles/${f.vehicleId}/crew`)
      .set('Cookie', f.editor.cookie)
      .expect(200)
    expect(crew.body.myRole).toBe('owner')
    expect(crew.body.members.find((m: { userId: string }) => m.userId === f.owner.id).role).toBe('editor')
    await request(app)
      .post(`/api/vehicles/${f.vehicleId}/invitations`)
      .set('Cookie', f.owner.cookie)
      .send({ email: 'a@example.org', role: 'viewer' })
      .expect(403)
    await request(app).post(`/api/vehicles/${f.vehicleId}/leave`).set('Cookie', f.owner.cookie).expect(204)
    expect((await lastMail(ctx, f.editor.email, 'crew_owner'))?.subject).toContain('You now own')
    expect(
      (await history(f, f.editor.cookie)).some((e) =>
        e.summary.startsWith('Ingrid Owner handed the vehicle over to Eirik Editor'),
      ),
    ).toBe(true)
  })
})

describe('co-editing', () => {
  it('two members editing the same record: the stale edit is refused with the current record, and the history names both', async () => {
    const f = await crewFixture(ctx, app)
    const v = (
      await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', f.owner.cookie).expect(200)
    ).body
    await request(app)
      .patch(`/api/vehicles/${f.vehicleId}`)
      .set('Cookie', f.editor.cookie)
      .send({ version: v.version, notes: 'Added a second fan' })
      .expect(200)
    const stale = await request(app)
      .patch(`/api/vehicles/${f.vehicleId}`)
      .set('Cookie', f.owner.cookie)
      .send({ version: v.version, name: 'Fjordlys II' })
    expect(stale.status).toBe(409)
    expect(stale.body.error.current).toMatchObject({
      notes: 'Added a second fan',
      updatedBy: { displayName: 'Eirik Editor' },
    })
    // merge: reapply my change on top of theirs
    await request(app)
      .patch(`/api/vehicles/${f.vehicleId}`)
      .set('Cookie', f.owner.cookie)
      .send({ version: stale.body.error.current.version, name: 'Fjordlys II' })
      .expect(200)
    const after = (
      await request(app).get(`/api/vehicles/${f.vehicleId}`).set('Cookie', f.editor.cookie).expect(200)
    ).body
    expect(after).toMatchObject({ name: 'Fjordlys II', notes: 'Added a second fan' })
    const h = await history(f, f.editor.cookie)
    const names = h.filter((e) => e.entity === 'vehicle').map((e) => e.actor?.displayName)
    expect(names).toEqual(expect.arrayContaining(['Eirik Editor', 'Ingrid Owner']))
  })
})
