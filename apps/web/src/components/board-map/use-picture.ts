import { useEffect, useState } from 'react';

/**
 * The board picture, rasterised once into a canvas. Board pictures are SVG, and a canvas redraws an SVG image from
 * its vector form on every frame; a bitmap at twice the board size stays sharp to about 2× zoom and costs one blit.
 */
export function usePicture(url: string | undefined, board: { width: number; height: number }) {
  const [pic, setPic] = useState<HTMLCanvasElement | null>(null);
  const { width, height } = board;
  useEffect(() => {
    if (!url) return;
    const img = new window.Image();
    img.onload = () => {
      const f = Math.min(2, 4096 / Math.max(width, height, 1));
      const c = document.createElement('canvas');
      c.width = Math.max(1, Math.round(width * f));
      c.height = Math.max(1, Math.round(height * f));
      c.getContext('2d')?.drawImage(img, 0, 0, c.width, c.height);
      setPic(c);
    };
    img.src = url;
    return () => {
      img.onload = null;
    };
  }, [url, width, height]);
  return url ? pic : null;
}
