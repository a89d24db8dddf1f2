import nodemailer, { type Transporter } from 'nodemailer'
import type { Db } from '../db/client'
import type { Env } from '../env'
import { mailOutbox } from '../db/schema/index'

/** A mail ready for the outbox: plain text only. */
export interface OutgoingMail {
  to: string
  subject: string
  text: string
  kind: string
}

/**
 * Put a mail in the durable outbox (in the caller's transaction when given one). The outbox worker sends it;
 * a mail server that is down only delays it.
 */
export async function enqueueMail(db: Db, mail: OutgoingMail): Promise<number> {
  const [row] = await db
    .insert(mailOutbox)
    .values({ toAddress: mail.to, subject: mail.subject, textBody: mail.text, kind: mail.kind })
    .returning({ id: mailOutbox.id })
  return row!.id
}

/** The SMTP transport from the environment (the local fake unless SMTP_* says otherwise). */
export function createMailTransport(env: Env): Transporter {
  return nodemailer.createTransport({
    host: env.SMTP_HOST,
    port: env.SMTP_PORT,
    secure: env.SMTP_SECURE === 'true',
    auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASS ?? '' } : undefined,
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  })
}

// ---------------------------------------------------------------------------------------------------------
// The mails, in our own words. Plain text; one function per mail.

const SIGN_OFF =
  '\n\nSafe travels,\nOhmward\n\n(You get this mail because someone used this address on Ohmward. If that was not you, you can ignore it.)'

export function verifyEmailMail(to: string, name: string, link: string): OutgoingMail {
  return {
    to,
    kind: 'verify_email',
    subject: 'Confirm your e-mail address for Ohmward',
    text:
      `Hello ${name},\n\nthanks for signing up. Open this link to confirm that this address is yours, and you are in:\n\n${link}\n\n` +
      `The link works once and for 48 hours. If it has run out, sign up again with the same address and we send a fresh one.` +
      SIGN_OFF,
  }
}

export function alreadyRegisteredMail(
  to: string,
  name: string,
  signInLink: string,
  resetLink: string,
): OutgoingMail {
  return {
    to,
    kind: 'already_registered',
    subject: 'You already have an Ohmward account',
    text:
      `Hello ${name},\n\nsomeone (hopefully you) tried to sign up with this address, but it already has an account.\n\n` +
      `Sign in here: ${signInLink}\nForgot the password? Choose a new one here: ${resetLink}\n\n` +
      `Nothing has changed on your account.` +
      SIGN_OFF,
  }
}

export function resetPasswordMail(to: string, name: string, link: string): OutgoingMail {
  return {
    to,
    kind: 'reset_password',
    subject: 'Choose a new Ohmward password',
    text:
      `Hello ${name},\n\nwe got a request to choose a new password for your account. Open this link to pick one:\n\n${link}\n\n` +
      `The link works once and for one hour. Choosing a new password signs you out on every device.\n` +
      `If you did not ask for this, ignore this mail: your password stays as it is.` +
      SIGN_OFF,
  }
}

export function changeEmailMail(to: string, name: string, link: string): OutgoingMail {
  return {
    to,
    kind: 'change_email',
    subject: 'Confirm your new e-mail address for Ohmward',
    text:
      `Hello ${name},\n\nyou asked to use this address for your Ohmward account. Open this link to confirm it:\n\n${link}\n\n` +
      `The link works once and for 24 hours. Until you open it, your old address stays in use.` +
      SIGN_OFF,
  }
}

export function emailChangeNoticeMail(to: string, name: string, newEmail: string): OutgoingMail {
  return {
    to,
    kind: 'email_change_notice',
    subject: 'Your Ohmward e-mail address is changing',
    text:
      `Hello ${name},\n\nsomeone signed in to your account asked to move it to ${newEmail}. ` +
      `The change happens only when the link we sent there is opened.\n\n` +
      `If this was not you, choose a new password now and sign out everywhere from your account page.` +
      SIGN_OFF,
  }
}

export function addressTakenMail(to: string): OutgoingMail {
  return {
    to,
    kind: 'address_taken',
    subject: 'About your Ohmward e-mail address',
    text:
      `Hello,\n\nsomeone asked to move another Ohmward account to this address, but this address already has an account of its own, ` +
      `so nothing was changed. If you want to use it for a different account, sign in and change the address there first.` +
      SIGN_OFF,
  }
}

export function passwordChangedMail(to: string, name: string): OutgoingMail {
  return {
    to,
    kind: 'password_changed',
    subject: 'Your Ohmward password was changed',
    text:
      `Hello ${name},\n\nyour password was just changed, and other devices were signed out.\n\n` +
      `If that was not you, use "Forgot your password?" on the sign-in page right away.` +
      SIGN_OFF,
  }
}
