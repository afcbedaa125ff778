import { describe, expect, it } from 'vitest';
import { counted } from '@/components/app/counted';

describe('counted', () => {
  it('puts the noun in the number the count asks for', () => {
    expect([counted(1, 'step'), counted(3, 'hidden check'), counted(0, 'problem'), counted(2, 'box', 'boxes')]).toEqual(['1 step', '3 hidden checks', '0 problems', '2 boxes']);
  });
});
