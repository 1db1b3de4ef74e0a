import type { NotationArt } from './notation-art';

/**
 * Engraved drawings kept by key (notation-art.ts `notationKey`: drill, aids, room and line
 * width), least recently used out first, bounded by their size rather than their count: drawings
 * range from a 2-bar drill's few kB to a 32-bar quintuplet drill's several hundred.
 */
export class DrawingCache {
  private readonly kept = new Map<string, { art: NotationArt; bytes: number }>();
  private held = 0;

  constructor(readonly budgetBytes: number) {}

  /** A kept drawing, made the most recently used. */
  get(key: string): NotationArt | undefined {
    const known = this.kept.get(key);
    if (!known) return undefined;
    this.kept.delete(key);
    this.kept.set(key, known);
    return known.art;
  }

  has(key: string): boolean {
    return this.kept.has(key);
  }

  set(key: string, art: NotationArt): void {
    this.delete(key);
    const bytes = drawingBytes(art);
    this.kept.set(key, { art, bytes });
    this.held += bytes;
    for (const [oldest, { bytes: size }] of this.kept) {
      if (this.held <= this.budgetBytes || oldest === key) break;
      this.kept.delete(oldest);
      this.held -= size;
    }
  }

  delete(key: string): void {
    const known = this.kept.get(key);
    if (!known) return;
    this.kept.delete(key);
    this.held -= known.bytes;
  }

  clear(): void {
    this.kept.clear();
    this.held = 0;
  }

  get size(): number {
    return this.kept.size;
  }

  /** Estimated bytes held (see `drawingBytes`). */
  get bytes(): number {
    return this.held;
  }
}

/**
 * A drawing's estimated heap: its strings at two bytes a character (the SVG holds the music
 * font's private-use characters, so V8 keeps it two-byte) plus a fixed allowance for each item
 * and text run object (a run holds some ten fields and its own small string). Fitted to
 * `process.memoryUsage().heapUsed` held by the 8 benchmark drills' drawings as a worker sends them
 * (3.9–4.0 MB measured, 4.0 MB estimated; docs/performance.md).
 */
export function drawingBytes(art: NotationArt): number {
  let chars = art.svg.length;
  let objects = 1 + art.drawing.items.length;
  for (const item of art.drawing.items) {
    if (item.kind === 'ops') chars += item.ops.length;
    else {
      objects += item.pieces.length;
      for (const piece of item.pieces) chars += piece.text.length + piece.family.length;
    }
  }
  return 2 * chars + 200 * objects;
}

/**
 * What the drawings kept for exports may hold. A worksheet of 8 drills at 16 bars holds about
 * 4 MB of drawings (docs/performance.md), so 64 MB keeps about 16 such worksheets, or 30–40 of
 * the more usual four to six drills: the last few each of a handful of teachers composing at
 * once. Longer drills take proportionally more.
 */
export const DRAWING_CACHE_BYTES = 64 * 1024 * 1024;

/** The server's one cache of drawings, read by every export and filled by background work. */
export const keptDrawings = new DrawingCache(DRAWING_CACHE_BYTES);
