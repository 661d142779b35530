import { gasBodySchema } from '@traceloom/shared/api';
import { fieldLabel } from '@traceloom/shared/format';
import { EngineError, parseGasSpec, type GasSpec } from '@traceloom/shared/engine';
import { AppError } from '../http/app-error.js';
import { parseInput } from '../http/validate.js';

/** Most entries a `values` list (cycle weights or grand coefficients) may have. */
export const MAX_LIST_ENTRIES = 1000;

function refuse(message: string, field: string): never {
  throw new AppError(400, 'invalid_spec', `${fieldLabel(field)}: ${message}.`, field);
}

/** Keys refused anywhere in a spec: they could reach an object's prototype. */
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** Refuses prototype keys at any depth, naming their path. */
function assertPlainKeys(value: unknown, path: string, depth = 0): void {
  if (!value || typeof value !== 'object') return;
  if (depth > 20) refuse('is nested too deeply', path);
  for (const key of Object.keys(value)) {
    const at = `${path}.${key}`;
    if (FORBIDDEN_KEYS.has(key)) refuse(`"${key}" is not allowed as a key`, at);
    assertPlainKeys((value as Record<string, unknown>)[key], at, depth + 1);
  }
}

const RATIONAL = /^\s*-?\d+(\s*\/\s*\d+)?\s*$/;

/**
 * `step` and `order` must be rationals with a non-zero denominator before the shared schema sees
 * them: its cross-field check reads them as fractions even when their own pattern failed.
 */
function assertRationals(raw: unknown): void {
  if (!raw || typeof raw !== 'object') return;
  for (const key of ['step', 'order'] as const) {
    const text = (raw as Record<string, unknown>)[key];
    if (typeof text !== 'string') continue;
    if (!RATIONAL.test(text))
      refuse('must be a rational number such as "3" or "1/2"', `spec.${key}`);
    if (/\/\s*0+\s*$/.test(text)) refuse('has a zero denominator', `spec.${key}`);
  }
}

/** Deepest bracket nesting and most powers an expression may have (parsing cost grows with both). */
export const EXPRESSION_SHAPE_LIMITS = { depth: 100, powers: 400 } as const;

/** Every expression of a spec with the dotted field it sits in. */
export function specExpressions(spec: GasSpec): Array<[field: string, text: string]> {
  const out: Array<[string, string]> = [];
  const w = spec.weights;
  if (w.kind === 'values') w.values.forEach((v, i) => out.push([`weights.values.${i}`, v]));
  else out.push(['weights.expression', w.expression]);
  if (w.kind === 'kernel') {
    if (w.from !== null) out.push(['weights.from', w.from]);
    if (w.to !== null) out.push(['weights.to', w.to]);
  }
  for (const [name, text] of Object.entries(spec.at ?? {})) out.push([`at.${name}`, text]);
  spec.recognize?.basis.forEach((b, i) => out.push([`recognize.basis.${i}`, b]));
  if (spec.grand?.kind === 'coefficients') {
    spec.grand.values.forEach((v, i) => out.push([`grand.values.${i}`, v]));
  } else if (spec.grand) out.push(['grand.expression', spec.grand.expression]);
  if (spec.reference) {
    out.push(['reference.normalization', spec.reference.normalization]);
    spec.reference.rows.forEach((row, i) => out.push([`reference.rows.${i}.value`, row.value]));
  }
  return out;
}

/** A character scan (no parsing): refuses nesting deeper than 100 or more than 400 powers. */
export function assertExpressionShape(text: string, field: string): void {
  let depth = 0;
  let deepest = 0;
  let powers = 0;
  for (const c of text) {
    if (c === '(' || c === '[' || c === '{') deepest = Math.max(deepest, ++depth);
    else if (c === ')' || c === ']' || c === '}') depth -= 1;
    else if (c === '^') powers += 1;
  }
  const { depth: maxDepth, powers: maxPowers } = EXPRESSION_SHAPE_LIMITS;
  if (deepest > maxDepth) refuse(`nests brackets ${deepest} deep; the limit is ${maxDepth}`, field);
  if (powers > maxPowers) refuse(`has ${powers} powers (^); the limit is ${maxPowers}`, field);
}

/**
 * Validates a request body `{spec}` with the shared schema (no prototype keys, list caps). 400
 * `invalid_spec` with `field` = `spec.<path>` naming the first problem and the limit it breaks.
 * Expressions are read and evaluated in a worker (the preview, the probe, the run), never here.
 */
export function parseGasBody(body: unknown): GasSpec {
  const { spec: raw } = parseInput(gasBodySchema, body);
  if (raw === undefined) refuse('is required', 'spec');
  assertPlainKeys(raw, 'spec');
  assertRationals(raw);
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
  for (const [field, text] of specExpressions(spec)) assertExpressionShape(text, `spec.${field}`);
  spec.reference?.rows.forEach((row, i) => {
    if (row.N > spec.nMax)
      refuse(`is ${row.N}, beyond nMax = ${spec.nMax}`, `spec.reference.rows.${i}.N`);
  });
  return spec;
}
