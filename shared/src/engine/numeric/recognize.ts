import { gcd } from '../integers.js';
import { relationSearch } from './pslq.js';
import { abs, cmp, magnitude, Real, round, toNumber } from './real.js';

export type Recognized =
  { expression: string; latex: string; height: number; digitsToSpare: number } | { none: string };

const LOG2_10 = 3.321928094887362;

/**
 * Closed-form recognition: integers c_0 > 0, c_1..c_n with c_0 * value = sum c_i * basis_i, found
 * by PSLQ (pslq.ts), and reported only with a stated margin of precision to spare.
 *
 * The margin. digitsAvailable = -log10(error / |value|) is what the value has. A relation of
 * height H (max |c_i|) among the n + 1 numbers value, basis_1..basis_n needs
 * digitsNeeded = (n + 1) * log10(H) digits: there are about (2H + 1)^(n+1) integer vectors of that
 * height, so generically one of them already combines any n + 1 numbers to within about H^-n, and
 * a relation of height H only means something once the precision clearly exceeds that. We count
 * every slot (zero coefficients included) rather than sum log10 |c_i| over the non-zero ones: the
 * search looked at every slot, and the coarser count is the one that refuses float64-grade input.
 * A relation is accepted when digitsToSpare = digitsAvailable - digitsNeeded >= margin (default
 * 10). PSLQ itself runs at the precision the error allows and no more, with the height bound that
 * the margin leaves, H = floor(10^((digitsAvailable - margin) / (n + 1))) (capped by
 * opts.maxHeight), so "none" is normally the proven statement "no relation of height <= H at this
 * precision" (PSLQ's norm bound passed H); when the search stopped otherwise the note says so.
 * Example: Z(4) of the line kernel, 1024 Z = -1 + 10/pi^2 over the basis 1, 1/pi, 1/pi^2, 1/pi^3,
 * needs 5 log10(1024) = 15.05 digits, so it is accepted from 40 digits (24 to spare) and refused
 * from a float64 value (16 digits at best).
 *
 * The basis values must be accurate well beyond `error` (compute them at working precision).
 * `expression` is in the expression language with explicit `*`, a sum of reduced rational multiples
 * of the basis texts in basis order ("1/64 - 3/(64*pi)"); `latex` is the same sum
 * ("\frac{1}{64} - \frac{3}{64\pi}"); digitsToSpare is rounded down to an integer.
 */
export function recognize(
  value: Real,
  error: number,
  basis: { text: string; value: Real }[],
  opts: { maxHeight?: number; margin?: number } = {},
): Recognized {
  const found = findRelation(value, error, basis, opts);
  if ('none' in found) return found;
  const c = found.relation;
  const nodes = basis.map((b) => parseOrAtom(b.text));
  if (c[0] === 0n) {
    const rel = joinTerms(
      nodes.map((node, i) => ({ p: c[i + 1]!, q: 1n, node })),
      'text',
    );
    return { none: `the basis is itself related: ${rel} = 0` };
  }
  const terms = nodes.map((node, i) => ({ p: -c[i + 1]!, q: c[0]!, node }));
  return {
    expression: joinTerms(terms, 'text'),
    latex: joinTerms(terms, 'latex'),
    height: found.height,
    digitsToSpare: found.digitsToSpare,
  };
}

/**
 * The accepted relation behind `recognize`: (c_0, ..., c_n) with c_0 * value + sum c_i basis_i = 0,
 * primitive, first non-zero coefficient positive, with its height and digits to spare (rounded
 * down); or the reason there is none. c_0 = 0 means the basis elements are related among
 * themselves (the margin applies to that relation too).
 */
export function findRelation(
  value: Real,
  error: number,
  basis: { value: Real }[],
  opts: { maxHeight?: number; margin?: number } = {},
): { relation: bigint[]; height: number; digitsToSpare: number } | { none: string } {
  if (!(error > 0) || !Number.isFinite(error)) throw new RangeError('the error must be positive');
  if (basis.length === 0) throw new RangeError('recognition needs a basis');
  const margin = opts.margin ?? 10;
  const slots = basis.length + 1;
  const digitsAvailable = value.m === 0n ? 0 : log10Abs(value) - Math.log10(error);
  const hLimit = Math.floor(10 ** ((digitsAvailable - margin) / slots) + 1e-9);
  const H = Math.min(hLimit, opts.maxHeight ?? Infinity);
  if (!(H >= 1)) {
    return {
      none: `the value has ${fmt(digitsAvailable)} digits, fewer than the margin of ${margin}`,
    };
  }
  // the precision the error allows, relative to the largest entry
  let big = abs(value);
  for (const b of basis) if (cmp(abs(b.value), big) > 0) big = abs(b.value);
  const prec = Math.max(8, Math.floor((log10Abs(big) - Math.log10(error)) * LOG2_10));
  const x = [round(value, prec + 8), ...basis.map((b) => round(b.value, prec + 8))];
  const search = relationSearch(x, prec, H);
  const noneText = `no relation of height <= ${H} at this precision`;
  if (!search.relation) {
    if (search.outcome === 'bound') return { none: noneText };
    const why =
      search.outcome === 'height'
        ? 'the only one detected is higher'
        : `the search stopped: ${search.outcome} exhausted`;
    return { none: `${noneText} was found (${why})` };
  }
  const c = search.relation;
  const height = Number(c.reduce((h, v) => ((v < 0n ? -v : v) > h ? (v < 0n ? -v : v) : h), 0n));
  const spare = digitsAvailable - slots * Math.log10(height);
  if (spare < margin) return { none: noneText };
  return { relation: c, height, digitsToSpare: Math.floor(spare) };
}

function fmt(d: number): string {
  return d > 0 ? d.toFixed(1) : '0';
}

/** log10 |x| for x != 0 (float estimate from the leading bits). */
function log10Abs(x: Real): number {
  if (x.m === 0n) return -Infinity;
  const mag = magnitude(x);
  return (Math.log2(Math.abs(toNumber(new Real(x.m, x.e - mag)))) + mag) / LOG2_10;
}

// ---- a small parser and printer for basis texts --------------------------------------------

type Node =
  | { k: 'num'; v: string }
  | { k: 'id'; v: string }
  | { k: 'call'; f: string; args: Node[] }
  | { k: 'neg'; a: Node }
  | { k: 'bin'; op: '+' | '-' | '*' | '/' | '^'; a: Node; b: Node }
  | { k: 'opaque'; v: string };

const PREC: Record<string, number> = { '+': 1, '-': 1, '*': 2, '/': 2, neg: 3, '^': 4 };

function parseOrAtom(text: string): Node {
  try {
    return parse(text);
  } catch {
    return { k: 'opaque', v: text.trim() };
  }
}

function parse(text: string): Node {
  const toks = text.match(/\d+(?:\.\d*)?(?:[eE][+-]?\d+)?|[A-Za-z_]\w*|\S/g) ?? [];
  let i = 0;
  const peek = (): string | undefined => toks[i];
  const take = (t?: string): string => {
    const v = toks[i++];
    if (v === undefined || (t !== undefined && v !== t)) throw new Error('syntax');
    return v;
  };
  const expr = (): Node => {
    let a = term();
    while (peek() === '+' || peek() === '-') {
      const op = take() as '+' | '-';
      a = { k: 'bin', op, a, b: term() };
    }
    return a;
  };
  const term = (): Node => {
    let a = unary();
    while (peek() === '*' || peek() === '/') {
      const op = take() as '*' | '/';
      a = { k: 'bin', op, a, b: unary() };
    }
    return a;
  };
  const unary = (): Node => (peek() === '-' ? (take(), { k: 'neg', a: unary() }) : power());
  const power = (): Node => {
    const a = primary();
    return peek() === '^' ? (take(), { k: 'bin', op: '^', a, b: unary() }) : a;
  };
  const primary = (): Node => {
    const t = take();
    if (t === '(') {
      const e = expr();
      take(')');
      return e;
    }
    if (/^\d/.test(t)) return { k: 'num', v: t };
    if (!/^[A-Za-z_]/.test(t)) throw new Error('syntax');
    if (peek() !== '(') return { k: 'id', v: t };
    take('(');
    const args = [expr()];
    while (peek() === ',') {
      take();
      args.push(expr());
    }
    take(')');
    return { k: 'call', f: t, args };
  };
  const node = expr();
  if (i !== toks.length) throw new Error('syntax');
  return node;
}

function level(n: Node): number {
  if (n.k === 'bin') return PREC[n.op]!;
  if (n.k === 'neg') return PREC.neg!;
  return 9;
}

/** Text in the expression language, with the parentheses precedence needs. */
function text(n: Node): string {
  const wrap = (c: Node, min: number): string => (level(c) < min ? `(${text(c)})` : text(c));
  switch (n.k) {
    case 'num':
    case 'id':
      return n.v;
    case 'opaque':
      return `(${n.v})`;
    case 'call':
      return `${n.f}(${n.args.map(text).join(', ')})`;
    case 'neg':
      return `-${wrap(n.a, PREC.neg!)}`;
    case 'bin': {
      const p = PREC[n.op]!;
      if (n.op === '^') return `${wrap(n.a, p + 1)}^${wrap(n.b, p)}`;
      const right = n.op === '-' || n.op === '/' ? p + 1 : p;
      const sp = p === 1 ? ` ${n.op} ` : n.op;
      return `${wrap(n.a, p)}${sp}${wrap(n.b, right)}`;
    }
  }
}

const GREEK = new Set(
  'alpha beta gamma delta epsilon zeta eta theta iota kappa lambda mu nu xi pi rho sigma tau upsilon phi chi psi omega'.split(
    ' ',
  ),
);
const LATEX_FUNCTIONS = new Set('exp log ln sin cos tan sinh cosh tanh'.split(' '));

function latexName(v: string): string {
  if (GREEK.has(v)) return `\\${v}`;
  return v.length === 1 ? v : `\\mathrm{${v.replace(/_/g, '\\_')}}`;
}

/** LaTeX of a node; products are juxtaposed (a \cdot between two numbers). */
function latex(n: Node): string {
  const wrap = (c: Node, min: number): string =>
    level(c) < min ? `\\left(${latex(c)}\\right)` : latex(c);
  switch (n.k) {
    case 'num':
      return n.v;
    case 'id':
      return latexName(n.v);
    case 'opaque':
      return `\\left(\\mathrm{${n.v.replace(/([\\{}_^%$#&])/g, '\\$1')}}\\right)`;
    case 'call': {
      const args = n.args.map(latex).join(', ');
      if (n.f === 'sqrt' && n.args.length === 1) return `\\sqrt{${args}}`;
      if (n.f === 'gamma') return `\\Gamma\\left(${args}\\right)`;
      if (n.f === 'zeta') return `\\zeta\\left(${args}\\right)`;
      const f = LATEX_FUNCTIONS.has(n.f) ? `\\${n.f}` : `\\operatorname{${n.f}}`;
      return `${f}\\left(${args}\\right)`;
    }
    case 'neg':
      return `-${wrap(n.a, PREC.neg!)}`;
    case 'bin': {
      if (n.op === '/') return `\\frac{${latex(n.a)}}{${latex(n.b)}}`;
      if (n.op === '^') return `${wrap(n.a, 5)}^{${latex(n.b)}}`;
      const p = PREC[n.op]!;
      if (n.op === '*') {
        const l = wrap(n.a, p);
        const r = wrap(n.b, p + 1);
        if (/\d$/.test(l) && /^[\d.]/.test(r)) return `${l} \\cdot ${r}`;
        return /[A-Za-z]$/.test(l) && /^[A-Za-z]/.test(r) ? `${l} ${r}` : `${l}${r}`;
      }
      return `${wrap(n.a, p)} ${n.op} ${wrap(n.b, n.op === '-' ? p + 1 : p)}`;
    }
  }
}

const isOne = (n: Node): boolean => n.k === 'num' && Number(n.v) === 1;

/** (|p| * num) / (q * den) as a node, with the basis node split at a top-level division. */
function termNode(p: bigint, q: bigint, basis: Node): Node {
  let num = basis;
  let den: Node | null = null;
  if (basis.k === 'bin' && basis.op === '/') {
    num = basis.a;
    den = basis.b;
  }
  const int = (v: bigint): Node => ({ k: 'num', v: v.toString() });
  const times = (k: bigint, node: Node | null): Node | null => {
    if (node === null || isOne(node)) return k === 1n ? null : int(k);
    return k === 1n ? node : { k: 'bin', op: '*', a: int(k), b: node };
  };
  const top = times(p, num) ?? int(1n);
  const bottom = times(q, den);
  return bottom === null ? top : { k: 'bin', op: '/', a: top, b: bottom };
}

/** sum_i (p_i / q_i) basis_i, terms with p_i = 0 left out, signs pulled to the joins. */
function joinTerms(terms: { p: bigint; q: bigint; node: Node }[], as: 'text' | 'latex'): string {
  let out = '';
  for (const { p, q, node } of terms) {
    if (p === 0n) continue;
    const g = gcd(p, q);
    const s = p < 0n !== q < 0n;
    const t = termNode((p < 0n ? -p : p) / g, (q < 0n ? -q : q) / g, node);
    const body = as === 'text' ? text(t) : latex(t);
    const wrapped = level(t) <= 1 ? (as === 'text' ? `(${body})` : `\\left(${body}\\right)`) : body;
    out += out === '' ? (s ? `-${wrapped}` : wrapped) : `${s ? ' - ' : ' + '}${wrapped}`;
  }
  return out === '' ? '0' : out;
}
