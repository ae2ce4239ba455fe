// Table-free exact binomial draws at constant expected cost whatever the number of trials:
// BTRD, transformed rejection with decomposition (Hörmann 1993, "The generation of binomial random
// variates", J. Statist. Comput. Simul. 46:101-110), where the mode floor((n + 1) p) is at least 11,
// and below that the second waiting-time method (Devroye 1986, Non-Uniform Random Variate
// Generation, Springer, ch. X.4: the count of exponential order statistics of n draws that stay
// below -log(1 - p)), about n p + 1 logarithms a draw. Built from IEEE +, -, *, /, sqrt and floor
// (all correctly rounded) and portable_log (core/numerics/portable_log.hpp), so a seed gives
// bit-identical draws natively and in WebAssembly.
#pragma once

namespace tallyproof {

struct Xoshiro256;  // random.hpp

// A success probability p <= 1/2 in the three forms the draws use; make it once per share.
struct BinomialShare {
    double p = 0;     // 0 <= p <= 1/2
    double odds = 0;  // p / (1 - p)
    double rate = 0;  // -log(1 - p) = log1p(odds), by portable_log1p
};
// From p and its odds, each formed without subtracting from 1 (the caller has both exactly).
BinomialShare binomial_share(double p, double odds);

// One draw of Bin(n, s.p), n >= 0. Uses the generator's 53-bit uniforms (next_unit) only.
int draw_binomial(int n, const BinomialShare& s, Xoshiro256* g);

}  // namespace tallyproof
