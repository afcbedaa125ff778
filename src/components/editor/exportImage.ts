/**
 * The whole program as one PNG (Konva `toDataURL`), for export and printing. The canvas on screen
 * draws only the rungs in view, so the image is painted on its own off-screen stage, from the same
 * draw lists.
 */
import Konva from 'konva/lib/Core';
import { Rect } from 'konva/lib/shapes/Rect';
import type { Context } from 'konva/lib/Context';
import type { Palette } from '@/theme';
import { rungOps } from '@/editor/drawList';
import type { ProgramLayout } from '@/editor/layoutTypes';
import { paintOps } from './paint';

/** Browsers refuse canvases much taller than this (px); taller programs are scaled down to fit. */
const MAX_CANVAS_PX = 16_000;

export function programPng(layout: ProgramLayout, palette: Palette, pixelRatio = 2): string {
  const container = document.createElement('div');
  const width = Math.ceil(layout.width);
  const height = Math.ceil(layout.height + 16);
  const stage = new Konva.Stage({ container, width, height });
  const layer = new Konva.Layer();
  layer.add(new Rect({ x: 0, y: 0, width, height, fill: palette.paper }));
  for (const rung of layout.rungs) {
    const ops = rungOps(rung, layout);
    layer.add(new Konva.Shape({ y: rung.top, sceneFunc: (ctx: Context) => paintOps(ctx, ops, palette) }));
  }
  stage.add(layer);
  const ratio = Math.min(pixelRatio, MAX_CANVAS_PX / height, MAX_CANVAS_PX / width);
  const url = stage.toDataURL({ pixelRatio: ratio, mimeType: 'image/png' });
  stage.destroy();
  return url;
}
