import Fraction from 'fraction.js';
import { Series } from '../series/series.js';
import type { SectorPart } from './sector.js';

/** A series as plain data a worker thread can post (structured clone keeps BigInts). */
export interface SeriesData {
  step: string;
  start: number;
  num: bigint[];
  den: bigint;
  order: number | null;
}

/** A sector's computed gas as plain data. */
export type SectorPartData = Omit<SectorPart, 'weight' | 'canonical' | 'product' | 'classes'> & {
  weight: SeriesData;
  canonical: SeriesData[];
  product?: SeriesData[];
  classes: (Omit<SectorPart['classes'][number], 'c'> & { c: SeriesData })[];
};

const toData = (s: Series): SeriesData => ({
  step: s.step.toFraction(),
  start: s.start,
  num: [...s.num],
  den: s.den,
  order: s.order,
});

const fromData = (d: SeriesData): Series =>
  Series.of(new Fraction(d.step), d.start, d.num.slice(), d.den, d.order);

/** A sector part as plain data (for a worker's answer). */
export function partToData(p: SectorPart): SectorPartData {
  const { weight, canonical, product, classes, ...rest } = p;
  return {
    ...rest,
    weight: toData(weight),
    canonical: canonical.map(toData),
    ...(product && { product: product.map(toData) }),
    classes: classes.map(({ c, ...row }) => ({ ...row, c: toData(c) })),
  };
}

/** The sector part a worker posted, as engine values again. */
export function partFromData(d: SectorPartData): SectorPart {
  const { weight, canonical, product, classes, ...rest } = d;
  return {
    ...rest,
    weight: fromData(weight),
    canonical: canonical.map(fromData),
    ...(product && { product: product.map(fromData) }),
    classes: classes.map(({ c, ...row }) => ({ ...row, c: fromData(c) })),
  };
}
