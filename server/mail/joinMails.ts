/**
 * The e-mails of joining a class: a class invitation to an address that has an account, and the
 * two answers to a sign-up (finish creating the account; or this address has one already). The
 * invitation to an address without an account is `invitationMail` in `templates.ts`. Only the
 * owner of the address reads these, so they may say whether it has an account; the web answers
 * never do.
 */
import type { OutgoingMail } from './mailer';
import { compose } from './templates';

/** A class invitation to an address with an account: the link joins the class once signed in as it. */
export function classInvitationForAccountMail(a: { to: string; baseUrl: string; token: string; className: string; expiresAt: Date }): OutgoingMail {
  return compose(
    a.to,
    `You are invited to ${a.className}`,
    [
      `You have been invited to join the class "${a.className}" on Rungwright.`,
      'This address has a Rungwright account already: open the link, sign in with this address if you are not signed in, and choose to join the class. Nothing changes until you do.',
      `The link works once and until ${a.expiresAt.toISOString()}.`,
    ],
    { url: `${a.baseUrl}/accept-invitation#token=${a.token}`, label: 'Join the class' },
  );
}

/** The link that finishes a sign-up: the person chooses their password there, and joins the class. */
export function finishSignUpMail(a: { to: string; baseUrl: string; token: string; className: string; expiresAt: Date }): OutgoingMail {
  return compose(
    a.to,
    'Finish creating your Rungwright account',
    [
      `Someone, probably you, asked to create a Rungwright account with this address and join the class "${a.className}".`,
      `Open the link to choose your password; your account is made and joins the class then. The link works once and until ${a.expiresAt.toISOString()}.`,
      'If it was not you, ignore this message: no account is made.',
    ],
    { url: `${a.baseUrl}/join/finish#token=${a.token}`, label: 'Choose your password' },
  );
}

/** The answer to a sign-up with an address that has an account: sign in (or reset), then join with the code. */
export function accountExistsMail(a: { to: string; baseUrl: string; className: string }): OutgoingMail {
  return compose(
    a.to,
    'You already have a Rungwright account',
    [
      `Someone, probably you, asked to create a Rungwright account with this address and join the class "${a.className}". This address has an account already, so no new one was made.`,
      'To join the class, sign in, open Classes and enter the join code you were given. If you do not remember your password, the sign-in page has a link to reset it.',
      'If it was not you, ignore this message: nothing changed.',
    ],
    { url: `${a.baseUrl}/sign-in`, label: 'Sign in' },
  );
}
