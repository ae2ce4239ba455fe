// The terms of Bin(M, q) that matter, walked out from the mode by the ratio recurrence
// f(x+1)/f(x) = (M-x)/(x+1) * odds (odds = q/(1-q)); each side stops once a term is below 1e-20
// with ratio below 1/2, and the left-out mass is bounded by the geometric remainder. Used by the
// dynamic programmes (equal_shares_exact, grid_bracket_exact) for the conditional binomials.
#pragma once
#include <vector>

namespace tallyproof {

// Fills pmf[0..M] (zero outside lo..hi) and returns a bound on the binomial mass outside lo..hi.
// log_factorial holds log x! for x = 0..M at least; 0 < q < 1.
double binomial_terms(int M, double q, double odds, const std::vector<double>& log_factorial, std::vector<double>* pmf,
                      int* lo, int* hi);

}  // namespace tallyproof
