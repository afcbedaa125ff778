import { describe, expect, it } from 'vitest';
import { ApiFailure } from '@/api/http';
import { createAppQueryClient, shouldRetry } from '@/api/queryClient';

describe('retrying a failed read', () => {
  it('does not retry an answer the server gave on purpose: not found, forbidden, invalid, unexpected shape', () => {
    expect(shouldRetry(0, new ApiFailure('not_found', 'This lab does not exist or is not open to you', 404))).toBe(false);
    expect(shouldRetry(0, new ApiFailure('forbidden', 'no', 403))).toBe(false);
    expect(shouldRetry(0, new ApiFailure('validation', 'bad', 400))).toBe(false);
    expect(shouldRetry(0, new ApiFailure('bad_response', 'The answer from /api/x is not as expected', 200))).toBe(false);
  });

  it('retries a lost connection and a server error, twice at most', () => {
    const offline = new ApiFailure('network', 'The server cannot be reached', 0);
    const broken = new ApiFailure('internal', 'Something failed on the server', 500);
    expect([0, 1, 2].map((n) => shouldRetry(n, offline))).toEqual([true, true, false]);
    expect([0, 1, 2].map((n) => shouldRetry(n, broken))).toEqual([true, true, false]);
    expect(shouldRetry(0, new ApiFailure('bad_response', 'The server answered 502 Bad Gateway.', 502))).toBe(true);
  });

  it('is the policy of the client the app installs', () => {
    expect(createAppQueryClient().getDefaultOptions().queries?.retry).toBe(shouldRetry);
  });
});
