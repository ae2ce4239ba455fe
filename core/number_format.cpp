// Number writing rules (common practice in statistical reporting): p to three decimals with no
// leading zero, "< .001" below that; tiny values in scientific notation with Unicode
// superscript exponents, mantissa and exponent taken from log10 so nothing underflows.
#include "number_format.hpp"

#include <cmath>
#include <cstdio>

namespace tallyproof {

std::string superscript_exponent(int e) {
    static const char* digits[] = {"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"};
    std::string s = e < 0 ? "⁻" : "";
    const std::string d = std::to_string(e < 0 ? -static_cast<long long>(e) : static_cast<long long>(e));
    for (char c : d) s += digits[c - '0'];
    return s;
}

std::string format_fixed(double x, int decimals) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", decimals, x);
    return buf;
}

std::string format_count(double x) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    if (x == std::floor(x) && std::fabs(x) < 1e15) std::snprintf(buf, sizeof buf, "%.0f", x);
    else std::snprintf(buf, sizeof buf, "%.4g", x);
    return buf;
}

std::string format_plain(double x) {
    if (!std::isfinite(x)) return "n/a";
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.6g", x);
    return buf;
}

namespace {
// mantissa m in [1, 10) and exponent e of 10^log10x, rounded to `digits` significant digits.
std::string scientific_from_log10(double log10x, int digits) {
    int e = static_cast<int>(std::floor(log10x));
    double m = std::pow(10.0, log10x - e);
    const double scale = std::pow(10.0, digits - 1);
    m = std::round(m * scale) / scale;
    if (m >= 10) { m /= 10; ++e; }
    char buf[64];
    std::snprintf(buf, sizeof buf, "%.*f", digits - 1, m);
    return std::string(buf) + " × 10" + superscript_exponent(e);
}
}  // namespace

std::string format_significant(double x, int digits) {
    if (!std::isfinite(x)) return "n/a";
    if (x == 0) return "0";
    const double ax = std::fabs(x);
    if (ax >= 1e-3 && ax < 1e6) {
        const int mag = static_cast<int>(std::floor(std::log10(ax)));
        const int decimals = std::max(0, digits - 1 - mag);
        return format_fixed(x, decimals);
    }
    return (x < 0 ? "-" : "") + scientific_from_log10(std::log10(ax), digits);
}

std::string format_probability(const TailProbability& p) {
    if (std::isnan(p.p) || std::isnan(p.log10_p)) return "n/a";
    if (p.p >= 1) return "1";
    if (p.p > 0 && p.p >= 1e-3) return format_significant(p.p, 3);
    if (std::isinf(p.log10_p)) return "0";  // a true zero (lower tail at x = 0)
    return scientific_from_log10(p.log10_p, p.log10_p < -300 ? 2 : 3);
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
