/**
 * Who is signed in. Loaded once from `GET /api/me` (a 401 there simply means "nobody"), then kept
 * up to date by sign-in, accepted invitations and finished sign-ups, and sign-out. Route guards read it (see `router/guards.ts`).
 */
import { defineStore } from 'pinia';
import { computed, ref, shallowRef } from 'vue';
import type { SignInRequest, UserView } from '@shared/api';
import { api } from '@/api/instance';
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

  async function signOut(): Promise<void> {
    try {
      await api.signOut();
    } finally {
      user.value = null;
    }
  }

  /** The server said the session is gone: forget the user without asking again. */
  function expire(): void {
    user.value = null;
    checked.value = true;
  }

  return { user, checked, signedIn, refresh, ensure, signIn, signedInAs, signOut, expire };
});
