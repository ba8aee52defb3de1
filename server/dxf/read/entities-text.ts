// POINT, TEXT and MTEXT entities: points and notes.
import type { IMtextEntity, IPoint, IPointEntity, ITextEntity } from 'dxf-parser';
import type { Affine } from '../../../shared/geometry/transform';
import type { DxfPoint } from './types';
import type { ReadContext } from './context';
import { mtextValue, textValue } from './text';

export function readPoint(ctx: ReadContext, e: IPointEntity, m: Affine, layer: string): void {
  const p = e.position;
  if (!p) {
    ctx.warn('POINT entities without a position were skipped.');
    return;
  }
  const v = ctx.vertex(m, p.x, p.y) as DxfPoint;
  v.layer = layer;
  ctx.ext.add(v.x, v.y);
  ctx.points.push(v);
  ctx.counted(layer);
}

export function note(ctx: ReadContext, m: Affine, p: IPoint, height: number | undefined, text: string, layer: string): void {
  const v = ctx.vertex(m, p.x, p.y);
  const h = Number.isFinite(height) ? (height as number) : 0;
  // Height measured along the text's y direction after the insert's scaling.
  const scale = m.kind === 0 ? 1 : Math.hypot(m.c, m.d);
  ctx.notes.push({ text, x: v.x, y: v.y, height: h * scale, layer });
  ctx.counted(layer);
}

export function readText(ctx: ReadContext, e: ITextEntity, m: Affine, layer: string, offset: number | undefined): void {
  const p = e.startPoint;
  if (!p) {
    ctx.warn('TEXT entities without an insertion point were skipped.');
    return;
  }
  const mm = ctx.inRereadOcs(m, offset, p.z ?? 0);
  note(ctx, mm, p, e.textHeight, textValue(e.text ?? ''), layer);
}

export function readMtext(ctx: ReadContext, e: IMtextEntity, m: Affine, layer: string): void {
  const p = e.position;
  if (!p) {
    ctx.warn('MTEXT entities without an insertion point were skipped.');
    return;
  }
  note(ctx, m, p, e.height, mtextValue(e.text ?? ''), layer);
}
