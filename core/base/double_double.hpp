// Double-double arithmetic: a value hi + lo held as two doubles with |lo| <= ulp(hi) / 2, about
// 106 bits (relative precision ~1e-32). Error-free transformations: two_sum (Knuth), two_prod by
// Dekker's splitting (Dekker 1971, Numer. Math. 18:224; deliberately not std::fma, which
// WebAssembly emulates slowly); add, multiply and divide as in the QD library (Hida, Li and Bailey
// 2001, "Algorithms for quad-double precision floating point arithmetic", the dd_real "sloppy"
// multiply and divide, the IEEE add). exp by reduction modulo ln 2, division by 2^9, Taylor series
// and nine squarings (QD's dd_real exp); log from a table of ln(1 + j/64) and the atanh series
// (Tang 1990, ACM TOMS 16:378).
// Accuracy: add/sub/mul/div within a few units of 2^-104 relative; log within ~1e-31 relative,
// exp within 1e-31 for |x| <= 1 growing to 1e-30 at |x| = 700 (ln 2 is held to ~4e-33). Below
// ~2^-916 the low part is subnormal and a pair holds fewer bits. Checked against mpmath in
// tests/unit/test_double_double.cpp.
// The formulas need every operation rounded separately: the core library is compiled with
// -ffp-contract=off (core/CMakeLists.txt), so no compiler fuses a * b + c into an fma.
// Header-only so the hot loops of core/numerics/log_incomplete_gamma.cpp inline it.
#pragma once

#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>

namespace tallyproof {

struct DoubleDouble {
    double hi = 0;
    double lo = 0;
};

namespace dd_detail {
constexpr double kSplitter = 134217729.0;               // 2^27 + 1
constexpr double kSplitThreshold = 6.69692879491417e+299;  // 2^996: above it kSplitter * a overflows
// ln 2 = 0.69314718055994530941723212145817656807550013436026 (mpmath 1.2.1, 50 digits)
constexpr double kLn2Hi = 0.6931471805599453;
constexpr double kLn2Lo = 2.3190468138462996e-17;
}  // namespace dd_detail

// s + e = a + b exactly (Knuth's two_sum; any magnitudes).
inline DoubleDouble two_sum(double a, double b) {
    const double s = a + b;
    const double bb = s - a;
    const double e = (a - (s - bb)) + (b - bb);
    return {s, e};
}

// s + e = a + b exactly, valid when |a| >= |b| or a == 0.
inline DoubleDouble quick_two_sum(double a, double b) {
    const double s = a + b;
    const double e = b - (s - a);
    return {s, e};
}

// Dekker's split without the overflow guard, for |a| < 2^996 (hot loops that know their range).
inline void split_small(double a, double* hi, double* lo) {
    const double t = dd_detail::kSplitter * a;
    *hi = t - (t - a);
    *lo = a - *hi;
}

// a = hi + lo with hi and lo of at most 26 significant bits each (Dekker's split).
inline void dekker_split(double a, double* hi, double* lo) {
    using namespace dd_detail;
    if (a > kSplitThreshold || a < -kSplitThreshold) {
        split_small(a * 3.7252902984619140625e-09, hi, lo);  // 2^-28
        *hi *= 268435456.0;  // 2^28
        *lo *= 268435456.0;
    } else {
        split_small(a, hi, lo);
    }
}

// p + e = a * b exactly (barring underflow), by Dekker's splitting.
inline DoubleDouble two_prod(double a, double b) {
    const double p = a * b;
    double ah, al, bh, bl;
    dekker_split(a, &ah, &al);
    dekker_split(b, &bh, &bl);
    const double e = ((ah * bh - p) + ah * bl + al * bh) + al * bl;
    return {p, e};
}

inline DoubleDouble dd(double a) { return {a, 0.0}; }
inline double to_double(DoubleDouble a) { return a.hi + a.lo; }
inline DoubleDouble operator-(DoubleDouble a) { return {-a.hi, -a.lo}; }

inline DoubleDouble operator+(DoubleDouble a, DoubleDouble b) {
    DoubleDouble s = two_sum(a.hi, b.hi);
    const DoubleDouble t = two_sum(a.lo, b.lo);
    s.lo += t.hi;
    s = quick_two_sum(s.hi, s.lo);
    s.lo += t.lo;
    return quick_two_sum(s.hi, s.lo);
}
inline DoubleDouble operator+(DoubleDouble a, double b) {
    DoubleDouble s = two_sum(a.hi, b);
    s.lo += a.lo;
    return quick_two_sum(s.hi, s.lo);
}
inline DoubleDouble operator+(double a, DoubleDouble b) { return b + a; }
inline DoubleDouble operator-(DoubleDouble a, DoubleDouble b) { return a + (-b); }
inline DoubleDouble operator-(DoubleDouble a, double b) { return a + (-b); }
inline DoubleDouble operator-(double a, DoubleDouble b) { return (-b) + a; }

inline DoubleDouble operator*(DoubleDouble a, DoubleDouble b) {
    DoubleDouble p = two_prod(a.hi, b.hi);
    p.lo += a.hi * b.lo + a.lo * b.hi;
    return quick_two_sum(p.hi, p.lo);
}
inline DoubleDouble operator*(DoubleDouble a, double b) {
    DoubleDouble p = two_prod(a.hi, b);
    p.lo += a.lo * b;
    return quick_two_sum(p.hi, p.lo);
}
inline DoubleDouble operator*(double a, DoubleDouble b) { return b * a; }

inline DoubleDouble operator/(DoubleDouble a, double b) {
    const double q1 = a.hi / b;
    const DoubleDouble p = two_prod(q1, b);
    DoubleDouble s = two_sum(a.hi, -p.hi);
    s.lo -= p.lo;
    s.lo += a.lo;
    const double q2 = (s.hi + s.lo) / b;
    return quick_two_sum(q1, q2);
}
inline DoubleDouble operator/(DoubleDouble a, DoubleDouble b) {
    const double q1 = a.hi / b.hi;
    const DoubleDouble r = b * q1;
    DoubleDouble s = two_sum(a.hi, -r.hi);
    s.lo -= r.lo;
    s.lo += a.lo;
    const double q2 = (s.hi + s.lo) / b.hi;
    return quick_two_sum(q1, q2);
}
inline DoubleDouble operator/(double a, DoubleDouble b) { return dd(a) / b; }

// a * b exactly for b a power of two (barring overflow and underflow).
inline DoubleDouble mul_pwr2(DoubleDouble a, double b) { return {a.hi * b, a.lo * b}; }

// a * 2^e exactly (barring overflow and underflow).
inline DoubleDouble dd_ldexp(DoubleDouble a, int e) { return {std::ldexp(a.hi, e), std::ldexp(a.lo, e)}; }

// e^a. 0 below -745.2, +inf above 709.8 (as std::exp).
inline DoubleDouble dd_exp(DoubleDouble a) {
    using namespace dd_detail;
    if (std::isnan(a.hi)) return {a.hi, a.hi};
    if (a.hi <= -745.2) return {0.0, 0.0};
    if (a.hi >= 709.8) return {std::numeric_limits<double>::infinity(), 0.0};
    if (a.hi == 0 && a.lo == 0) return {1.0, 0.0};
    const double m = std::floor(a.hi / kLn2Hi + 0.5);
    // r = (a - m ln 2) / 512, |r| <= ln 2 / 1024
    const DoubleDouble r = dd_ldexp(a - DoubleDouble{kLn2Hi, kLn2Lo} * m, -9);
    // s = expm1(r) by Taylor: |r|^11 / 11! < 1e-43
    DoubleDouble s = r, term = r;
    for (int k = 2; k <= 11; ++k) {
        term = term * r / static_cast<double>(k);
        s = s + term;
        if (std::fabs(term.hi) < 1e-36) break;
    }
    // expm1(2r) = expm1(r) (2 + expm1(r)), nine times
    for (int i = 0; i < 9; ++i) s = s * (s + 2.0);
    s = s + 1.0;
    // Scale in two steps so that e^a near the bottom of the range (m down to -1075) stays exact
    // until the final rounding.
    const int e = static_cast<int>(m);
    return dd_ldexp(dd_ldexp(s, e / 2), e - e / 2);
}

namespace dd_detail {
// ln(1 + j/64), j = 0..64, as double-doubles (mpmath 1.2.1 at 50 digits, hi = the nearest double,
// lo = the nearest double to the rest).
constexpr DoubleDouble kLnTable[65] = {
    {0.0, 0.0},
    {0.015504186535965254, -3.278321022892429e-19},
    {0.030771658666753687, 1.0431732029005968e-18},
    {0.0458095360312942, 1.902959866474257e-18},
    {0.06062462181643484, 2.6424025938726934e-18},
    {0.07522342123758753, -5.930604196293241e-18},
    {0.08961215868968714, -5.4268129336647135e-18},
    {0.10379679368164356, 5.47772415726659e-18},
    {0.11778303565638346, -1.1971685747593677e-18},
    {0.13157635778871926, 1.1123000879729588e-17},
    {0.1451820098444979, 8.242418783022475e-18},
    {0.15860503017663857, 1.1257003872182592e-17},
    {0.17185025692665923, -6.0224538210113705e-18},
    {0.184922338494012, 3.0236614153574064e-18},
    {0.19782574332991987, 1.2821194372980142e-17},
    {0.21056476910734964, -4.249405314729895e-18},
    {0.22314355131420976, -9.091270597324799e-18},
    {0.2355660713127669, -2.3943371495187355e-18},
    {0.24783616390458127, -1.2432209578702523e-17},
    {0.25995752443692605, 2.069806938978935e-17},
    {0.27193371548364176, 7.83319637697442e-19},
    {0.2837681731306446, -2.032665581126656e-17},
    {0.2954642128938359, -2.16461086040599e-17},
    {0.3070250352949119, -1.2319916200101964e-17},
    {0.3184537311185346, 2.7114779367326236e-17},
    {0.329753286372468, 2.122020616196946e-18},
    {0.3409265869705932, 1.7467136443544747e-17},
    {0.3519764231571782, -1.2953893030191963e-17},
    {0.3629054936893685, -2.1492361455310972e-17},
    {0.37371640979358406, 2.1836211281198184e-17},
    {0.38441169891033206, -1.612149700764673e-17},
    {0.394993808240869, -1.5113724418336168e-17},
    {0.4054651081081644, -2.8811380259626426e-18},
    {0.415827895143711, -2.48753990369597e-17},
    {0.4260843953109001, -2.499176776547466e-17},
    {0.43623676677491807, -1.8379648230620457e-18},
    {0.44628710262841953, -1.8182541194649598e-17},
    {0.4562374334815876, 2.122222784062318e-17},
    {0.46608972992459924, -1.4116523239904406e-17},
    {0.4758459048699639, -6.181952722542219e-18},
    {0.4855078157817008, -1.6618350693852048e-17},
    {0.4950772667978515, -8.307950959627356e-18},
    {0.5045560107523953, -2.4888518873597905e-17},
    {0.5139457511022343, 3.397548559332142e-17},
    {0.5232481437645479, -3.1833882216350925e-17},
    {0.5324647988694718, -9.149239241180804e-19},
    {0.5415972824327444, -3.748764246125639e-17},
    {0.5506471179526623, -2.239429485856908e-17},
    {0.5596157879354227, 2.685492580212308e-17},
    {0.5685047353526688, -5.4267346029482773e-17},
    {0.5773153650348236, -8.903591846974013e-18},
    {0.5860490450035782, -3.058363205263577e-17},
    {0.5947071077466928, 1.3751689964323675e-17},
    {0.6032908514380843, 9.9400563470175e-18},
    {0.6118015411059929, -3.7397759448726e-17},
    {0.6202404097518576, -3.989161064307651e-17},
    {0.6286086594223741, 4.3538742607970387e-17},
    {0.6369074622370692, 5.422955873465247e-17},
    {0.6451379613735847, 9.346960920120906e-19},
    {0.6533012720127457, -4.306892322029408e-17},
    {0.661398482245365, -7.603333785634003e-18},
    {0.6694306539426292, 2.823733943928343e-17},
    {0.6773988235918061, -2.0978183882652005e-18},
    {0.6853040030989194, 4.893484946270261e-17},
    {0.6931471805599453, 2.3190468138462996e-17}};
constexpr DoubleDouble kOneThird{0.3333333333333333, 1.850371707708594e-17};  // mpmath 1.2.1
constexpr DoubleDouble kOneFifth{0.2, -1.1102230246251566e-17};               // mpmath 1.2.1
}  // namespace dd_detail

// ln a for a > 0 (NaN for a < 0, -inf for 0), table-driven (Tang 1990, ACM TOMS 16:378): with
// a = f 2^e, f in [1, 2) and c = 1 + j/64 the nearest table point, ln a = e ln 2 + ln c + 2 atanh(t),
// t = (f - c)/(f + c), |t| <= 1/257; atanh by its series, t^2 <= 1.6e-5 (terms to t^13).
// (Cheaper than QD's Newton step on exp, which costs a double-double exp per call.)
inline DoubleDouble dd_log(DoubleDouble a) {
    using namespace dd_detail;
    if (std::isnan(a.hi) || a.hi < 0) return {std::numeric_limits<double>::quiet_NaN(), 0.0};
    if (a.hi == 0) return {-std::numeric_limits<double>::infinity(), 0.0};
    if (std::isinf(a.hi)) return {a.hi, 0.0};
    // a = f 2^e with f in [1, 2), from the exponent bits (subnormals scaled up by 2^54 first,
    // the top binade down by 2)
    int e = 0;
    if (a.hi < std::numeric_limits<double>::min()) {
        a = {a.hi * 18014398509481984.0, a.lo * 18014398509481984.0};
        e = -54;
    } else if (a.hi >= 8.98846567431158e307) {  // 2^1023: its reciprocal is not a normal double
        a = {a.hi * 0.5, a.lo * 0.5};
        e = 1;
    }
    std::uint64_t bits;
    std::memcpy(&bits, &a.hi, sizeof bits);
    const int biased = static_cast<int>((bits >> 52) & 0x7ff);
    e += biased - 1023;
    const std::uint64_t scale_bits = static_cast<std::uint64_t>(2046 - biased) << 52;  // 2^-(biased-1023)
    double scale;
    std::memcpy(&scale, &scale_bits, sizeof scale);
    const DoubleDouble f{a.hi * scale, a.lo * scale};  // [1, 2), exact (lo may lose bits below 2^-1074)
    const int j = static_cast<int>((f.hi - 1) * 64 + 0.5);
    const double c = 1 + j / 64.0;
    const DoubleDouble t = (f - c) / (f + c);
    const DoubleDouble w = t * t;
    const double inner = 1.0 / 7 + w.hi * (1.0 / 9 + w.hi * (1.0 / 11 + w.hi / 13));
    const DoubleDouble series = kOneThird + w * (kOneFifth + w * inner);  // (atanh(t)/t - 1) / t^2
    const DoubleDouble ln_f = kLnTable[j] + mul_pwr2(t + t * w * series, 2.0);
    return e == 0 ? ln_f : ln_f + DoubleDouble{kLn2Hi, kLn2Lo} * static_cast<double>(e);
}
inline DoubleDouble dd_log(double a) { return dd_log(dd(a)); }

}  // namespace tallyproof
