/**
 * Rungwright's look (DESIGN.md, "Look and feel"): warm paper, ink-navy rails and wires, amber power
 * flow, slate grey for de-energised, violet for forced values, teal selection, red errors.
 * The canvas reads the same palette from here, so the editor and naive-ui never disagree.
 */
import type { GlobalThemeOverrides } from 'naive-ui';

export const FONT_UI = "'Inter', system-ui, -apple-system, 'Segoe UI', sans-serif";
export const FONT_MONO = "'JetBrains Mono', ui-monospace, 'SFMono-Regular', monospace";

export interface Palette {
  paper: string;
  ink: string;
  energised: string;
  deEnergised: string;
  forced: string;
  selection: string;
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
  error: '#ef5350',
  surface: '#232838',
  text: '#e6ebf5',
  mutedText: '#9aa3b5',
};

export function themeOverrides(p: Palette): GlobalThemeOverrides {
  return {
    common: {
      fontFamily: FONT_UI,
      fontFamilyMono: FONT_MONO,
      primaryColor: p.selection,
      primaryColorHover: p.selection,
      primaryColorPressed: p.selection,
      primaryColorSuppl: p.selection,
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
  };
}
