import type { OutgoingMail } from '../../services/mail'

const SIGN_OFF = '\n\nSafe travels,\nOhmward'

export interface ReviewMailContext {
  to: string
  name: string
  vehicle: string
  scenario: string
  link: string
}

const mail = (kind: string, c: ReviewMailContext, subject: string, body: string): OutgoingMail => ({
  to: c.to,
  kind,
  subject,
  text: `Hello ${c.name},\n\n${body}\n\nOpen the review: ${c.link}` + SIGN_OFF,
})

export const reviewMails = {
  newRequest: (c: ReviewMailContext, client: string, message: string) =>
    mail(
      'review_requested',
      c,
      `${client} asks you to review “${c.scenario}”`,
      `${client} asks you to review the scenario “${c.scenario}” of “${c.vehicle}”. Their message:\n\n“${message}”\n\nYou can read the vehicle and its scenarios while the review is open.`,
    ),
  paid: (c: ReviewMailContext, advisor: string) =>
    mail(
      'review_paid',
      c,
      `Payment received: ${advisor} can start on “${c.scenario}”`,
      `your payment went through. ${advisor} has been told and can now read “${c.vehicle}” to review “${c.scenario}”.`,
    ),
  paymentFailed: (c: ReviewMailContext) =>
    mail(
      'review_payment_failed',
      c,
      `Your payment for the review of “${c.scenario}” did not go through`,
      `the payment did not go through, so nothing was charged and the review has not started. You can try again from the review page.`,
    ),
  started: (c: ReviewMailContext, advisor: string) =>
    mail(
      'review_started',
      c,
      `${advisor} started reviewing “${c.scenario}”`,
      `${advisor} started on your review of “${c.scenario}”.`,
    ),
  comment: (c: ReviewMailContext, author: string, pinned: string, body: string) =>
    mail(
      'review_comment',
      c,
      `${author} commented on ${pinned} in “${c.scenario}”`,
      `${author} wrote about ${pinned}:\n\n“${body}”\n\nYou can reply in the thread.`,
    ),
  answered: (c: ReviewMailContext, advisor: string, verdict: string, summary: string) =>
    mail(
      'review_answered',
      c,
      `${advisor} answered your review of “${c.scenario}”: ${verdict}`,
      `${advisor} finished the review of “${c.scenario}”.\n\nVerdict: ${verdict}\n\n${summary}`,
    ),
  closed: (c: ReviewMailContext, by: string) =>
    mail(
      'review_closed',
      c,
      `The review of “${c.scenario}” is closed`,
      `${by} closed the review of “${c.scenario}”. The thread stays readable.`,
    ),
  cancelled: (c: ReviewMailContext, by: string, refund: boolean) =>
    mail(
      'review_cancelled',
      c,
      `The review of “${c.scenario}” was cancelled`,
      `${by} cancelled the review of “${c.scenario}” before it started.${refund ? ' The fee is being refunded in full.' : ''}`,
    ),
  declined: (c: ReviewMailContext, advisor: string, refund: boolean) =>
    mail(
      'review_declined',
      c,
      `${advisor} cannot take the review of “${c.scenario}”`,
      `${advisor} declined the review of “${c.scenario}”.${refund ? ' The fee is being refunded in full.' : ''} You can ask another advisor from the directory.`,
    ),
  refunded: (c: ReviewMailContext, amount: string) =>
    mail(
      'review_refunded',
      c,
      `Refund done for the review of “${c.scenario}”`,
      `the fee of ${amount} has been refunded in full.`,
    ),
}
