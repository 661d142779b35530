import Fraction from 'fraction.js';
import { EngineError } from '../errors.js';
import { Series } from './series.js';

/** s(q^k) for a rational k > 0: every exponent and the order scale by k (exact). */
export function substitute(s: Series, k: Fraction): Series {
  if (k.compare(0) <= 0) throw new EngineError('substitution q -> q^k needs k > 0');
  return Series.of(s.step.mul(k), s.start, [...s.num], s.den, s.order);
}
