import { describe, expect, it } from 'vitest';
import { DARK_PALETTE, FONT_MONO, FONT_UI, LIGHT_PALETTE, themeOverrides } from '../../../src/theme';
import { routes } from '../../../src/router/routes';

describe('the look and feel', () => {
  it('sets Inter and JetBrains Mono in the naive-ui overrides, so its v-sans default never shows', () => {
    for (const palette of [LIGHT_PALETTE, DARK_PALETTE]) {
      const common = themeOverrides(palette).common!;
      expect(common.fontFamily).toBe(FONT_UI);
      expect(common.fontFamilyMono).toBe(FONT_MONO);
      expect(FONT_UI.startsWith("'Inter'")).toBe(true);
      expect(FONT_MONO.startsWith("'JetBrains Mono'")).toBe(true);
    }
  });

  it('keeps selection teal and forced violet distinct from the amber power flow in both schemes', () => {
    for (const p of [LIGHT_PALETTE, DARK_PALETTE]) {
      const colours = new Set([p.energised, p.deEnergised, p.forced, p.selection, p.error, p.ink]);
      expect(colours.size).toBe(6);
    }
  });

  it('lazy-loads every routed view, so the sign-in page does not carry the canvas code', () => {
    const withComponents = routes.filter((r) => 'component' in r && r.component);
    expect(withComponents.length).toBeGreaterThan(1);
    for (const route of withComponents) expect(typeof route.component).toBe('function');
  });
});
