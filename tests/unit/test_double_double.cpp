// Double-double arithmetic (core/base/double_double.hpp) against mpmath. Every reference value is
// mpmath 1.2.1 at 50 digits, split into hi = the nearest double and lo = the nearest double to the
// rest, for the exact double (or double-double) inputs shown.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <initializer_list>
#include <limits>

#include "double_double.hpp"

using namespace tallyproof;

namespace {

// |got - ref| / |ref|, the difference taken in double-double
double relative_error(DoubleDouble got, DoubleDouble ref) {
    return std::fabs(to_double(got - ref)) / std::fabs(ref.hi);
}

}  // namespace

TEST_CASE("double-double: error-free sum and product are exact") {
    // mpmath 1.2.1 at 50 digits: 1e16 + 1.2345 and (double 1/3) * (double 0.1), exactly
    const DoubleDouble s = two_sum(1e16, 1.2345);
    CHECK(s.hi == 1.0000000000000002e+16);
    CHECK(s.lo == -0.7655000000000001);
    const DoubleDouble p = two_prod(1.0 / 3, 0.1);
    CHECK(p.hi == 0.03333333333333333);
    CHECK(p.lo == 4.625929269271485e-19);
    // mpmath 1.2.1 at 50 digits: (double sqrt 2)^2 = 2.0000000000000004 - 1.706568635435857e-16
    const DoubleDouble q = two_prod(1.4142135623730951, 1.4142135623730951);
    CHECK(q.hi == 2.0000000000000004);
    CHECK(q.lo == -1.706568635435857e-16);
    // Dekker's split is guarded near the top of the range: the product stays exact
    const DoubleDouble big = two_prod(1e300, 3.0);
    CHECK(big.hi == 3e300);
    CHECK(std::isfinite(big.lo));
}

TEST_CASE("double-double: add, subtract, multiply, divide to ~2^-104") {
    // Operands: 1/3 and 2/7 rounded to double-double (mpmath 1.2.1 at 50 digits).
    const DoubleDouble a{0.3333333333333333, 1.850371707708594e-17};
    const DoubleDouble b{0.2857142857142857, 1.586032892321652e-17};
    // mpmath 1.2.1 at 50 digits, the exact results for those double-double operands
    CHECK(relative_error(a + b, {0.6190476190476191, -2.1147105230955365e-17}) < 1e-31);
    CHECK(relative_error(a - b, {0.047619047619047616, 2.64338815386942e-18}) < 1e-31);
    CHECK(relative_error(a * b, {0.09523809523809523, 5.28677630773884e-18}) < 1e-31);
    CHECK(relative_error(a / b, {1.1666666666666667, -7.401486830834377e-17}) < 1e-31);
    // mpmath 1.2.1 at 50 digits: 1/3 from doubles
    CHECK(relative_error(dd(1.0) / 3.0, a) < 1e-31);
}

TEST_CASE("double-double: exp to ~1e-30 relative") {
    struct Case {
        double x;
        DoubleDouble ref;  // mpmath 1.2.1 at 50 digits: exp(x) for the double x
    };
    const Case cases[] = {
        {1.0, {2.718281828459045, 1.4456468917292502e-16}},
        {-1.0, {0.36787944117144233, -1.2428753672788363e-17}},
        {0.5, {1.6487212707001282, -4.731568479435833e-17}},
        {1e-10, {1.0000000001, -8.269037096265652e-18}},
        {-0.693147180559945, {0.5000000000000002, -4.3915917162026297e-17}},
        {-300.25, {4.009422364622857e-131, -9.421845746665655e-148}},
        {700.25, {1.3022997366991783e+304, 7.154767958193286e+287}},
    };
    for (const Case& c : cases) {
        CAPTURE(c.x);
        // the reduction x - m ln 2 uses ln 2 to ~4e-33 relative, so the error grows with m = x / ln 2:
        // measured 4e-32 for |x| <= 1, 1.0e-30 at x = 700.25
        CHECK(relative_error(dd_exp(dd(c.x)), c.ref) < (std::fabs(c.x) < 2 ? 1e-31 : 2e-30));
    }
    CHECK(dd_exp(dd(0.0)).hi == 1.0);
    CHECK(dd_exp(dd(-800.0)).hi == 0.0);
    CHECK(std::isinf(dd_exp(dd(800.0)).hi));
}

TEST_CASE("double-double: log to ~1e-31 relative, across the whole double range") {
    struct Case {
        double x;
        DoubleDouble ref;  // mpmath 1.2.1 at 50 digits: log(x) for the double x
    };
    const Case cases[] = {
        {2.0, {0.6931471805599453, 2.3190468138462996e-17}},
        {10.0, {2.302585092994046, -2.1707562233822494e-16}},
        {12345.678, {9.421061321291832, -1.9085650743481053e-16}},
        {1.0078125, {0.007782140442054949, -1.2819179123343845e-20}},
        {1.0000000000009095, {9.094947017725146e-13, 2.5077212817525026e-37}},  // 1 + 2^-40
        {0.9999999999999999, {-1.1102230246251565e-16, -6.162975822039155e-33}},
        {1e-300, {-690.7755278982137, -2.3670096176709832e-14}},
        {5e-324, {-744.4400719213812, -4.422444340918698e-14}},  // smallest subnormal
        {1.7976931348623157e308, {709.782712893384, 2.3636017071323592e-14}},  // largest double
    };
    for (const Case& c : cases) {
        CAPTURE(c.x);
        CHECK(relative_error(dd_log(c.x), c.ref) < 4e-31);
    }
    CHECK(dd_log(1.0).hi == 0.0);
    CHECK(std::isinf(dd_log(0.0).hi));
    CHECK(std::isnan(dd_log(-1.0).hi));
}

TEST_CASE("double-double: log and exp invert each other") {
    // Identity (common practice): log(exp(y)) = y, here to ~1e-30 relative. Below e^-635 (~2^-916)
    // the low part of exp(y) is subnormal and the pair holds fewer than 106 bits, so y >= -600.
    for (double y : {-600.0, -123.456, -1.0, -1e-8, 3e-5, 0.75, 42.0, 699.0}) {
        CAPTURE(y);
        const DoubleDouble back = dd_log(dd_exp(dd(y)));
        CHECK(std::fabs(to_double(back - dd(y))) <= 1e-30 * std::max(1.0, std::fabs(y)));
    }
}
