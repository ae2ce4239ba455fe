// portable_log (fdlibm's algorithm, core/numerics/portable_log.hpp) against the platform's std::log
// (glibc's log, itself correctly rounded in practice: glibc 2.28+ claims < 0.52 ulp), within 1 ulp,
// over random bit patterns of every exponent, the neighbourhood of 1, subnormals and special values;
// portable_log1p against std::log1p within 4 ulps.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdint>
#include <cstring>
#include <limits>

#include "portable_log.hpp"
#include "random.hpp"

using namespace tallyproof;

namespace {

double ulps_apart(double a, double b) {
    if (a == b) return 0;
    const double ulp = std::fabs(std::nextafter(b, a) - b);
    return std::fabs(a - b) / ulp;
}

double from_bits(std::uint64_t b) {
    double x;
    std::memcpy(&x, &b, sizeof x);
    return x;
}

}  // namespace

TEST_CASE("portable_log is within 1 ulp of std::log (glibc) everywhere") {
    Xoshiro256 g = seed_xoshiro256(2026);
    double worst = 0;
    long checked = 0;
    for (int i = 0; i < 2000000; ++i) {  // random positive finite doubles: every exponent, subnormals too
        const double x = from_bits(next_u64(&g) & 0x7fffffffffffffffULL);
        if (!std::isfinite(x) || x == 0) continue;
        worst = std::max(worst, ulps_apart(portable_log(x), std::log(x)));
        ++checked;
    }
    for (int i = 0; i < 1000000; ++i) {  // [0.5, 2): where the reduction does the least and log is near 0
        const double x = 0.5 + 1.5 * next_unit(&g);
        worst = std::max(worst, ulps_apart(portable_log(x), std::log(x)));
    }
    for (int i = 1; i <= 100000; ++i) {  // 1 +- i ulps: the |f| < 2^-20 branch
        const double up = 1.0 + i * 0x1.0p-52, down = 1.0 - i * 0x1.0p-53;
        worst = std::max(worst, ulps_apart(portable_log(up), std::log(up)));
        worst = std::max(worst, ulps_apart(portable_log(down), std::log(down)));
    }
    for (int i = 1; i <= 1000000; ++i) {  // whole numbers, as BTRD takes logs of count ratios
        worst = std::max(worst, ulps_apart(portable_log(static_cast<double>(i)), std::log(static_cast<double>(i))));
    }
    CAPTURE(checked);
    CHECK(worst <= 1.0);
    CHECK(portable_log(1.0) == 0.0);
    CHECK(portable_log(0.0) == -std::numeric_limits<double>::infinity());
    CHECK(std::isnan(portable_log(-1.0)));
    CHECK(std::isnan(portable_log(std::numeric_limits<double>::quiet_NaN())));
    CHECK(portable_log(std::numeric_limits<double>::infinity()) == std::numeric_limits<double>::infinity());
    CHECK(portable_log(std::numeric_limits<double>::denorm_min()) == std::log(std::numeric_limits<double>::denorm_min()));
}

TEST_CASE("portable_log1p is within 4 ulps of std::log1p (glibc) on (-0.5, 1e6)") {
    Xoshiro256 g = seed_xoshiro256(1993);
    double worst = 0;
    for (int i = 0; i < 1000000; ++i) {
        const double e = -60 + 80 * next_unit(&g);  // |x| from 1e-18 to 1e6
        double x = std::ldexp(1.0 + next_unit(&g), static_cast<int>(std::floor(e)));
        if (i % 2 && x < 0.5) x = -x;
        worst = std::max(worst, ulps_apart(portable_log1p(x), std::log1p(x)));
    }
    CHECK(worst <= 4.0);
    CHECK(portable_log1p(0.0) == 0.0);
    CHECK(portable_log1p(1e-300) == 1e-300);
}
