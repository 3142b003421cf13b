import type { View } from '@/lib/map-geometry';
import { drawOverlay, type OverlayScene } from './overlay-draw';

/**
 * A pan moves everything on the map by the same amount, so while the scale and the scene stay the same the whole
 * drawn board is kept as one bitmap and a pan frame is a single copy. A zoom or any change to what is shown redraws
 * it; when the board at this scale is much bigger than the stage, the map is drawn straight onto the stage instead.
 */

const MARGIN = 32; // css px around the board: rings, names and tags near the edge

export class OverlayCache {
  private canvas: HTMLCanvasElement | null = null;
  private key = { version: -1, scale: 0, pr: 0 };
  private origin: View = { scale: 1, x: MARGIN, y: MARGIN };
  private lastScale = 0;

  draw(ctx: CanvasRenderingContext2D, s: OverlayScene, version: number, v: View, width: number, height: number, pr: number) {
    const w = s.board.width * v.scale + 2 * MARGIN;
    const h = s.board.height * v.scale + 2 * MARGIN;
    // Much bigger than the stage, most of the bitmap would be drawn for nothing: culled direct drawing wins. And
    // while the scale changes frame after frame (a wheel or pinch zoom) a bitmap would be thrown away each time.
    const zooming = v.scale !== this.lastScale;
    this.lastScale = v.scale;
    if (zooming || w * h > 1.5 * width * height) {
      this.canvas = null;
      this.key.version = -1;
      return drawOverlay(ctx, s, v, width, height, pr);
    }
    const k = this.key;
    if (!this.canvas || k.version !== version || k.scale !== v.scale || k.pr !== pr) {
      this.canvas ??= document.createElement('canvas');
      const c = this.canvas;
      const cw = Math.ceil(w * pr);
      const ch = Math.ceil(h * pr);
      if (c.width !== cw || c.height !== ch) {
        c.width = cw;
        c.height = ch;
      }
      const cc = c.getContext('2d');
      if (!cc) return drawOverlay(ctx, s, v, width, height, pr);
      cc.setTransform(1, 0, 0, 1, 0, 0);
      cc.clearRect(0, 0, cw, ch);
      cc.setTransform(pr, 0, 0, pr, 0, 0);
      this.origin.scale = v.scale;
      drawOverlay(cc, s, this.origin, w, h, pr);
      k.version = version;
      k.scale = v.scale;
      k.pr = pr;
    }
    // Whole device pixels: the copy stays a plain blit, with no resampling.
    ctx.setTransform(1, 0, 0, 1, 0, 0);
    ctx.drawImage(this.canvas, Math.round((v.x - MARGIN) * pr), Math.round((v.y - MARGIN) * pr));
    ctx.setTransform(pr, 0, 0, pr, 0, 0);
  }
}
