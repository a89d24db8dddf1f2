import { Router, type Request } from 'express'
import type { AppContext } from '../../context'
import { parse } from '../../validate'
import { unauthorized } from '../../errors'
import { InvitationCreateSchema, MemberRolePatchSchema, TransferSchema } from '../../../shared/schemas/crew'
import { requireVehicleRole } from './access'
import * as crew from './service'

const p = (req: Request, name: string) => String(req.params[name] ?? '')

/**
 * Crew routes (issue 8), mounted on /api:
 * /vehicles/:vehicleId/crew, /invitations, /members, /leave, /transfer; /invitations/:token (+ /accept).
 */
export function crewRouter(ctx: AppContext): Router {
  const r = Router()
  const ALL = ['owner', 'editor', 'viewer', 'advisor'] as const

  r.get('/vehicles/:vehicleId/crew', async (req, res) => {
    const { userId, role } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ALL)
    res.json(await crew.getCrew(ctx, p(req, 'vehicleId'), userId, role))
  })

  r.post('/vehicles/:vehicleId/invitations', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ['owner'])
    const body = parse(InvitationCreateSchema, req.body)
    res.status(201).json(await crew.createInvitation(ctx, p(req, 'vehicleId'), userId, body))
  })

  r.delete('/vehicles/:vehicleId/invitations/:invitationId', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ['owner'])
    await crew.revokeInvitation(ctx, p(req, 'vehicleId'), userId, p(req, 'invitationId'))
    res.status(204).end()
  })

  r.patch('/vehicles/:vehicleId/members/:userId', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ['owner'])
    const body = parse(MemberRolePatchSchema, req.body)
    await crew.changeRole(ctx, p(req, 'vehicleId'), userId, p(req, 'userId'), body.role)
    res.json(await crew.getCrew(ctx, p(req, 'vehicleId'), userId, 'owner'))
  })

  r.delete('/vehicles/:vehicleId/members/:userId', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ['owner'])
    await crew.removeMember(ctx, p(req, 'vehicleId'), userId, p(req, 'userId'))
    res.status(204).end()
  })

  r.post('/vehicles/:vehicleId/leave', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), [
      'owner',
      'editor',
      'viewer',
      'advisor',
    ])
    await crew.leave(ctx, p(req, 'vehicleId'), userId)
    res.status(204).end()
  })

  r.post('/vehicles/:vehicleId/transfer', async (req, res) => {
    const { userId } = await requireVehicleRole(ctx.db, res, p(req, 'vehicleId'), ['owner'])
    const body = parse(TransferSchema, req.body)
    await crew.transferOwnership(ctx, p(req, 'vehicleId'), userId, body.userId)
    res.json(await crew.getCrew(ctx, p(req, 'vehicleId'), userId, 'editor'))
  })

  r.get('/invitations/:token', async (req, res) => {
    res.json(await crew.previewInvitation(ctx, p(req, 'token')))
  })

  r.post('/invitations/:token/accept', async (req, res) => {
    const user = res.locals.user
    if (!user) throw unauthorized('Sign in or sign up first, then accept the invitation.')
    res.json(await crew.acceptInvitation(ctx, p(req, 'token'), user.id))
  })

  return r
}
