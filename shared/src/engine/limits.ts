/** Engine limits; the server may tighten them for its synchronous preview. */
export const MAX_EXPRESSION_LENGTH = 4096;
/** Largest N of the canonical table. */
export const MAX_NMAX = 200;
/** Largest series order, counted in grid steps (order / step). */
export const MAX_ORDER = 20000;
/** Largest N whose class table is enumerated (p(40) = 37,338 cycle types). */
export const MAX_CLASS_TABLE = 40;
/** Most terms an infinite sum or product may use before it is declared divergent. */
export const MAX_TERMS = 100000;
/** Terms without a new record valuation after which an infinite sum is declared divergent. */
export const STALL_TERMS = 2000;
/** Largest exponent of an integer power in an expression. */
export const MAX_POWER = 100000;
/** Most lattice points an unbounded spectrum may use. */
export const MAX_SPECTRUM_POINTS = 200000;
/** Most stored coefficients of one exact (untruncated) series. */
export const MAX_TERMS_PER_SERIES = 4 * MAX_ORDER;
/** Largest size in bits of an exact number raised to a power. */
export const MAX_NUMBER_BITS = 4_000_000;
