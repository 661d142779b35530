import Fraction from 'fraction.js';
import { z } from 'zod';
import { EngineError } from '../errors.js';
import { sectorsSchema } from '../sectors/schema.js';
import { MAX_CLASS_TABLE, MAX_EXPRESSION_LENGTH, MAX_NMAX, MAX_ORDER } from '../limits.js';

const expression = z
  .string({ error: 'must be an expression (a string)' })
  .min(1, { error: 'must not be empty' })
  .max(MAX_EXPRESSION_LENGTH, { error: `is longer than ${MAX_EXPRESSION_LENGTH} characters` });

const RATIONAL_TEXT = /^\s*-?\d+(\s*\/\s*\d+)?\s*$/;
const rationalText = z
  .string({ error: 'must be a rational number written as a string, e.g. "1/2"' })
  .regex(RATIONAL_TEXT, { error: 'must be a rational number such as "3" or "1/2"' })
  .refine((v) => !/\/\s*0+\s*$/.test(v), { error: 'must not divide by zero' });

/** The rational a text field holds, or null when the text is not one (its own issue says why). */
function rationalOrNull(text: string): Fraction | null {
  if (!RATIONAL_TEXT.test(text) || /\/\s*0+\s*$/.test(text)) return null;
  return new Fraction(text.replace(/\s+/g, ''));
}

const bound = z.union([rationalText, z.null()], { error: 'must be a rational string or null' });

const values = z.object({
  kind: z.literal('values'),
  values: z
    .array(expression, { error: 'must be a list of expressions' })
    .min(1, { error: 'needs at least Z_1' }),
});
const formula = z.object({ kind: z.literal('formula'), expression });
const spectrum = z.object({
  kind: z.literal('spectrum'),
  expression,
  offset: rationalText.default('0'),
  from: bound.default(null),
  to: bound.default(null),
});

/** An end of a kernel's domain: a constant expression such as "0" or "2*pi", or null (infinite). */
const domainEnd = z.union([expression, z.null()], { error: 'must be an expression or null' });
const kernel = z.object({
  kind: z.literal('kernel'),
  expression,
  from: domainEnd.default(null),
  to: domainEnd.default(null),
  periodic: z.boolean({ error: 'must be true or false' }).default(false),
});

/** Weight sources: a list, a formula in L, a spectrum c_p over offset + integers, or a kernel. */
export const weightSourceSchema = z.discriminatedUnion(
  'kind',
  [values, formula, spectrum, kernel],
  {
    error: 'kind must be values, formula, spectrum or kernel',
  },
);

/** Least and most significant digits a numeric gas may ask for. */
export const MIN_PRECISION = 8;
export const MAX_PRECISION = 100;

/** Closed-form recognition: an integer relation between Z(N) and the basis (numeric mode). */
export const recognizeSchema = z.object({
  basis: z
    .array(expression, { error: 'must be a list of expressions' })
    .min(1, { error: 'needs at least one basis element' })
    .max(12, { error: 'has more than 12 elements' }),
  maxHeight: z
    .number({ error: 'must be an integer' })
    .int({ error: 'must be an integer' })
    .min(1, { error: 'must be at least 1' })
    .max(1e12, { error: 'must be at most 10^12' })
    .optional(),
});

/** Large-N analysis of a series table: a user normalization instead of the fitted one. */
export const largeNSchema = z.object({ normalization: expression.optional() });

/** A supplied grand function: its coefficients Z(0), Z(1), ... or an expression in kappa. */
export const grandSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('coefficients'), values: z.array(expression).min(1) }),
    z.object({ kind: z.literal('expression'), expression }),
  ],
  { error: 'kind must be coefficients or expression' },
);

/** A reference table: rows N -> value, compared after applying the normalization to Z(N). */
export const referenceSchema = z.object({
  normalization: expression.default('1'),
  rows: z
    .array(
      z.object({
        N: z.number({ error: 'must be an integer' }).int({ error: 'must be an integer' }).min(0),
        value: expression,
      }),
    )
    .max(1000, { error: 'has more than 1000 rows' }),
});

const gasSpecObject = z.object({
  format: z.literal('traceloom.gas/1', { error: 'must be "traceloom.gas/1"' }),
  title: z.string().max(200).optional(),
  statistics: z.enum(['fermion', 'boson'], { error: 'must be "fermion" or "boson"' }),
  variable: z
    .string()
    .regex(/^[a-z]$/, { error: 'must be one lower-case letter' })
    .refine((v) => !['e', 'i'].includes(v), { error: 'e and i are not allowed' })
    .default('q'),
  step: rationalText.default('1'),
  order: z
    .union([rationalText, z.null()], { error: 'must be a rational string or null' })
    .optional(),
  precision: z
    .number({ error: 'must be an integer' })
    .int({ error: 'must be an integer' })
    .min(MIN_PRECISION, { error: `must be at least ${MIN_PRECISION} digits` })
    .max(MAX_PRECISION, { error: `must be at most ${MAX_PRECISION} digits` })
    .optional(),
  at: z.record(z.string(), expression, { error: 'must map the variable to a number' }).optional(),
  recognize: recognizeSchema.optional(),
  largeN: largeNSchema.optional(),
  nMax: z
    .number({ error: 'must be an integer' })
    .int({ error: 'must be an integer' })
    .min(0, { error: 'must be at least 0' })
    .max(MAX_NMAX, { error: `must be at most ${MAX_NMAX}` }),
  classTable: z
    .number({ error: 'must be an integer' })
    .int({ error: 'must be an integer' })
    .min(0, { error: 'must be at least 0' })
    .max(MAX_CLASS_TABLE, { error: `must be at most ${MAX_CLASS_TABLE}` })
    .default(0),
  weights: weightSourceSchema,
  grand: grandSchema.optional(),
  reference: referenceSchema.optional(),
  sectors: sectorsSchema.optional(),
});

/** The gas spec `traceloom.gas/1` (see docs/spec.md). */
export const gasSpecSchema = gasSpecObject.superRefine((spec, ctx) => {
  sectorRules(spec, ctx);
  if (spec.precision !== undefined) {
    numericRules(spec, ctx);
    return;
  }
  if (spec.order === undefined) {
    ctx.addIssue({ code: 'custom', path: ['order'], message: 'is required (or give precision)' });
    return;
  }
  for (const [key, path] of [
    ['at', 'at'],
    ['recognize', 'recognize'],
  ] as const) {
    if (spec[key] !== undefined)
      ctx.addIssue({ code: 'custom', path: [path], message: 'needs precision (numeric mode)' });
  }
  if (spec.weights.kind === 'kernel') {
    ctx.addIssue({
      code: 'custom',
      path: ['precision'],
      message: 'is required for a kernel (its traces are computed numerically)',
    });
  }
  const step = rationalOrNull(spec.step);
  const order = spec.order === null ? null : rationalOrNull(spec.order);
  if (step !== null && step.compare(0) <= 0)
    ctx.addIssue({ code: 'custom', path: ['step'], message: 'must be positive' });
  if (step !== null && order !== null && step.compare(0) > 0) {
    const idx = order.div(step);
    if (idx.d !== 1n)
      ctx.addIssue({ code: 'custom', path: ['order'], message: 'must be a multiple of step' });
    else if (idx.compare(MAX_ORDER) > 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['order'],
        message: `is more than ${MAX_ORDER} steps`,
      });
    } else if (idx.compare(0) <= 0) {
      ctx.addIssue({ code: 'custom', path: ['order'], message: 'must be positive' });
    }
  }
  if (spec.weights.kind === 'spectrum' && spec.variable === 'p') {
    ctx.addIssue({
      code: 'custom',
      path: ['variable'],
      message: 'p is the lattice index of a spectrum',
    });
  }
  if (spec.classTable > spec.nMax) {
    ctx.addIssue({ code: 'custom', path: ['classTable'], message: 'must not exceed nMax' });
  }
});

type SpecDraft = z.infer<typeof gasSpecObject>;

/** Sector indices must not clash with the series variable, and sectors need weight expressions. */
function sectorRules(spec: SpecDraft, ctx: z.RefinementCtx): void {
  if (!spec.sectors) return;
  spec.sectors.index.forEach((name, k) => {
    if (name === spec.variable)
      ctx.addIssue({
        code: 'custom',
        path: ['sectors', 'index', k],
        message: `${name} is the series variable; choose another index name`,
      });
  });
  if (spec.weights.kind === 'kernel')
    ctx.addIssue({
      code: 'custom',
      path: ['sectors'],
      message: 'apply to values, formula or spectrum weights, not to a kernel',
    });
}

/** Field rules of a numeric gas (precision given). */
function numericRules(spec: SpecDraft, ctx: z.RefinementCtx): void {
  if (spec.at !== undefined) {
    for (const key of Object.keys(spec.at)) {
      if (key !== spec.variable)
        ctx.addIssue({
          code: 'custom',
          path: ['at', key],
          message: `fixes ${key}, but the variable is ${spec.variable}`,
        });
    }
    if (spec.weights.kind === 'kernel')
      ctx.addIssue({ code: 'custom', path: ['at'], message: 'does not apply to a kernel' });
  } else if (spec.weights.kind !== 'kernel' && spec.weights.kind !== 'values') {
    ctx.addIssue({
      code: 'custom',
      path: ['at'],
      message: `must fix the variable ${spec.variable} at a number in numeric mode, e.g. {"${spec.variable}": "1/10"}`,
    });
  }
  if (spec.largeN?.normalization !== undefined)
    ctx.addIssue({
      code: 'custom',
      path: ['largeN', 'normalization'],
      message: 'applies to series tables, not to numeric mode',
    });
  if (spec.weights.kind === 'kernel' && spec.weights.periodic) {
    if (spec.weights.from === null || spec.weights.to === null)
      ctx.addIssue({
        code: 'custom',
        path: ['weights', spec.weights.from === null ? 'from' : 'to'],
        message: 'a periodic kernel needs both ends of its circle',
      });
  }
  if (spec.classTable > spec.nMax)
    ctx.addIssue({ code: 'custom', path: ['classTable'], message: 'must not exceed nMax' });
}

/** True when the spec asks for the numeric mode. */
export function isNumericSpec(spec: { precision?: number | undefined }): boolean {
  return spec.precision !== undefined;
}

/** A validated gas spec. */
export type GasSpec = z.infer<typeof gasSpecSchema>;
/** A gas spec as written (defaults not yet applied). */
export type GasSpecInput = z.input<typeof gasSpecSchema>;

/** Validate an unknown value as a gas spec; the error names the first offending field. */
export function parseGasSpec(input: unknown): GasSpec {
  const r = gasSpecSchema.safeParse(input);
  if (r.success) return r.data;
  const issue = r.error.issues[0]!;
  const field = issue.path.map(String).join('.') || 'spec';
  let at: unknown = input;
  for (const key of issue.path)
    at =
      at && typeof at === 'object'
        ? (at as Record<PropertyKey, unknown>)[key as PropertyKey]
        : undefined;
  const message = issue.code === 'invalid_type' && at === undefined ? 'is required' : issue.message;
  if (field === 'spec') throw new EngineError('must be a JSON object (a gas spec)', field);
  throw new EngineError(message, field);
}
