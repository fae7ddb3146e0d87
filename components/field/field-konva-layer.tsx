'use client';
/**
 * A field picture as a Konva image in world coordinates (section units, y up), for the
 * editor's world layer. The picture itself is painted once per solve (see field-overlay.ts);
 * Konva only draws it with the current view transform.
 */
import { Image as KonvaImage } from 'react-konva';
import type { WorldRect } from '@/lib/field/raster';

export function FieldKonvaLayer({ image, rect, unit, opacity = 0.85 }: { image: HTMLCanvasElement; rect: WorldRect; unit: number; opacity?: number }) {
  // The world group flips y (scaleY < 0): anchor at the top edge and flip the image back.
  return (
    <KonvaImage
      image={image}
      x={rect.x0 / unit}
      y={rect.y1 / unit}
      width={(rect.x1 - rect.x0) / unit}
      height={(rect.y1 - rect.y0) / unit}
      scaleY={-1}
      opacity={opacity}
      listening={false}
      imageSmoothingEnabled
    />
  );
}
