import type { MailMessage } from './mailer'

const escape = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;')

/** Plain text and a simple, readable HTML version of the same words. */
function message(to: string, subject: string, paragraphs: string[], action?: { label: string; url: string }): MailMessage {
  const text = [...paragraphs, ...(action ? [`${action.label}: ${action.url}`] : []), '', '— Chalkline'].join('\n\n')
  const html = [
    '<!doctype html><html><body style="font-family: sans-serif; color: #12343B; background: #F2EFE6; padding: 24px; line-height: 1.5">',
    ...paragraphs.map((p) => `<p>${escape(p)}</p>`),
    action
      ? `<p><a href="${escape(action.url)}" style="display: inline-block; background: #12343B; color: #F2EFE6; padding: 12px 20px; border-radius: 6px; text-decoration: none">${escape(action.label)}</a></p><p style="font-size: 13px">Or open this address: ${escape(action.url)}</p>`
      : '',
    '<p>— Chalkline</p></body></html>',
  ].join('\n')
  return { to, subject, text, html }
}

export function invitationMail(to: string, athleteName: string, coachName: string, url: string, expiresAt: Date) {
  return message(
    to,
    `${coachName} invites you to train with Chalkline`,
    [
      `Hello ${athleteName},`,
      `${coachName} coaches with Chalkline and would like to plan and review your training. Accept the invitation to set your password (or sign in, if you already have an account) and you will see their plan on your Train tab.`,
      `The link works once and until ${expiresAt.toUTCString()}.`,
    ],
    { label: 'Accept the invitation', url },
  )
}

export function passwordResetMail(to: string, name: string, url: string, expiresAt: Date) {
  return message(
    to,
    'Set a new Chalkline password',
    [
      `Hello ${name},`,
      'Someone asked to reset the password of your Chalkline account. If it was you, choose a new password with the link below; your other signed-in devices will be signed out.',
      `The link works once and until ${expiresAt.toUTCString()}. If you did not ask for this, ignore this e-mail: your password stays as it is.`,
    ],
    { label: 'Choose a new password', url },
  )
}

export function sessionCompletedMail(to: string, coachName: string, athleteName: string, what: string, url: string) {
  return message(
    to,
    `${athleteName} finished ${what}`,
    [`Hello ${coachName},`, `${athleteName} finished ${what}. It is waiting on your review desk.`],
    { label: 'Open the review desk', url },
  )
}

export function dailyDigestMail(to: string, coachName: string, lines: string[], url: string) {
  return message(
    to,
    `${lines.length} ${lines.length === 1 ? 'session' : 'sessions'} finished today`,
    [`Hello ${coachName},`, 'Finished since your last digest:', ...lines.map((l) => `• ${l}`)],
    { label: 'Open the review desk', url },
  )
}

export function sessionReviewedMail(to: string, athleteName: string, coachName: string, what: string, comments: number, url: string) {
  return message(
    to,
    `${coachName} reviewed your ${what}`,
    [
      `Hello ${athleteName},`,
      `${coachName} reviewed your ${what}${comments > 0 ? ` and left ${comments} ${comments === 1 ? 'comment' : 'comments'}` : ''}. You will see them in your logbook and on your next session's set cards.`,
    ],
    { label: 'Open your logbook', url },
  )
}
