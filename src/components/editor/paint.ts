/**
 * Paints a draw list (`editor/drawList.ts`) onto a Konva scene context. The only code that turns
 * primitives into canvas calls; colours and fonts come from the theme palette. Text is never
 * painted below `MIN_CANVAS_TEXT_PX`, whatever size the draw list asks for.
 */
import type { Context } from 'konva/lib/Context';
import { FONT_MONO, FONT_UI, MIN_CANVAS_TEXT_PX, type Palette } from '@/theme';
import type { DrawOp, FontRole, InkRole } from '@/editor/drawList';

export function inkColour(palette: Palette, ink: InkRole): string {
  const table = { ink: palette.ink, muted: palette.mutedText, label: palette.text, paper: palette.paper } satisfies Record<InkRole, string>;
  return table[ink];
}

const FONTS = {
  ui: (size: number) => `400 ${size}px ${FONT_UI}`,
  uiStrong: (size: number) => `600 ${size}px ${FONT_UI}`,
  mono: (size: number) => `400 ${size}px ${FONT_MONO}`,
  note: (size: number) => `italic 400 ${size}px ${FONT_UI}`,
} satisfies Record<FontRole, (size: number) => string>;

/** Cut text to fit `maxWidth`, ending in an ellipsis. */
function fitText(ctx: Context, value: string, maxWidth: number): string {
  if (ctx.measureText(value).width <= maxWidth) return value;
  let end = value.length;
  while (end > 1 && ctx.measureText(`${value.slice(0, end)}…`).width > maxWidth) end -= 1;
  return `${value.slice(0, end)}…`;
}

export function paintOps(ctx: Context, ops: readonly DrawOp[], palette: Palette): void {
  ctx.setAttr('lineCap', 'butt');
  ctx.setAttr('textBaseline', 'top');
  for (const op of ops) {
    switch (op.op) {
      case 'line': {
        ctx.beginPath();
        ctx.moveTo(op.points[0] ?? 0, op.points[1] ?? 0);
        for (let i = 2; i + 1 < op.points.length; i += 2) ctx.lineTo(op.points[i] as number, op.points[i + 1] as number);
        ctx.setAttr('strokeStyle', inkColour(palette, op.ink));
        ctx.setAttr('lineWidth', op.width);
        ctx.stroke();
        break;
      }
      case 'arc':
        ctx.beginPath();
        ctx.arc(op.x, op.y, op.r, op.from, op.to, false);
        ctx.setAttr('strokeStyle', inkColour(palette, op.ink));
        ctx.setAttr('lineWidth', op.width);
        ctx.stroke();
        break;
      case 'rect':
        if (op.fill) {
          ctx.setAttr('fillStyle', inkColour(palette, op.fill));
          ctx.fillRect(op.x, op.y, op.w, op.h);
        }
        ctx.setAttr('strokeStyle', inkColour(palette, op.ink));
        ctx.setAttr('lineWidth', op.width);
        ctx.strokeRect(op.x, op.y, op.w, op.h);
        break;
      case 'text':
        ctx.setAttr('font', FONTS[op.font](Math.max(op.size, MIN_CANVAS_TEXT_PX)));
        ctx.setAttr('fillStyle', inkColour(palette, op.ink));
        ctx.setAttr('textAlign', op.align);
        ctx.fillText(fitText(ctx, op.text, op.maxWidth), op.x, op.y);
        break;
    }
  }
}
