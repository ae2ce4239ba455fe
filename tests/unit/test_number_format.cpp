// Number writing: reporting style for p (common practice: three decimals, no leading zero,
// "< .001" below) and scientific notation from log10 so nothing is ever shown as 0.
#include <doctest/doctest.h>

#include "number_format.hpp"

#include <cmath>
#include <cstdint>
#include <string>
#include <vector>

using namespace tallyproof;

TEST_CASE("reporting style") {
    CHECK(format_p_report({0.0432, -1.3645}) == "= .043");
    CHECK(format_p_report({0.00099, -3.0044}) == "< .001");
    CHECK(format_p_report({0.9996, -0.0002}) == "> .999");
}

TEST_CASE("probabilities at every size") {
    CHECK(format_probability({0.15329, -0.8145}) == "0.153");
    CHECK(format_probability({0.0431, -1.3655}) == "0.0431");
    CHECK(format_probability({3.2149e-5, -4.49285}) == "3.21 × 10⁻⁵");
    // 10^-1082.5 = 3.16 x 10^-1083: below the double range, written from log10 alone.
    CHECK(format_probability({0.0, -1082.5}) == "3.2 × 10⁻¹⁰⁸³");
    CHECK(format_probability({1.0, 0.0}) == "1.000");  // a capped adjusted p: three decimals, like 0.9996
}

TEST_CASE("fixed and significant") {
    CHECK(format_fixed(5.2666, 2) == "5.27");
    CHECK(format_fixed(-0.001, 2) == "0.00");  // no "-0.00"
    CHECK(format_fixed(-0.006, 2) == "-0.01");
    CHECK(format_significant(0.05, 2) == "0.050");
    CHECK(format_count(120) == "120");
    CHECK(format_count(6000000000000001.0) == "6000000000000001");  // exact below 2^53 (IEEE 754 double, common practice)
    CHECK(format_count(9007199254740992.0) == "9007199254740992");
    CHECK(superscript_exponent(-42) == "⁻⁴²");
}

namespace {
// "3.21 × 10⁻⁵" back to mantissa text and exponent.
bool parse_superscript(const std::string& s, std::string* mantissa, long long* exponent) {
    const auto times = s.find(" × 10");
    if (times == std::string::npos) return false;
    *mantissa = s.substr(0, times);
    std::string rest = s.substr(times + std::string(" × 10").size()), digits;
    static const char* const sup[] = {"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"};
    bool negative = false;
    for (std::size_t i = 0; i < rest.size();) {
        if (rest.compare(i, 3, "⁻") == 0) { negative = true; i += 3; continue; }
        bool found = false;
        for (int d = 0; d < 10 && !found; ++d) {
            const std::string g = sup[d];
            if (rest.compare(i, g.size(), g) == 0) { digits += static_cast<char>('0' + d); i += g.size(); found = true; }
        }
        if (!found) return false;
    }
    if (digits.empty()) return false;
    *exponent = (negative ? -1 : 1) * std::stoll(digits);
    return true;
}
}  // namespace

// Property over the whole range of log10 p from 0 down to -1e15 (issue 17: [1e12, 1] printed an
// exponent of -2147483648): the exponent is floor(log10 p) (or one more when the mantissa rounds
// up to 10), the mantissa lies in [1, 10) and matches 10^(log10 p - exponent) computed in long
// double to half a unit in its last printed digit plus what the double log10 p itself can carry.
TEST_CASE("a × 10^b is right for every log10 p from 0 down to -1e15") {
    std::uint64_t state = 12345;
    auto uniform = [&] {  // SplitMix64 (Steele, Lea & Flood 2014), to [0, 1)
        std::uint64_t z = (state += 0x9E3779B97F4A7C15ull);
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
        return static_cast<double>((z ^ (z >> 31)) >> 11) * 0x1.0p-53;
    };
    std::vector<double> logs = {-1e15, -999999999999999.9, -2147483648.5, -2147483649, -217147240957.0725,
                                -4.0000000001, -3.99999999, -1e-9, -308.2, -1082.5};
    for (int i = 0; i < 20000; ++i) logs.push_back(-std::pow(10.0, 15 * uniform()) * (1 + uniform()) / 2);
    int checked = 0;
    for (const double L : logs) {
        for (const int digits : {1, 2, 3}) {
            std::string mantissa;
            long long e = 0;
            const std::string s = format_power_of_ten(L, digits);
            REQUIRE_MESSAGE(parse_superscript(s, &mantissa, &e), s);
            const double m = std::stod(mantissa);
            const long long floor_l = static_cast<long long>(std::floor(L));
            CHECK_MESSAGE((e == floor_l || (e == floor_l + 1 && m == 1)), s, " for log10 ", L);
            CHECK(m >= 1);
            CHECK(m < 10);
            const int printed = static_cast<int>(mantissa.size()) - (mantissa.find('.') == std::string::npos ? 0 : 1);
            if (std::fabs(L) < 1e11) CHECK(printed == digits);
            CHECK(printed >= 1);
            const long double exact = std::pow(10.0L, static_cast<long double>(L) - static_cast<long double>(e));
            const long double carried = 2.302585092994046L * std::fabs(L) * 2.3e-16L * exact;
            CHECK_MESSAGE(std::fabs(m - exact) <= 0.5L * std::pow(10.0L, 1 - printed) * 1.000001L + carried, s, " for log10 ", L);
            // The spreadsheet form is the same number.
            const std::string csv = format_power_of_ten(L, digits, ExponentStyle::e_notation);
            const auto epos = csv.find('e');
            REQUIRE(epos != std::string::npos);
            CHECK(std::stod(csv.substr(0, epos)) == m);
            CHECK(std::stoll(csv.substr(epos + 1)) == e);
            ++checked;
        }
        const std::string p = format_probability({0.0, L});  // p = 0 given only as its logarithm
        CHECK(p != "0");
        CHECK(p.find("2147483648") == std::string::npos);
    }
    CHECK(checked == 3 * static_cast<int>(logs.size()));
    CHECK(format_probability({0.0, -217147240957.0725}) == "8.5 × 10⁻²¹⁷¹⁴⁷²⁴⁰⁹⁵⁸");  // mpmath: log10 p of [1e12, 1]
}
