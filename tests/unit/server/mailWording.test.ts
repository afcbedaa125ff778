import { describe, expect, it } from 'vitest';
import { mailDate } from '../../../server/mail/dates';
import { invitationMail, labPublishedMail, submissionReturnedMail } from '../../../server/mail/templates';
import { finishSignUpMail } from '../../../server/mail/joinMails';

const ISO = /\d{4}-\d\d-\d\dT\d\d:\d\d/;
const when = new Date('2026-12-12T23:59:00Z');

describe('dates and numbers in e-mails', () => {
  it('writes a date as people read it, with its time zone named', () => {
    expect(mailDate(when, 'UTC')).toBe('Saturday 12 December 2026, 23:59 UTC');
    // The same moment in another zone is another local day, and says so.
    expect(mailDate(when, 'Asia/Tokyo')).toBe('Sunday 13 December 2026, 08:59 GMT+9');
  });

  it('puts no ISO timestamp in an invitation, a sign-up link or a new lab', () => {
    const mails = [
      invitationMail({ to: 'a@test.example', baseUrl: 'http://localhost:3000', token: 't', role: 'student', className: 'Motor Control 1', expiresAt: when }),
      finishSignUpMail({ to: 'a@test.example', baseUrl: 'http://localhost:3000', token: 't', className: 'Motor Control 1', expiresAt: when }),
      labPublishedMail({ to: 'a@test.example', baseUrl: 'http://localhost:3000', className: 'Motor Control 1', labTitle: 'Jogging', labId: 'l', dueAt: when }),
    ];
    for (const mail of mails) {
      expect(mail.text).not.toMatch(ISO);
      expect(mail.text).toContain('December 2026');
    }
  });

  it('says "1 point", not "1 points"', () => {
    const one = submissionReturnedMail({ to: 'a@test.example', baseUrl: 'http://x', labTitle: 'L', labId: 'l', finalScore: 1, totalPoints: 1, feedback: null });
    expect(one.text).toContain('Your score: 1 of 1 point.');
    const many = submissionReturnedMail({ to: 'a@test.example', baseUrl: 'http://x', labTitle: 'L', labId: 'l', finalScore: 3, totalPoints: 5, feedback: null });
    expect(many.text).toContain('Your score: 3 of 5 points.');
  });
});
