import { describe, expect, it } from 'vitest';
import { ref } from 'vue';
import { QueryClient } from '@tanstack/vue-query';
import { clearCacheOnUserChange } from '@/api/cacheOwner';

function setup(first: string | null) {
  const userId = ref<string | null>(first);
  const queryClient = new QueryClient();
  const stop = clearCacheOnUserChange(queryClient, userId);
  const cached = () => queryClient.getQueryData(['programs']);
  queryClient.setQueryData(['programs'], [{ id: 'p1', title: 'Ana’s conveyor' }]);
  return { userId, cached, stop };
}

describe('the query cache on a shared computer', () => {
  it('is emptied the moment a user signs out', () => {
    const { userId, cached } = setup('ana');
    userId.value = null;
    expect(cached()).toBeUndefined();
  });

  it('is emptied when another user takes over without signing out first', () => {
    const { userId, cached } = setup('ana');
    userId.value = 'tom';
    expect(cached()).toBeUndefined();
  });

  it('is kept while the same user stays, and when someone signs in from nobody', () => {
    const same = setup('ana');
    same.userId.value = 'ana';
    expect(same.cached()).toBeDefined();
    const fresh = setup(null);
    fresh.userId.value = 'ana';
    expect(fresh.cached()).toBeDefined();
  });
});
