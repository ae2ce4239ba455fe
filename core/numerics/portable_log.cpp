// Natural logarithm from IEEE +, -, *, / and bit manipulation only: the algorithm and constants of
// fdlibm's e_log.c (__ieee754_log; Sun Microsystems 1993, freely distributable; the same in musl
// and FreeBSD msun). x = 2^k (1 + f), sqrt(2)/2 < 1 + f < sqrt(2); log(1 + f) = f - hfsq + s (hfsq + R),
// s = f / (2 + f), R a minimax polynomial in s^2 (|error| < 2^-58.45); log x = k ln2_hi + (f - (hfsq -
// (s (hfsq + R) + k ln2_lo))). Error below 1 ulp (fdlibm's claim; tests/unit/test_portable_log.cpp
// checks it against the platform's log). log1p: Kahan's trick (Higham 2002, sec. 1.14.1).
#include "portable_log.hpp"

#include <cstdint>
#include <cstring>
#include <limits>

namespace tallyproof {
namespace {

constexpr double ln2_hi = 6.93147180369123816490e-01;  // 3fe62e42 fee00000
constexpr double ln2_lo = 1.90821492927058770002e-10;  // 3dea39ef 35793c76
constexpr double two54 = 1.80143985094819840000e+16;   // 43500000 00000000
constexpr double Lg1 = 6.666666666666735130e-01;       // 3FE55555 55555593
constexpr double Lg2 = 3.999999999940941908e-01;       // 3FD99999 9997FA04
constexpr double Lg3 = 2.857142874366239149e-01;       // 3FD24924 94229359
constexpr double Lg4 = 2.222219843214978396e-01;       // 3FCC71C5 1D8E78AF
constexpr double Lg5 = 1.818357216161805012e-01;       // 3FC74664 96CB03DE
constexpr double Lg6 = 1.531383769920937332e-01;       // 3FC39A09 D078C69F
constexpr double Lg7 = 1.479819860511658591e-01;       // 3FC2F112 DF3E5244

inline std::uint64_t bits_of(double x) {
    std::uint64_t b;
    std::memcpy(&b, &x, sizeof b);
    return b;
}
inline double from_bits(std::uint64_t b) {
    double x;
    std::memcpy(&x, &b, sizeof x);
    return x;
}
inline std::int32_t high_word(double x) { return static_cast<std::int32_t>(bits_of(x) >> 32); }
inline double with_high_word(double x, std::int32_t hi) {
    return from_bits((static_cast<std::uint64_t>(static_cast<std::uint32_t>(hi)) << 32) | (bits_of(x) & 0xffffffffULL));
}

}  // namespace

double portable_log(double x) {
    std::int32_t hx = high_word(x);
    const std::uint32_t lx = static_cast<std::uint32_t>(bits_of(x));
    int k = 0;
    if (hx < 0x00100000) {  // x < 2^-1022: zero, negative or subnormal
        if (((hx & 0x7fffffff) | static_cast<std::int32_t>(lx)) == 0) return -std::numeric_limits<double>::infinity();
        if (hx < 0) return std::numeric_limits<double>::quiet_NaN();
        k -= 54;
        x *= two54;  // subnormal: scale up
        hx = high_word(x);
    }
    if (hx >= 0x7ff00000) return x + x;  // inf or NaN
    k += (hx >> 20) - 1023;
    hx &= 0x000fffff;
    const std::int32_t i0 = (hx + 0x95f64) & 0x100000;
    x = with_high_word(x, hx | (i0 ^ 0x3ff00000));  // normalise x or x/2 into [sqrt(2)/2, sqrt(2))
    k += i0 >> 20;
    const double f = x - 1.0;
    const double dk = static_cast<double>(k);
    if ((0x000fffff & (2 + hx)) < 3) {  // |f| < 2^-20
        if (f == 0.0) return k == 0 ? 0.0 : dk * ln2_hi + dk * ln2_lo;
        const double R = f * f * (0.5 - 0.33333333333333333 * f);
        return k == 0 ? f - R : dk * ln2_hi - ((R - dk * ln2_lo) - f);
    }
    const double s = f / (2.0 + f);
    const double z = s * s;
    std::int32_t i = hx - 0x6147a;
    const double w = z * z;
    const std::int32_t j = 0x6b851 - hx;
    const double t1 = w * (Lg2 + w * (Lg4 + w * Lg6));
    const double t2 = z * (Lg1 + w * (Lg3 + w * (Lg5 + w * Lg7)));
    i |= j;
    const double R = t2 + t1;
    if (i > 0) {
        const double hfsq = 0.5 * f * f;
        return k == 0 ? f - (hfsq - s * (hfsq + R)) : dk * ln2_hi - ((hfsq - (s * (hfsq + R) + dk * ln2_lo)) - f);
    }
    return k == 0 ? f - s * (f - R) : dk * ln2_hi - ((s * (f - R) - dk * ln2_lo) - f);
}

double portable_log1p(double x) {
    const double u = 1.0 + x;
    if (u == 1.0) return x;  // |x| below half an ulp of 1: log(1 + x) = x to working precision
    return portable_log(u) * (x / (u - 1.0));
}

}  // namespace tallyproof
