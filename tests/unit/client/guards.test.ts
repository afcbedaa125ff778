import { describe, expect, it } from 'vitest';
import { decideAccess, HOME_ROUTE, homePathFor, safeNext } from '@/router/guards';
import { ANA } from './fakeFetch';

const instructor = { ...ANA, role: 'instructor' as const };

describe('decideAccess', () => {
  it('sends a signed-out visitor of a private page to sign-in, carrying the address in next', () => {
    expect(decideAccess({}, null, '/programs/p1?tab=tags')).toEqual({ allow: false, redirect: { name: 'sign-in', query: { next: '/programs/p1?tab=tags' } } });
  });

  it('lets anyone open a public page', () => {
    expect(decideAccess({ public: true }, null, '/simulator')).toEqual({ allow: true });
    expect(decideAccess({ public: true }, ANA, '/simulator')).toEqual({ allow: true });
  });

  it('keeps signed-in users off the guest-only pages, sending them to their programs', () => {
    expect(decideAccess({ guestOnly: true }, null, '/sign-in')).toEqual({ allow: true });
    expect(decideAccess({ guestOnly: true }, ANA, '/sign-in')).toEqual({ allow: false, redirect: { name: HOME_ROUTE } });
  });

  it('lands each role on its own page: a student on their programs, an instructor on the class overview, an admin on the console', () => {
    expect(decideAccess({ guestOnly: true }, instructor, '/sign-in')).toEqual({ allow: false, redirect: { name: 'overview' } });
    expect(decideAccess({ guestOnly: true }, { ...ANA, role: 'admin' }, '/sign-in')).toEqual({ allow: false, redirect: { name: 'admin' } });
    expect([homePathFor(ANA), homePathFor(instructor), homePathFor({ role: 'admin' })]).toEqual(['/programs', '/overview', '/admin']);
  });

  it('admits only the roles a page names', () => {
    const meta = { roles: ['instructor', 'admin'] as const };
    expect(decideAccess(meta, instructor, '/classes')).toEqual({ allow: true });
    expect(decideAccess(meta, ANA, '/classes')).toEqual({ allow: false, redirect: { name: HOME_ROUTE } });
    expect(decideAccess(meta, null, '/classes')).toMatchObject({ allow: false, redirect: { name: 'sign-in' } });
  });
});

describe('safeNext', () => {
  it('accepts a path inside the app', () => {
    expect(safeNext('/programs/p1')).toBe('/programs/p1');
    expect(safeNext('/programs?sort=title#top')).toBe('/programs?sort=title#top');
  });

  it('refuses addresses that would leave the app or loop back to sign-in', () => {
    for (const bad of ['//evil.example/x', 'https://evil.example', '/\\evil.example', 'programs', '', '/sign-in?next=/x']) {
      expect(safeNext(bad), bad).toBeNull();
    }
  });

  it('refuses anything that is not one string (a repeated query parameter gives an array)', () => {
    expect(safeNext(['/a', '/b'])).toBeNull();
    expect(safeNext(undefined)).toBeNull();
    expect(safeNext(42)).toBeNull();
  });
});
