import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { ApiFailure } from '@/api/http';
import { useFieldErrors } from '@/components/app/useFieldErrors';

const Schema = z.object({ email: z.string().min(1, 'enter an address').email('not a valid e-mail address'), name: z.string().min(1, 'a name, please') });

describe('a form’s messages under its fields', () => {
  it('shows the first message of each failing field and gives no value', () => {
    const form = useFieldErrors();
    expect(form.check(Schema, { email: '', name: '' })).toBeNull();
    expect(form.fieldErrors.value).toEqual({ email: 'enter an address', name: 'a name, please' });
    expect(form.status('email')).toBe('error');
  });

  it('clears the messages and gives the parsed value once the fields are right', () => {
    const form = useFieldErrors();
    form.check(Schema, { email: 'x', name: '' });
    expect(form.check(Schema, { email: 'ana@example.org', name: 'Ana' })).toEqual({ email: 'ana@example.org', name: 'Ana' });
    expect(form.fieldErrors.value).toEqual({});
    expect(form.status('email')).toBeUndefined();
  });

  it('takes a server refusal’s field messages, and says when the refusal named none', () => {
    const form = useFieldErrors();
    expect(form.fromFailure(new ApiFailure('conflict', 'taken', 409, { email: 'this address has an account' }))).toBe(true);
    expect(form.fieldErrors.value).toEqual({ email: 'this address has an account' });
    expect(form.fromFailure(new ApiFailure('network', 'The server cannot be reached', 0))).toBe(false);
    expect(form.fieldErrors.value).toEqual({});
    expect(form.fromFailure(new Error('boom'))).toBe(false);
  });
});
