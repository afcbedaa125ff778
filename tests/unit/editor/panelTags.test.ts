import { describe, expect, it } from 'vitest';
import { REVERSING_CONVEYOR } from '@shared/field/panels';
import { missingPanelTags, panelTags } from '@/editor/panelTags';

describe('default tags from the reversing-conveyor panel', () => {
  const tags = panelTags(REVERSING_CONVEYOR);
  const byName = Object.fromEntries(tags.map((t) => [t.name, t.address]));

  it('names each input device by its reference designation, as wired in docs/names-and-rules.md', () => {
    expect(byName).toMatchObject({ S1: '%IX1', S2: '%IX2', S3: '%IX3', S4: '%IX4', B1: '%IX5', F1: '%IX6' });
  });

  it('gives a contactor its coil output under its own name and its auxiliary contact an _AUX tag', () => {
    expect(byName).toMatchObject({ K1: '%QX1', K2: '%QX2', K1_AUX: '%IX7', K2_AUX: '%IX8' });
  });

  it('offers every address at most once and only what is not declared yet', () => {
    const addresses = tags.map((t) => t.address);
    expect(new Set(addresses).size).toBe(addresses.length);
    const missing = missingPanelTags(REVERSING_CONVEYOR, [{ name: 'stop', address: '%IX9', comment: '' }, { name: 'Fwd', address: '%ix2', comment: '' }]);
    expect(missing.map((t) => t.name)).not.toContain('S2');
    expect(missing.map((t) => t.name)).toContain('S1');
  });
});
