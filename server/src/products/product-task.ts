import {
  fromValueJson,
  grandProductForm,
  seriesProductForm,
  type GrandProductJson,
  type SeriesProductJson,
  type ValueJson,
} from '@traceloom/shared/engine';
import Fraction from 'fraction.js';

/** What the worker needs for one product form: the series (or the whole table, for Xi). */
export type ProductTask =
  | { target: 'row' | 'weight'; label: string; value: ValueJson }
  | { target: 'grand'; canonical: ValueJson[]; order: string | null };

/** A product form computed in the worker (engine refusals are thrown as EngineErrors). */
export function productTask(task: ProductTask): SeriesProductJson | GrandProductJson {
  if (task.target === 'grand') {
    const cap = task.order === null ? null : new Fraction(task.order);
    return grandProductForm(task.canonical.map(fromValueJson), cap);
  }
  return seriesProductForm(fromValueJson(task.value), task.label);
}
