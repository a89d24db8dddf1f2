import type { Request, RequestHandler } from 'express'
import type { AppContext } from '../context'
import { forbidden, notFound, unauthorized } from '../errors'

export { requireUser, requireRole, currentUser, type AccountRole } from '../middleware/require-user'

/** A person's role on one vehicle (the Crew). */
export type MembershipRole = 'owner' | 'editor' | 'viewer' | 'advisor'

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Locals {
      /** Set by requireMembership: the signed-in user's role on the resource of this request. */
      membershipRole?: MembershipRole | 'admin'
    }
  }
}

/** Looks up the signed-in user's role on a resource (e.g. a vehicle); null when they have none. */
export type MembershipLookup = (
  ctx: AppContext,
  userId: string,
  resourceId: string,
) => Promise<MembershipRole | null>

export interface MembershipOptions {
  /** Route parameter holding the resource id, e.g. 'vehicleId'; or a function reading it from the request. */
  param: string | ((req: Request) => string | undefined)
  /** Roles allowed to pass. */
  roles: readonly MembershipRole[]
  /** What the resource is called in the 404 message. */
  what?: string
  /** Let account admins through with role 'admin' (read-only support access, for example). Default false. */
  admins?: boolean
}

/**
 * The per-resource authorization hook later issues reuse: 401 when signed out; 404 when the user has no role
 * on the resource (so its existence is not revealed); 403 when their role is not among `roles`. Sets
 * res.locals.membershipRole for the route.
 *
 *   router.put('/:vehicleId', requireMembership(ctx, vehicleRole, { param: 'vehicleId', roles: ['owner', 'editor'] }), …)
 */
export function requireMembership(
  ctx: AppContext,
  lookup: MembershipLookup,
  opts: MembershipOptions,
): RequestHandler {
  return async (req, res, next) => {
    const user = res.locals.user
    if (!user) throw unauthorized()
    const raw = typeof opts.param === 'function' ? opts.param(req) : req.params[opts.param]
    const id = Array.isArray(raw) ? raw[0] : raw
    if (!id) throw notFound(opts.what)
    if (opts.admins && user.role === 'admin') {
      res.locals.membershipRole = 'admin'
      return next()
    }
    const role = await lookup(ctx, user.id, id)
    if (!role) throw notFound(opts.what)
    if (!opts.roles.includes(role))
      throw forbidden(
        `Your role on this ${opts.what?.toLowerCase() ?? 'item'} (${role}) does not allow this.`,
      )
    res.locals.membershipRole = role
    next()
  }
}
