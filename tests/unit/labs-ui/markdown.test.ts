import { describe, expect, it } from 'vitest';
import { STANDARD_LABS } from '@shared/labs';
import { briefHasCaution } from '@/components/labs/markdown';

// Rendering and sanitising need a real DOM (DOMPurify under happy-dom kept event handlers and
// dropped headings here), so they are checked in Chromium by tests/e2e/labs.test.ts.
describe('the safety caution of a lab brief', () => {
  it('is found at the end of every standard lab brief', () => {
    for (const lab of STANDARD_LABS) expect(briefHasCaution(lab.brief), lab.id).toBe(true);
  });

  it('is missing from a brief that says nothing about lockout, so the page adds it', () => {
    expect(briefHasCaution('# A lab\n\nPress S2 and watch K1.')).toBe(false);
  });
});
