import type { Response } from 'express'
import { currentUser } from '../../middleware/require-user'
import type { Actor } from './records'

/** The signed-in user as the one making a change. */
export function actorOf(res: Response): Actor {
  const user = currentUser(res)
  return { id: user.id, displayName: user.displayName }
}
