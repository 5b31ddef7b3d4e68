/** An axis-aligned box. */
export interface Box { minX: number; minY: number; maxX: number; maxY: number }

/** The bounding box of the first `count` points of an interleaved array (all of them by default). */
export function boundingBox(xy: ArrayLike<number>, count = xy.length >> 1): Box {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (let i = 0; i < count; i++) {
    const x = xy[2 * i], y = xy[2 * i + 1];
    if (x < minX) minX = x;
    if (x > maxX) maxX = x;
    if (y < minY) minY = y;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}
