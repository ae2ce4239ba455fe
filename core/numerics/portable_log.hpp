// Natural logarithm that gives the same bits on every IEEE 754 platform (natively and in
// WebAssembly): fdlibm's e_log.c algorithm (Sun Microsystems 1993; K. C. Ng), argument reduction
// by the exponent's bits and a degree-14 minimax polynomial in s = f / (2 + f), evaluated with
// IEEE +, -, *, / only (no libm, no fma: the core builds with -ffp-contract=off), error below
// 1 ulp. log1p by Kahan's trick (Higham 2002, Accuracy and Stability of Numerical Algorithms,
// 2nd ed., sec. 1.14.1, problem 1.5): log(u) * x / (u - 1), u = 1 + x, a few ulps.
// Used where random draws need logarithms (random.cpp), so a seed repeats across the two builds.
#pragma once

namespace tallyproof {

double portable_log(double x);    // log x; -inf at 0, NaN below 0 or for NaN, +inf at +inf
double portable_log1p(double x);  // log(1 + x) accurate for small |x|; x > -1

}  // namespace tallyproof
