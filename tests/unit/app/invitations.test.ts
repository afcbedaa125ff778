import { describe, expect, it } from 'vitest';
import type { ClassSummary } from '@shared/api/classes';
import type { InvitationView, UserView } from '@shared/api/auth';
import { invitationPurpose, landingAfterAccept, tokenFromHash } from '@/components/app/invitations';

const CLASS_INVITE: InvitationView = { email: 'lee.moss@larch-hollow.example', role: 'student', name: 'Lee Moss', className: 'Motor Control 1', expiresAt: '2026-03-17T09:00:00.000Z' };
const INSTRUCTOR_INVITE: InvitationView = { email: 'r.holt@larch-hollow.example', role: 'instructor', name: null, className: null, expiresAt: '2026-03-17T09:00:00.000Z' };
const user = (role: UserView['role']): UserView => ({ id: 'u1', email: 'x@larch-hollow.example', name: 'X', role, demo: false, createdAt: '2026-03-10T09:00:00.000Z', lastSignInAt: null });
const cls = (id: string, name: string): ClassSummary => ({ id, name, term: 'Spring', instructorId: 'i1', joinCode: null, studentCount: null, demo: false, createdAt: '2026-01-01T00:00:00.000Z' });

describe('the invitation token in the link', () => {
  it('reads the token from the fragment, with or without the leading #', () => {
    expect(tokenFromHash('#token=abcDEF123_-abcDEF123')).toBe('abcDEF123_-abcDEF123');
    expect(tokenFromHash('token=abcDEF123_-abcDEF123&x=1')).toBe('abcDEF123_-abcDEF123');
  });

  it('gives null when the fragment has no token or an empty one', () => {
    expect(tokenFromHash('')).toBeNull();
    expect(tokenFromHash('#token=')).toBeNull();
    expect(tokenFromHash('#other=1')).toBeNull();
  });
});

describe('what an invitation is for', () => {
  it('names the class for a class invitation and the role otherwise', () => {
    expect(invitationPurpose(CLASS_INVITE)).toBe('join the class “Motor Control 1”');
    expect(invitationPurpose(INSTRUCTOR_INVITE)).toBe('teach on Rungwright as an instructor');
  });
});

describe('where a new account lands', () => {
  it('sends a student invited to a class to that class’s labs', () => {
    expect(landingAfterAccept(user('student'), CLASS_INVITE, [cls('c7', 'Motor Control 1')])).toBe('/classes/c7/labs');
  });

  it('falls back to My programs when the class cannot be told apart, and for instructors', () => {
    expect(landingAfterAccept(user('student'), CLASS_INVITE, [])).toBe('/programs');
    expect(landingAfterAccept(user('student'), CLASS_INVITE, [cls('a', 'Motor Control 1'), cls('b', 'Motor Control 1')])).toBe('/programs');
    expect(landingAfterAccept(user('instructor'), INSTRUCTOR_INVITE, [])).toBe('/programs');
  });
});
