/**
 * Who is signed in. Loaded once from `GET /api/me` (a 401 there simply means "nobody"), then kept
 * up to date by sign-in, accepted invitations, finished sign-ups and sign-out. Route guards read it
 * (see `router/guards.ts`). Forgetting the user also empties the query cache (`SessionWatcher` →
 * `cacheOwner.ts`).
 */
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { SignInRequest, UserView } from '@shared/api';
import { api } from '@/api/instance';
import { accountsApi } from '@/api/authAccounts';
import { bootReads } from '@/api/bootReads';
import { ApiFailure } from '@/api/http';

export const useSessionStore = defineStore('session', () => {
  const user = shallowRef<UserView | null>(null);
  /** True once `/api/me` has answered (signed in or not). */
  const checked = ref(false);
  const signedIn = computed(() => user.value !== null);

  async function refresh(): Promise<UserView | null> {
    try {
      user.value = (await api.me()).user;
    } catch (error) {
      if (!(error instanceof ApiFailure) || error.status !== 401) throw error;
      user.value = null;
    } finally {
      checked.value = true;
    }
    return user.value;
  }

  /** The user, asking the server the first time only. */
  async function ensure(): Promise<UserView | null> {
    return checked.value ? user.value : refresh();
  }

  async function signIn(request: SignInRequest): Promise<UserView> {
    user.value = (await api.signIn(request)).user;
    checked.value = true;
    return user.value;
  }

  /** Another call signed this user in (accepting an invitation or finishing a sign-up answers with the new user). */
  function signedInAs(signedIn: UserView): void {
    user.value = signedIn;
    checked.value = true;
  }

  /** Nobody is signed in any more: forget the user and any answer read ahead for them. */
  function forget(): void {
    user.value = null;
    checked.value = true;
    bootReads.drop();
  }

  /**
   * Signs out on the server, then here. When the server cannot be reached the session is still
   * open there (its cookie cannot be removed from script), so the user stays signed in and the
   * failure is passed on: on a shared computer, "signed out" must be true.
   */
  async function signOut(): Promise<void> {
    try {
      await api.signOut();
    } catch (error) {
      // A 401 means the session had ended already: signed out all the same.
      if (!(error instanceof ApiFailure) || error.status !== 401) throw error;
    }
    forget();
  }

  /** Ends every session of this user, on every computer, this one included. */
  async function signOutEverywhere(): Promise<void> {
    await accountsApi.signOutEverywhere();
    forget();
  }

  /** The server said the session is gone: forget the user without asking again. */
  function expire(): void {
    forget();
  }

  return { user, checked, signedIn, refresh, ensure, signIn, signedInAs, signOut, signOutEverywhere, expire };
});
