import { describe, expect, it } from 'vitest';
import type { UserView } from '@shared/api/auth';
import type { InvitationView } from '@shared/api/invitations';
import {
  existingAccountStep,
  forgetInvitation,
  invitationPurpose,
  landingAfterAccept,
  rememberedInvitation,
  rememberInvitation,
  tokenFromHash,
} from '@/components/app/invitations';

const EXPIRES = '2026-03-17T09:00:00.000Z';
const CLASS_INVITE: InvitationView = { email: 'lee.moss@larch-hollow.example', role: 'student', name: 'Lee Moss', classId: 'c7', className: 'Motor Control 1', expiresAt: EXPIRES, hasAccount: true };
const INSTRUCTOR_INVITE: InvitationView = { email: 'r.holt@larch-hollow.example', role: 'instructor', name: null, classId: null, className: null, expiresAt: EXPIRES, hasAccount: true };
const user = (role: UserView['role']): UserView => ({ id: 'u1', email: 'x@larch-hollow.example', name: 'X', role, demo: false, createdAt: '2026-03-10T09:00:00.000Z', lastSignInAt: null });

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
  it('sends a student invited to a class to that class’s labs, and an instructor to My programs', () => {
    expect(landingAfterAccept(user('student'), CLASS_INVITE)).toBe('/classes/c7/labs');
    expect(landingAfterAccept(user('instructor'), INSTRUCTOR_INVITE)).toBe('/programs');
  });
});

describe('what the page offers an address that has an account', () => {
  const invited = { ...user('student'), email: 'Lee.Moss@larch-hollow.example' };

  it('asks nobody signed in to sign in first, and offers the invited student account the join', () => {
    expect(existingAccountStep(CLASS_INVITE, null)).toBe('sign-in');
    expect(existingAccountStep(CLASS_INVITE, invited)).toBe('join');
  });

  it('tells someone else signed in that it is another address, and an instructor or admin of that address that only students join', () => {
    expect(existingAccountStep(CLASS_INVITE, user('student'))).toBe('someone-else');
    expect(existingAccountStep(CLASS_INVITE, { ...invited, role: 'instructor' })).toBe('not-a-student');
    expect(existingAccountStep(CLASS_INVITE, { ...invited, role: 'admin' })).toBe('not-a-student');
  });

  it('says an account invitation is not for an address with an account, whoever is signed in', () => {
    expect(existingAccountStep(INSTRUCTOR_INVITE, null)).toBe('not-for-accounts');
    expect(existingAccountStep(INSTRUCTOR_INVITE, user('instructor'))).toBe('not-for-accounts');
  });
});

describe('the invitation kept while the person signs in', () => {
  function memoryStorage(): Storage {
    const items = new Map<string, string>();
    return {
      get length() {
        return items.size;
      },
      clear: () => items.clear(),
      getItem: (k) => items.get(k) ?? null,
      key: (i) => [...items.keys()][i] ?? null,
      removeItem: (k) => void items.delete(k),
      setItem: (k, v) => void items.set(k, v),
    };
  }

  it('is kept, read back and forgotten', () => {
    const storage = memoryStorage();
    expect(rememberedInvitation(storage)).toBeNull();
    rememberInvitation('abcDEF123_-abcDEF123', storage);
    expect(rememberedInvitation(storage)).toBe('abcDEF123_-abcDEF123');
    forgetInvitation(storage);
    expect(rememberedInvitation(storage)).toBeNull();
  });

  it('does without storage that refuses', () => {
    const refuse = (): never => {
      throw new Error('storage refused');
    };
    const refusing = { ...memoryStorage(), setItem: refuse, getItem: refuse } as Storage;
    expect(() => rememberInvitation('abcDEF123_-abcDEF123', refusing)).not.toThrow();
    expect(rememberedInvitation(refusing)).toBeNull();
  });
});
