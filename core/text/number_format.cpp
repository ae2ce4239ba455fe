// Number writing rules (common practice in statistical reporting): p to three decimals with no
// leading zero, "< .001" below that; tiny values in scientific notation with Unicode
// superscript exponents, mantissa and exponent taken from log10 so nothing underflows.
#include "number_format.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstring>

namespace tallyproof {

std::string superscript_exponent(long long e) {
    static const char* digits[] = {"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"};
    std::string s = e < 0 ? "⁻" : "";
    const std::string d = std::to_string(e);
    for (char c : d)
        if (c != '-') s += digits[c - '0'];
    return s;
}

std::string format_power_of_ten(double log10x, int digits, ExponentStyle style) {
    if (!std::isfinite(log10x)) return "n/a";
    // |log10x| up to about 9e15 holds its integer part exactly, so floor() is the true exponent and
    // log10x - e (exact by Sterbenz's lemma) the mantissa's log. The mantissa's relative error is
    // ln 10 times the absolute error of log10x, taken as a few units in its last place.
    const double e_floor = std::floor(log10x);
    if (std::fabs(e_floor) > 9e15) return "n/a";
    long long e = static_cast<long long>(e_floor);
    const double spread = 2 * 2.302585092994046 * std::fabs(log10x) * 1.6e-15;
    const int supported = spread > 0 ? static_cast<int>(std::floor(-std::log10(spread))) + 1 : digits;
    digits = std::max(1, std::min(digits, supported));
    double m = std::pow(10.0, log10x - e_floor);
    const double scale = std::pow(10.0, digits - 1);
    m = std::round(m * scale) / scale;
    if (m >= 10) { m /= 10; ++e; }
    char buf[64];
    if (style == ExponentStyle::e_notation) {
        std::snprintf(buf, sizeof buf, "%.*ge%lld", digits, m, e);
        return buf;
    }
    std::snprintf(buf, sizeof buf, "%.*f", digits - 1, m);
    return std::string(buf) + " × 10" + superscript_exponent(e);
}

std::string format_fixed(double x, int decimals) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, x);
    // A tiny negative value rounds to "-0.00": the sign says nothing at the digits shown.
    if (buf[0] == '-' && std::strspn(buf + 1, "0.") == std::strlen(buf + 1)) return buf + 1;
    return buf;
}

std::string format_count(double x) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    // Whole numbers are written out in full (a count of 6000000000000001 is not "6e+15"); every
    // whole number is exact in a double up to 2^53, and a total beyond it is the double's value.
    if (x == std::floor(x) && std::fabs(x) < 1e18) std::snprintf(buf, sizeof buf, "%.0f", x);
    else std::snprintf(buf, sizeof buf, "%.16g", x);
    return buf;
}

std::string format_plain(double x) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", x);
    return buf;
}

std::string format_general(double x, int digits) {
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*g", digits, x);
    return buf;
}

std::string format_significant(double x, int digits) {
    if (!std::isfinite(x)) return "n/a";
    if (x == 0) return "0";
    const double ax = std::fabs(x);
    if (ax >= 1e-3 && ax < 1e6) {
        const int mag = static_cast<int>(std::floor(std::log10(ax)));
        const int decimals = std::max(0, digits - 1 - mag);
        return format_fixed(x, decimals);
    }
    return (x < 0 ? "-" : "") + format_power_of_ten(std::log10(ax), digits);
}

std::string format_grouped(std::uint64_t v) {
    std::string s = std::to_string(v);
    for (int i = static_cast<int>(s.size()) - 3; i > 0; i -= 3) s.insert(static_cast<std::size_t>(i), ",");
    return s;
}

std::string format_probability(const TailProbability& p) {
    if (std::isnan(p.p) || std::isnan(p.log10_p)) return "n/a";
    if (p.p >= 1) return "1.000";  // as many decimals as a p just below 1 ("0.9996" is "1.000"); never a bare "1"
    if (p.p > 0 && p.p >= 1e-3) return format_significant(p.p, 3);
    if (std::isinf(p.log10_p)) return "0";  // a true zero (lower tail at x = 0)
    return format_power_of_ten(p.log10_p, p.log10_p < -300 ? 2 : 3);
}

std::string format_p_report(const TailProbability& p) {
    if (std::isnan(p.p)) return "= n/a";
    if (p.p < 0.001) return "< .001";
    char buf[32];
    std::snprintf(buf, sizeof buf, "%.3f", p.p);
    const char* s = buf;
    if (s[0] == '0') ++s;  // no leading zero for a probability
    if (std::string(s) == "1.000") return "> .999";
    return std::string("= ") + s;
}

}  // namespace tallyproof
