import { sectorEnd, type SectorsSpec } from './schema.js';

/** The box of sector vectors: per index its least and greatest value (null = unbounded side). */
export interface SectorBox {
  lo: (number | null)[];
  hi: (number | null)[];
  /** The centre shells grow from: 0 clamped into each range. */
  centre: number[];
}

/** The box a `sectors` field describes. */
export function sectorBox(s: SectorsSpec): SectorBox {
  const lo = s.index.map((_, k) => sectorEnd(s.from[k]));
  const hi = s.index.map((_, k) => sectorEnd(s.to[k]));
  const centre = lo.map((a, k) => {
    const b = hi[k]!;
    if (a !== null && a > 0) return a;
    if (b !== null && b < 0) return b;
    return 0;
  });
  return { lo, hi, centre };
}

/** True when every side of every range is bounded (a finite sum). */
export function isBounded(box: SectorBox): boolean {
  return box.lo.every((a) => a !== null) && box.hi.every((b) => b !== null);
}

/** How many sectors a bounded box holds (Infinity when a side is unbounded). */
export function boxSize(box: SectorBox): number {
  if (!isBounded(box)) return Infinity;
  return box.lo.reduce<number>((n, a, k) => n * (box.hi[k]! - a! + 1), 1);
}

/** The largest shell radius a bounded box reaches (Infinity when a side is unbounded). */
export function lastShell(box: SectorBox): number {
  if (!isBounded(box)) return Infinity;
  return Math.max(...box.centre.map((c, k) => Math.max(c - box.lo[k]!, box.hi[k]! - c)));
}

/**
 * The sectors of shell r: the vectors n of the box with max_k |n_k - centre_k| = r, in
 * lexicographic order. Shell 0 is the centre; the shells of growing r cover the box once each.
 */
export function shell(box: SectorBox, r: number): number[][] {
  const d = box.centre.length;
  const out: number[][] = [];
  const cur = new Array<number>(d).fill(0);
  const walk = (k: number, onSurface: boolean): void => {
    const c = box.centre[k]!;
    const a = Math.max(c - r, box.lo[k] ?? -Infinity);
    const b = Math.min(c + r, box.hi[k] ?? Infinity);
    const last = k === d - 1;
    for (let v = a; v <= b; v++) {
      const surface = onSurface || Math.abs(v - c) === r;
      // the last index of a vector still inside the shell jumps straight to the surface
      if (last && !surface) {
        if (c + r <= b) v = c + r - 1;
        else break;
        continue;
      }
      cur[k] = v;
      if (last) out.push(cur.slice());
      else walk(k + 1, surface);
    }
  };
  walk(0, false);
  return out;
}
