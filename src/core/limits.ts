/**
 * The magnitudes inside which every predicate ambit uses is exact.
 *
 * The exact predicates evaluate polynomials of degree up to 4 in coordinate
 * differences (in-circle) with double-double expansions. They stay exact as
 * long as no partial product overflows past 2^1023 or underflows below the
 * normal range 2^-1022. With every nonzero |coordinate| in
 * [2^-120, 2^120] the largest product is below 2^(4*121 + 8) and the
 * smallest rounding tail of a product of four differences stays above
 * 2^(4*(-120-52) - 53) = 2^-741, so neither can happen, with wide margins
 * left for weights (squared coordinates) in the power predicate.
 */
export const MAX_COORDINATE = 2 ** 120;
/** Smallest nonzero |coordinate| accepted; zero itself is always fine. */
export const MIN_COORDINATE = 2 ** -120;
