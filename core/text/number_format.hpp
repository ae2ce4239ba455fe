// How numbers are written for people: statistics, counts and probabilities at every size.
// A probability is never written as 0: below the double range it is written from its log10.
#pragma once
#include <cstdint>
#include <string>

#include "chi_square_tail.hpp"

namespace tallyproof {

std::string format_fixed(double x, int decimals);        // "5.27"; "n/a" when not finite
std::string format_count(double x);                       // "1234" (whole) or "12.5"
std::string format_grouped(std::uint64_t v);              // 100000 -> "100,000" (replicates, hits)
std::string format_plain(double x);                       // shortest form: "0.05", "1e-06"
// printf's %g with `digits` significant digits ("inf", "-inf" and "nan" as printf writes them):
// a value quoted in a message or a label as computed.
std::string format_general(double x, int digits);
std::string format_significant(double x, int digits);     // "0.0431", "3.21 × 10⁻⁵"
std::string format_probability(const TailProbability& p); // 3 significant digits at any size
std::string format_p_report(const TailProbability& p);    // reporting style: "= .043", "< .001"
std::string superscript_exponent(long long e);            // "⁻¹⁰⁸³"

// The one writer of a × 10^b: the positive number whose log10 is `log10x` (any finite value; p
// below the double range is given only by its log10), to `digits` significant digits, fewer when
// |log10x| is so large that the double holding it cannot give them (one digit from about 1e13 on).
enum class ExponentStyle {
    superscript,  // "3.21 × 10⁻⁵" for people
    e_notation,   // "3.21e-5" for spreadsheets and programs (trailing zeros dropped)
};
std::string format_power_of_ten(double log10x, int digits, ExponentStyle style = ExponentStyle::superscript);

}  // namespace tallyproof
