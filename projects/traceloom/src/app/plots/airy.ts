/**
 * A small float64 Airy function for drawing the fitted large-N curve in the browser (the engine
 * fits; the client only draws): Maclaurin series near the origin (DLMF 9.4.1), the asymptotic
 * expansions beyond (DLMF 9.7.5 for large positive x, 9.7.9 for large negative x). Relative error
 * about 1e-8 or better; plots only, never a shown digit of a result.
 */

/** Ai(0) = 1/(3^(2/3) Gamma(2/3)) (DLMF 9.2.3). */
const AI0 = 0.3550280538878172;
/** -Ai'(0) = 1/(3^(1/3) Gamma(1/3)) (DLMF 9.2.4). */
const AIP0 = 0.2588194037928068;
/** Where the series hands over to the asymptotic expansions. */
const POSITIVE_SWITCH = 5.5;
const NEGATIVE_SWITCH = -7;

/** Ai(x) = Ai(0) f(x) + Ai'(0) g(x), both series summed until the terms stop mattering. */
function maclaurin(x: number): number {
  const x3 = x * x * x;
  let f = 1;
  let g = x;
  let tf = 1;
  let tg = x;
  for (let k = 1; k < 200; k++) {
    tf *= x3 / ((3 * k - 1) * (3 * k));
    tg *= x3 / (3 * k * (3 * k + 1));
    f += tf;
    g += tg;
    if (Math.abs(tf) + Math.abs(tg) < 1e-17 * (Math.abs(f) + Math.abs(g))) break;
  }
  return AI0 * f - AIP0 * g;
}

/** u_k of DLMF 9.7.2: u_0 = 1, u_k = (6k-5)(6k-3)(6k-1) / ((2k-1) 216 k) u_(k-1). */
function uCoefficients(n: number): number[] {
  const u = [1];
  for (let k = 1; k < n; k++) {
    u.push((((6 * k - 5) * (6 * k - 3) * (6 * k - 1)) / ((2 * k - 1) * 216 * k)) * u[k - 1]!);
  }
  return u;
}

const U = uCoefficients(40);

/** sum (-1)^k u_k / zeta^k up to the smallest term (optimal truncation of DLMF 9.7.5). */
function positiveSum(zeta: number): number {
  let sum = 1;
  let last = Infinity;
  for (let k = 1; k < U.length; k++) {
    const term = U[k]! / zeta ** k;
    if (term >= last) break;
    sum += (k % 2 ? -1 : 1) * term;
    last = term;
  }
  return sum;
}

/** ln Ai(x) for x >= the switch point: DLMF 9.7.5 in logarithmic form (no underflow). */
function logAsymptotic(x: number): number {
  const zeta = (2 / 3) * x ** 1.5;
  return (
    -zeta - Math.log(2 * Math.sqrt(Math.PI)) - 0.25 * Math.log(x) + Math.log(positiveSum(zeta))
  );
}

/** Ai(-x) for large x > 0, DLMF 9.7.9. */
function negativeAsymptotic(x: number): number {
  const zeta = (2 / 3) * x ** 1.5;
  let even = 0;
  let odd = 0;
  let last = Infinity;
  for (let k = 0; k < U.length; k++) {
    const term = U[k]! / zeta ** k;
    if (k > 0 && term >= last) break;
    const sign = Math.floor(k / 2) % 2 ? -1 : 1;
    if (k % 2 === 0) even += sign * term;
    else odd += sign * term;
    last = term;
  }
  const phase = zeta - Math.PI / 4;
  return (Math.cos(phase) * even + Math.sin(phase) * odd) / (Math.sqrt(Math.PI) * x ** 0.25);
}

/** The Airy function Ai(x) in float64 (underflows to 0 beyond x of about 100). */
export function airyAi(x: number): number {
  if (x >= POSITIVE_SWITCH) return Math.exp(logAsymptotic(x));
  if (x < NEGATIVE_SWITCH) return negativeAsymptotic(-x);
  return maclaurin(x);
}

/** ln Ai(x), finite for every x where Ai(x) > 0 (also far beyond the float64 range of Ai); NaN where Ai(x) <= 0. */
export function logAiryAi(x: number): number {
  if (x >= POSITIVE_SWITCH) return logAsymptotic(x);
  const v = airyAi(x);
  return v > 0 ? Math.log(v) : NaN;
}

/** Fitted parameters of the Fermi-gas Airy form (value and uncertainty each). */
export interface AiryParameters {
  C: { value: number };
  B: { value: number };
  A: { value: number };
}

/**
 * ln Z(N) of the Airy form Z(N) ~ C^(-1/3) e^A Ai[C^(-1/3) (N - B)] at a (real) N, so the
 * fitted curve can be drawn between the table's points.
 */
export function airyLogZ(fit: AiryParameters, N: number): number {
  const c = fit.C.value;
  const scale = c ** (-1 / 3);
  return Math.log(scale) + fit.A.value + logAiryAi(scale * (N - fit.B.value));
}
