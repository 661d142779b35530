import { EngineError, parseExpression, parseGasSpec, type GasSpec } from '@traceloom/shared/engine';
import { z } from 'zod';
import { AppError } from '../http/app-error.js';
import { parseInput } from '../http/validate.js';

/** Most entries a `values` list (cycle weights or grand coefficients) may have. */
export const MAX_LIST_ENTRIES = 1000;

/** Body of `POST /studies/:id/gases`, `PUT /gases/:id` and `POST /compute`. */
export const gasBodySchema = z.strictObject({ spec: z.unknown() });

/** Every expression of a spec with the dotted field it sits in. */
export function specExpressions(spec: GasSpec): Array<[field: string, text: string]> {
  const out: Array<[string, string]> = [];
  const w = spec.weights;
  if (w.kind === 'values') w.values.forEach((v, i) => out.push([`weights.values.${i}`, v]));
  else out.push(['weights.expression', w.expression]);
  if (spec.grand?.kind === 'coefficients') {
    spec.grand.values.forEach((v, i) => out.push([`grand.values.${i}`, v]));
  } else if (spec.grand) out.push(['grand.expression', spec.grand.expression]);
  if (spec.reference) {
    out.push(['reference.normalization', spec.reference.normalization]);
    spec.reference.rows.forEach((row, i) => out.push([`reference.rows.${i}.value`, row.value]));
  }
  return out;
}

function refuse(message: string, field: string): never {
  throw new AppError(400, 'invalid_spec', `${field}: ${message}.`, field);
}

/**
 * Validates a request body `{spec}` with the shared schema, then reads (parses, does not
 * evaluate) every expression in it, so a syntax error is refused at the boundary. 400
 * `invalid_spec` with `field` = `spec.<path>` naming the first problem and the limit it breaks.
 */
export function parseGasBody(body: unknown): GasSpec {
  const { spec: raw } = parseInput(gasBodySchema, body);
  if (raw === undefined) refuse('is required', 'spec');
  let spec: GasSpec;
  try {
    spec = parseGasSpec(raw);
  } catch (e) {
    if (e instanceof EngineError) refuse(e.message, e.field ? `spec.${e.field}` : 'spec');
    throw e;
  }
  const lists: Array<[string, readonly unknown[] | undefined]> = [
    ['spec.weights.values', spec.weights.kind === 'values' ? spec.weights.values : undefined],
    ['spec.grand.values', spec.grand?.kind === 'coefficients' ? spec.grand.values : undefined],
  ];
  for (const [field, list] of lists) {
    if (list && list.length > MAX_LIST_ENTRIES) {
      refuse(`has ${list.length} entries; the limit is ${MAX_LIST_ENTRIES}`, field);
    }
  }
  for (const [field, text] of specExpressions(spec)) {
    try {
      parseExpression(text, field);
    } catch (e) {
      if (e instanceof EngineError) refuse(e.message, `spec.${field}`);
      throw e;
    }
  }
  return spec;
}
