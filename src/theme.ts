/**
 * Rungwright's look (docs/names-and-rules.md, "How it looks"): warm paper, ink-navy rails and wires, amber power
 * flow, slate grey for de-energised, violet for forced values, teal selection, red errors.
 * The canvas reads the same palette from here, so the editor and naive-ui never disagree.
 */
import type { GlobalThemeOverrides } from 'naive-ui';

export const FONT_UI = "'Inter', system-ui, -apple-system, 'Segoe UI', sans-serif";
/**
 * No text on the rung canvas is painted smaller than this, in canvas pixels at zoom 1, and the
 * canvas never zooms below 1 (docs/names-and-rules.md: canvas text is never smaller than 11 px);
 * a wide program scrolls sideways rather than shrink.
 */
export const MIN_CANVAS_TEXT_PX = 11;
export const FONT_MONO = "'JetBrains Mono', ui-monospace, 'SFMono-Regular', monospace";

export interface Palette {
  paper: string;
  ink: string;
  energised: string;
  deEnergised: string;
  forced: string;
  selection: string;
  /**
   * Links, primary buttons and the active tab: the selection's teal, deep enough in the light
   * scheme for text at 4.5:1 on the paper and the surface, and for white text on it (WCAG 2.1
   * SC 1.4.3); tests/unit/app/theme.test.ts checks it.
   */
  link: string;
  /** "Passed", "valid", "closed": success words, at 4.5:1 on the paper and the surface. */
  ok: string;
  /** "Late", "submitted": warning words in tags, at 4.5:1 on a warning tag's tint (the amber itself is too light for text in the light scheme). */
  warningText: string;
  error: string;
  surface: string;
  text: string;
  mutedText: string;
}

export const LIGHT_PALETTE: Palette = {
  paper: '#f6f1e7',
  ink: '#1f2a44',
  energised: '#d98a1c',
  deEnergised: '#8a94a6',
  forced: '#7c3aed',
  selection: '#0f9488',
  link: '#0f766e',
  ok: '#1d6b32',
  warningText: '#7a4a00',
  error: '#c62828',
  surface: '#fffdf8',
  text: '#1f2a44',
  mutedText: '#5b6477',
};

export const DARK_PALETTE: Palette = {
  paper: '#1b1f2a',
  ink: '#c9d3e6',
  energised: '#f0a63a',
  deEnergised: '#6b7487',
  forced: '#a78bfa',
  selection: '#2dd4bf',
  link: '#2dd4bf',
  ok: '#66bb6a',
  warningText: '#f0a63a',
  error: '#f26b68',
  surface: '#232838',
  text: '#e6ebf5',
  mutedText: '#9aa3b5',
};

export function themeOverrides(p: Palette): GlobalThemeOverrides {
  return {
    common: {
      fontFamily: FONT_UI,
      fontFamilyMono: FONT_MONO,
      primaryColor: p.link,
      primaryColorHover: p.link,
      primaryColorPressed: p.link,
      primaryColorSuppl: p.link,
      successColor: p.ok,
      successColorHover: p.ok,
      successColorPressed: p.ok,
      successColorSuppl: p.ok,
      errorColor: p.error,
      warningColor: p.energised,
      bodyColor: p.paper,
      cardColor: p.surface,
      modalColor: p.surface,
      popoverColor: p.surface,
      textColorBase: p.text,
      borderRadius: '6px',
    },
    Layout: { color: p.paper, headerColor: p.surface, siderColor: p.surface },
    // naive-ui's own grey for "no data" is 1.6:1 on the light paper.
    Empty: { textColor: p.mutedText },
    Tag: { textColorWarning: p.warningText },
  };
}

/**
 * The timing diagram's colours. uPlot draws on a canvas, so the trace drawer reads them from here
 * rather than from CSS. Every text colour keeps WCAG 2.1 contrast ≥ 4.5:1 on the plot's
 * background (SC 1.4.3) and every line ≥ 3:1 (SC 1.4.11); tests/unit/app/theme.test.ts checks it.
 */
export interface ChartLook {
  background: string;
  text: string;
  mutedText: string;
  /** Axis baselines and ticks. */
  axis: string;
  /** Grid lines, drawn dotted so they stay quieter than the signals at the same contrast. */
  grid: string;
  /** Signal chips and the like: a fill that text of `text` colour sits on. */
  chip: string;
  /** One colour per signal lane, in order, repeating. */
  series: readonly string[];
}

export const LIGHT_CHART: ChartLook = {
  background: LIGHT_PALETTE.surface,
  text: LIGHT_PALETTE.text,
  mutedText: LIGHT_PALETTE.mutedText,
  axis: LIGHT_PALETTE.mutedText,
  grid: '#7d8699',
  chip: '#efe9dc',
  series: ['#b36b00', '#0f766e', '#1f2a44', '#7c3aed', '#c62828', '#2e7d32', '#1565c0', '#be185d'],
};

export const DARK_CHART: ChartLook = {
  background: DARK_PALETTE.surface,
  text: DARK_PALETTE.text,
  mutedText: DARK_PALETTE.mutedText,
  axis: DARK_PALETTE.mutedText,
  grid: '#737d91',
  chip: '#343b50',
  series: ['#f0a63a', '#2dd4bf', '#c9d3e6', '#a78bfa', '#ef5350', '#66bb6a', '#64b5f6', '#f48fb1'],
};

/** WCAG 2.1 relative luminance of a `#rrggbb` colour (definition "relative luminance"). */
function relativeLuminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = Number.parseInt(hex.slice(i, i + 2), 16) / 255;
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  }) as [number, number, number];
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.1 contrast ratio of two `#rrggbb` colours, 1 to 21 (definition "contrast ratio"). */
export function contrastRatio(a: string, b: string): number {
  const [light, dark] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (light + 0.05) / (dark + 0.05);
}

/**
 * Words that carry a state in the dock's tables (the I/O status table): each keeps WCAG 2.1
 * contrast ≥ 4.5:1 on the scheme's paper (SC 1.4.3), checked in tests/unit/app/theme.test.ts.
 */
export interface StateInk {
  text: string;
  mutedText: string;
  /** A bit that is ON. */
  on: string;
  /** A contact closed, a load powered. */
  ok: string;
  /** A dead common, an open contact in the way, a bit ON whose load has no power. */
  fault: string;
  forced: string;
  /** Table rules (decoration, not held to a ratio). */
  rule: string;
}

export const LIGHT_STATE_INK: StateInk = {
  text: LIGHT_PALETTE.text,
  mutedText: LIGHT_PALETTE.mutedText,
  on: '#9a5c00',
  ok: LIGHT_PALETTE.ok,
  fault: LIGHT_PALETTE.error,
  forced: LIGHT_PALETTE.forced,
  rule: '#ddd5c4',
};

export const DARK_STATE_INK: StateInk = {
  text: DARK_PALETTE.text,
  mutedText: DARK_PALETTE.mutedText,
  on: DARK_PALETTE.energised,
  ok: DARK_PALETTE.ok,
  fault: DARK_PALETTE.error,
  forced: DARK_PALETTE.forced,
  rule: '#3a4153',
};
