import type { OutgoingMail } from '../../services/mail'

const SIGN_OFF = '\n\nSafe travels,\nOhmward'

const ROLE_WORDS: Record<string, string> = {
  editor: 'an editor (you can change the equipment and scenarios)',
  viewer: 'a viewer (you can read the plan and its outlooks)',
  advisor: 'an advisor (you can read everything and leave comments)',
}

export function invitationMail(
  to: string,
  inviter: string,
  vehicle: string,
  role: string,
  link: string,
  days: number,
): OutgoingMail {
  return {
    to,
    kind: 'crew_invitation',
    subject: `${inviter} invites you to the crew of “${vehicle}” on Ohmward`,
    text:
      `Hello,\n\n${inviter} asks you to join the crew of “${vehicle}” as ${ROLE_WORDS[role] ?? role}.\n\n` +
      `Open this link to join. If you have no Ohmward account yet, you can make one with this address on the way:\n\n${link}\n\n` +
      `The link works once, for ${days} days, and only for the account with this e-mail address (${to}).` +
      SIGN_OFF +
      `\n\n(If you do not know ${inviter}, ignore this mail; nothing happens.)`,
  }
}

export function joinedMail(
  to: string,
  ownerName: string,
  member: string,
  vehicle: string,
  role: string,
): OutgoingMail {
  return {
    to,
    kind: 'crew_joined',
    subject: `${member} joined the crew of “${vehicle}”`,
    text:
      `Hello ${ownerName},\n\n${member} accepted your invitation and is now ${role} on “${vehicle}”.` +
      SIGN_OFF,
  }
}

export function roleChangedMail(
  to: string,
  name: string,
  vehicle: string,
  role: string,
  by: string,
): OutgoingMail {
  return {
    to,
    kind: 'crew_role_changed',
    subject: `Your role on “${vehicle}” is now ${role}`,
    text: `Hello ${name},\n\n${by} changed your role on “${vehicle}” to ${role}.` + SIGN_OFF,
  }
}

export function removedMail(to: string, name: string, vehicle: string, by: string): OutgoingMail {
  return {
    to,
    kind: 'crew_removed',
    subject: `You are no longer on the crew of “${vehicle}”`,
    text:
      `Hello ${name},\n\n${by} removed you from the crew of “${vehicle}”. You can no longer open it.` +
      SIGN_OFF,
  }
}

export function ownershipMail(to: string, name: string, vehicle: string, from: string): OutgoingMail {
  return {
    to,
    kind: 'crew_owner',
    subject: `You now own “${vehicle}” on Ohmward`,
    text:
      `Hello ${name},\n\n${from} handed “${vehicle}” over to you. You are its owner now: you manage the crew and can delete it. ` +
      `${from} stays on the crew as an editor.` +
      SIGN_OFF,
  }
}
