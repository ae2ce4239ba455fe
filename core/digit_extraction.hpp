// Digit extraction for digit-law tests: the first, second, first-two or last digit of numbers
// given as text, so that digits are read as written ("12.50" ends in 0). Conventions follow
// Nigrini 2012 ("Benford's Law", Wiley, ch. 4-5); exclusions are counted by reason. Exact
// (works on the characters; only the optional magnitude floor converts to a double).
#pragma once
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "digit_laws.hpp"
#include "status.hpp"

namespace tallyproof {

// One token read as a number. Accepted: optional spaces, optional sign (+ or -, ignored),
// digits with an optional decimal point ("12.50", ".5", "7."), optionally thousands separated
// by commas in groups of three ("1,234.5"), optionally an exponent ("1.2e5"). Anything else
// (currency signs, decimal commas such as "12,5", words, empty cells) is not a number.
struct NumberToken {
    bool is_number = false;
    bool is_zero = false;         // a number whose digits are all 0
    std::string significant;      // written digits from the first non-zero one ("0.0340" -> "340")
    char last_digit = 0;          // the last digit written, decimals included ("12.50" -> '0')
    bool has_exponent = false;
    double magnitude = 0;         // |value| as a double (rounded), for the optional floor
};
// `with_magnitude`: also convert to a double (slower; only the magnitude floor needs it).
NumberToken read_number_token(std::string_view token, bool with_magnitude = true);

enum class DigitExclusion {
    not_a_number,       // not readable as a number
    zero,               // zero has no significant digits
    too_few_digits,     // fewer significant digits written than the test needs ("7": no second digit)
    below_minimum,      // |value| below the floor (Nigrini: under 10 for the first-two test)
    exponent_notation,  // last-digit tests: "1.2e5" does not show its last digit
    odd_last_digit,     // last_even test: an odd last digit, which the even-only law says cannot occur
};
const char* digit_exclusion_name(DigitExclusion reason);  // plain words, e.g. "not a number"

struct DigitExtractionOptions {
    // Values with |x| below this are excluded. Unset: 10 for DigitTest::first_two (Nigrini
    // 2012, from memory: amounts under 10 have no first-two digits), 0 for the other tests.
    std::optional<double> minimum_absolute_value;
    // Values with fewer written significant digits are excluded. Unset: what the test needs
    // (1 for first and last digits, 2 for second and first-two). A larger value suits
    // last-digit tests, whose law assumes many digits.
    std::optional<int> minimum_significant_digits;
};

struct DigitTally {
    Status status;                   // !ok only when no value is usable (the tally is still filled)
    DigitTest test = DigitTest::first;
    std::vector<int> digits;         // the categories, digit_values(test)
    std::vector<double> counts;      // per digit
    std::size_t values = 0;          // tokens read
    std::size_t used = 0;            // tokens counted in the tally
    std::vector<std::size_t> excluded;        // per DigitExclusion, by its integer value
    std::vector<std::size_t> first_excluded;  // 1-based index of the first token excluded for each reason, or 0
    std::vector<std::string> notes;           // one plain sentence per reason that occurred
    std::size_t excluded_for(DigitExclusion reason) const { return excluded[static_cast<int>(reason)]; }
};

// Tallies the digit `test` needs over `tokens`; the sign is ignored and leading zeros skipped.
DigitTally tally_digits(const std::vector<std::string>& tokens, DigitTest test,
                        const DigitExtractionOptions& options = {});

}  // namespace tallyproof
