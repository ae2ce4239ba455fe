// Number writing: reporting style for p (common practice: three decimals, no leading zero,
// "< .001" below) and scientific notation from log10 so nothing is ever shown as 0.
#include <doctest/doctest.h>

#include "number_format.hpp"

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
    CHECK(format_probability({1.0, 0.0}) == "1");
}

TEST_CASE("fixed and significant") {
    CHECK(format_fixed(5.2666, 2) == "5.27");
    CHECK(format_significant(0.05, 2) == "0.050");
    CHECK(format_count(120) == "120");
    CHECK(superscript_exponent(-42) == "⁻⁴²");
}
