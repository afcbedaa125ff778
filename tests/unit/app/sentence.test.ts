import { describe, expect, it } from 'vitest';
import { asSentence } from '@/components/app/sentence';

describe('a message shown on its own', () => {
  it('starts with a capital and ends with a full stop', () => {
    expect(asSentence('this link is not valid, was used already or has expired')).toBe('This link is not valid, was used already or has expired.');
  });

  it('keeps the stop, question or exclamation mark a message already has', () => {
    expect(asSentence('The server cannot be reached; try again.')).toBe('The server cannot be reached; try again.');
    expect(asSentence('already there!')).toBe('Already there!');
  });
});
