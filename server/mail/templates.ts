/**
 * The e-mails the server sends, each with a plain-text and an HTML body. Links carry the one-time
 * token in the URL fragment (`#token=`), which browsers never send to the server, so tokens stay
 * out of access logs.
 */
import type { OutgoingMail } from './mailer';

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
}

/** A mail of plain paragraphs and one link, as text and as HTML. */
export function compose(to: string, subject: string, paragraphs: string[], link: { url: string; label: string }): OutgoingMail {
  const text = [...paragraphs, '', `${link.label}: ${link.url}`, '', '— Rungwright'].join('\n');
  const html = [
    ...paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    `<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>`,
    '<p>— Rungwright</p>',
  ].join('\n');
  return { to, subject, text, html };
}

export function invitationMail(a: { to: string; baseUrl: string; token: string; role: string; className: string | null; expiresAt: Date }): OutgoingMail {
  const what = a.className ? `join the class "${a.className}" on Rungwright` : `use Rungwright as ${a.role === 'instructor' ? 'an instructor' : `a ${a.role}`}`;
  return compose(
    a.to,
    a.className ? `You are invited to ${a.className}` : 'Your Rungwright invitation',
    [`You have been invited to ${what}.`, `The link works once and until ${a.expiresAt.toISOString()}.`],
    { url: `${a.baseUrl}/accept-invitation#token=${a.token}`, label: 'Set your password' },
  );
}

export function passwordResetMail(a: { to: string; baseUrl: string; token: string }): OutgoingMail {
  return compose(
    a.to,
    'Reset your Rungwright password',
    ['Someone asked to reset the password of this Rungwright account.', 'The link works once, for one hour. If it was not you, ignore this message.'],
    { url: `${a.baseUrl}/reset-password#token=${a.token}`, label: 'Choose a new password' },
  );
}

export function labPublishedMail(a: { to: string; baseUrl: string; className: string; labTitle: string; labId: string; dueAt: Date | null }): OutgoingMail {
  const due = a.dueAt ? `It is due ${a.dueAt.toISOString()}.` : 'It has no due date.';
  return compose(a.to, `New lab in ${a.className}: ${a.labTitle}`, [`A new lab, "${a.labTitle}", is open in ${a.className}.`, due], {
    url: `${a.baseUrl}/labs/${a.labId}`,
    label: 'Open the lab',
  });
}

export function submissionReturnedMail(a: { to: string; baseUrl: string; labTitle: string; labId: string; finalScore: number | null; totalPoints: number; feedback: string | null }): OutgoingMail {
  const score = a.finalScore === null ? 'It has no score.' : `Your score: ${a.finalScore} of ${a.totalPoints} points.`;
  const paragraphs = [`Your submission to "${a.labTitle}" was returned.`, score];
  if (a.feedback) paragraphs.push(`Feedback: ${a.feedback}`);
  return compose(a.to, `Returned: ${a.labTitle}`, paragraphs, { url: `${a.baseUrl}/labs/${a.labId}`, label: 'See the grade report' });
}
