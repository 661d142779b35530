/** The special functions of the numeric mode, each `(x: Real, prec: number) => Real`. */
export { acos, asin, atan, atan2, cos, cosPi, sin, sinPi, tan } from './trig.js';
export { ellipticE, ellipticK, modulusOfNome, nomeOfModulus } from './elliptic.js';
export { theta, type ThetaIndex } from './theta.js';
export { gamma, lgamma } from './gamma.js';
export { zeta } from './zeta.js';
export { airyAi, airyAiPrimeZero, airyAiZero, gammaOneThird } from './airy.js';
export { bernoulli2n } from './bernoulli.js';
