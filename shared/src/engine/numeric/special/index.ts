/** The special functions of the numeric mode, each `(x: Real, prec: number) => Real`. */
export { acos, asin, atan, atan2, cos, cosPi, sin, sinPi, tan } from './trig.js';
export { ellipticE, ellipticK, modulusOfNome, nomeOfModulus } from './elliptic.js';
export { theta, type ThetaIndex } from './theta.js';
