/**
 * API contract for a vehicle's crew: members, invitations, role changes, ownership transfer (issue 8).
 * Routes: docs/reviews.md.
 */
import { z } from 'zod'

export const INVITE_ROLES = ['editor', 'viewer', 'advisor'] as const
export type InviteRole = (typeof INVITE_ROLES)[number]
export const CREW_ROLES = ['owner', 'editor', 'viewer', 'advisor'] as const
export type CrewRole = (typeof CREW_ROLES)[number]

/** What each role may do, in plain words (shown beside the role picker). */
export const ROLE_HELP: Record<CrewRole, string> = {
  owner: 'Changes everything, manages the crew, can delete the vehicle.',
  editor: 'Changes the equipment and scenarios, asks for reviews.',
  viewer: 'Reads the vehicle, its scenarios and their outlooks.',
  advisor: 'Reads everything, writes only comments and reviews.',
}

/** Invitation links work this long. */
export const INVITATION_LIFETIME_DAYS = 7

const roleError = { error: `must be one of ${INVITE_ROLES.join(', ')}` }

/** POST /api/vehicles/:vehicleId/invitations (owner). */
export const InvitationCreateSchema = z.strictObject({
  email: z
    .string({ error: 'is required' })
    .trim()
    .toLowerCase()
    .pipe(z.email({ error: 'must be an e-mail address' }))
    .pipe(z.string().max(254, 'must be at most 254 characters')),
  role: z.enum(INVITE_ROLES, roleError),
})
export type InvitationCreate = z.input<typeof InvitationCreateSchema>

/** PATCH /api/vehicles/:vehicleId/members/:userId (owner). */
export const MemberRolePatchSchema = z.strictObject({ role: z.enum(INVITE_ROLES, roleError) })
export type MemberRolePatch = z.infer<typeof MemberRolePatchSchema>

/** POST /api/vehicles/:vehicleId/transfer (owner): the member who becomes owner; the old owner becomes editor. */
export const TransferSchema = z.strictObject({
  userId: z.string({ error: 'is required' }).min(1, 'is required'),
})
export type Transfer = z.infer<typeof TransferSchema>

export const CrewMemberSchema = z.object({
  userId: z.string(),
  displayName: z.string(),
  /** Only shown to the owner and to the member themself. */
  email: z.string().nullable(),
  role: z.enum(CREW_ROLES),
  since: z.string(),
  isMe: z.boolean(),
})
export type CrewMember = z.infer<typeof CrewMemberSchema>

export const INVITATION_STATUSES = ['pending', 'accepted', 'expired', 'revoked'] as const
export type InvitationStatus = (typeof INVITATION_STATUSES)[number]

export const InvitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: z.enum(INVITE_ROLES),
  status: z.enum(INVITATION_STATUSES),
  invitedBy: z.string().nullable(),
  expiresAt: z.string(),
  createdAt: z.string(),
})
export type Invitation = z.infer<typeof InvitationSchema>

/** An advisor who can read the vehicle right now because of an open review (not a member). */
export const ReviewingAdvisorSchema = z.object({
  userId: z.string(),
  displayName: z.string(),
  reviewId: z.string(),
  state: z.string(),
})

/** GET /api/vehicles/:vehicleId/crew */
export const CrewSchema = z.object({
  vehicleId: z.string(),
  vehicleName: z.string(),
  myRole: z.enum(CREW_ROLES),
  members: z.array(CrewMemberSchema),
  /** Pending and recent invitations; only the owner sees them (empty for others). */
  invitations: z.array(InvitationSchema),
  reviewingAdvisors: z.array(ReviewingAdvisorSchema),
})
export type Crew = z.infer<typeof CrewSchema>

/** POST /api/vehicles/:vehicleId/invitations answer. */
export const InvitationCreatedSchema = InvitationSchema
/** GET /api/invitations/:token (no sign-in needed): what the link offers. */
export const InvitationPreviewSchema = z.object({
  vehicleName: z.string(),
  role: z.enum(INVITE_ROLES),
  invitedBy: z.string().nullable(),
  /** The address the invitation was sent to: only that account can accept. */
  email: z.string(),
  status: z.enum(INVITATION_STATUSES),
  expiresAt: z.string(),
})
export type InvitationPreview = z.infer<typeof InvitationPreviewSchema>

/** POST /api/invitations/:token/accept answer. */
export const InvitationAcceptedSchema = z.object({ vehicleId: z.string(), role: z.enum(CREW_ROLES) })
export type InvitationAccepted = z.infer<typeof InvitationAcceptedSchema>
