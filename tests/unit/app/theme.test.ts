import { describe, expect, it } from 'vitest';
import {
  contrastRatio,
  DARK_CHART,
  DARK_PALETTE,
  DARK_STATE_INK,
  FONT_MONO,
  FONT_UI,
  LIGHT_CHART,
  LIGHT_PALETTE,
  LIGHT_STATE_INK,
  themeOverrides,
} from '../../../src/theme';
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

describe('the timing diagram colours', () => {
  it('computes WCAG 2.1 contrast ratios (definition "contrast ratio": black on white is 21:1, a colour on itself 1:1)', () => {
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrastRatio('#ffffff', '#000000')).toBeCloseTo(21, 5);
    expect(contrastRatio('#1f2a44', '#1f2a44')).toBe(1);
    // #767676 on white is the usual example of just passing 4.5:1 (common practice).
    expect(contrastRatio('#767676', '#ffffff')).toBeGreaterThan(4.5);
    expect(contrastRatio('#777777', '#ffffff')).toBeLessThan(4.5);
  });

  it.each([
    ['light', LIGHT_CHART],
    ['dark', DARK_CHART],
  ])('reads well in the %s scheme: text ≥ 4.5:1 (WCAG 2.1 SC 1.4.3), lines ≥ 3:1 (SC 1.4.11)', (_scheme, look) => {
    for (const text of [look.text, look.mutedText]) expect(contrastRatio(text, look.background)).toBeGreaterThanOrEqual(4.5);
    expect(contrastRatio(look.text, look.chip)).toBeGreaterThanOrEqual(4.5);
    for (const line of [look.axis, look.grid, ...look.series]) expect(contrastRatio(line, look.background)).toBeGreaterThanOrEqual(3);
    expect(new Set(look.series).size).toBe(look.series.length);
  });
});

describe('the state words of the I/O status table', () => {
  it.each([
    ['light', LIGHT_STATE_INK, LIGHT_PALETTE.paper],
    ['dark', DARK_STATE_INK, DARK_PALETTE.paper],
  ])('read at ≥ 4.5:1 on the %s paper (WCAG 2.1 SC 1.4.3)', (_scheme, ink, paper) => {
    for (const colour of [ink.text, ink.mutedText, ink.on, ink.ok, ink.fault, ink.forced]) expect(contrastRatio(colour, paper)).toBeGreaterThanOrEqual(4.5);
  });

  // The same ink names errors and warnings in the messages, inspector and tag table (App.vue's
  // --rw-error / --rw-warning), which sit on the surface as well as on the paper.
  it.each([
    ['light', LIGHT_STATE_INK, LIGHT_PALETTE.surface],
    ['dark', DARK_STATE_INK, DARK_PALETTE.surface],
  ])('name errors and warnings at ≥ 4.5:1 on the %s surface too (WCAG 2.1 SC 1.4.3)', (_scheme, ink, surface) => {
    for (const colour of [ink.fault, ink.on]) expect(contrastRatio(colour, surface)).toBeGreaterThanOrEqual(4.5);
  });
});

describe('links, primary buttons, the active tab and success words', () => {
  it.each([
    ['light', LIGHT_PALETTE],
    ['dark', DARK_PALETTE],
  ])('read at ≥ 4.5:1 on the %s paper and surface (WCAG 2.1 SC 1.4.3)', (_scheme, palette) => {
    for (const colour of [palette.link, palette.ok]) {
      expect(contrastRatio(colour, palette.paper)).toBeGreaterThanOrEqual(4.5);
      expect(contrastRatio(colour, palette.surface)).toBeGreaterThanOrEqual(4.5);
    }
  });

  it('carries white text at ≥ 4.5:1 on a light-scheme primary button (WCAG 2.1 SC 1.4.3)', () => {
    expect(contrastRatio('#ffffff', LIGHT_PALETTE.link)).toBeGreaterThanOrEqual(4.5);
    // The selection's own teal would not: it stays for outlines, which need 3:1 (SC 1.4.11).
    expect(contrastRatio('#ffffff', LIGHT_PALETTE.selection)).toBeLessThan(4.5);
    expect(contrastRatio(LIGHT_PALETTE.selection, LIGHT_PALETTE.paper)).toBeGreaterThanOrEqual(3);
  });
});
