/** A vehicle's crew and invitations (docs/reviews.md); answers parsed with the shared contract. */
import {
  CrewSchema,
  InvitationAcceptedSchema,
  InvitationPreviewSchema,
  InvitationSchema,
  type InviteRole,
} from '@shared/schemas/crew'
import { HistoryListSchema } from '@shared/schemas/vehicles'
import { http } from './http'

const v = (id: string) => `/vehicles/${encodeURIComponent(id)}`

export const crewApi = {
  get: (vehicleId: string) => http.get(`${v(vehicleId)}/crew`).then((b) => CrewSchema.parse(b)),
  invite: (vehicleId: string, email: string, role: InviteRole) =>
    http.post(`${v(vehicleId)}/invitations`, { email, role }).then((b) => InvitationSchema.parse(b)),
  withdraw: (vehicleId: string, invitationId: string) =>
    http.del<void>(`${v(vehicleId)}/invitations/${encodeURIComponent(invitationId)}`),
  changeRole: (vehicleId: string, userId: string, role: InviteRole) =>
    http
      .patch(`${v(vehicleId)}/members/${encodeURIComponent(userId)}`, { role })
      .then((b) => CrewSchema.parse(b)),
  remove: (vehicleId: string, userId: string) =>
    http.del<void>(`${v(vehicleId)}/members/${encodeURIComponent(userId)}`),
  leave: (vehicleId: string) => http.post<void>(`${v(vehicleId)}/leave`),
  transfer: (vehicleId: string, userId: string) =>
    http.post(`${v(vehicleId)}/transfer`, { userId }).then((b) => CrewSchema.parse(b)),
  history: (vehicleId: string, limit = 50, offset = 0) =>
    http
      .get(`${v(vehicleId)}/history?limit=${limit}&offset=${offset}`)
      .then((b) => HistoryListSchema.parse(b)),
  preview: (token: string) =>
    http.get(`/invitations/${encodeURIComponent(token)}`).then((b) => InvitationPreviewSchema.parse(b)),
  accept: (token: string) =>
    http
      .post(`/invitations/${encodeURIComponent(token)}/accept`)
      .then((b) => InvitationAcceptedSchema.parse(b)),
}
