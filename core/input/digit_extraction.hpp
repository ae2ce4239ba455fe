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
#include "number_reading.hpp"
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

// What a digit test needs from one number, gathered without allocating.
struct WrittenDigits {
    bool is_number = false;
    bool is_zero = false;      // every mantissa digit is 0
    bool has_exponent = false;
    int significant = 0;       // significant digits written (from the first non-zero one)
    char first = 0, second = 0;  // the first two significant digits (0 when not written)
    char last = 0;             // the last mantissa digit written
    double magnitude = 0;      // |value|, set by the caller when a floor needs it
};
// The mantissa digits of text already known to be a number (this file's token grammar, or a
// cell that number_reading's read_number accepts): the ASCII digits before any 'e' or 'E'
// (signs, currency and percent signs, separators and decimal marks hold none). Magnitude 0.
WrittenDigits written_digits(std::string_view number);

// One spreadsheet cell read as number_reading's read_number reads it (any locale form it
// accepts, with decimal mark `mark`), then its written digits: not a number exactly when
// read_number refuses the cell. The plain form ("-1234.50": minus, digits, one decimal mark)
// is read in one pass without converting to a double unless `with_magnitude`.
WrittenDigits cell_digits(std::string_view cell, DecimalMark mark, bool with_magnitude);

enum class DigitExclusion {
    not_a_number,       // not readable as a number
    zero,               // zero has no significant digits
    too_few_digits,     // fewer significant digits written than the test needs ("7": no second digit)
    below_minimum,      // |value| below the floor (Nigrini: under 10 for the first-two test)
    exponent_notation,  // last-digit tests: "1.2e5" does not show its last digit
    odd_last_digit,     // last_even test: an odd last digit, which the even-only law says cannot occur
};
constexpr int kDigitExclusionReasons = static_cast<int>(DigitExclusion::odd_last_digit) + 1;  // how many reasons there are
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

// The same tally streamed one value at a time, so that memory stays that of the tally (the
// categories), not of the values: add() counts a value or returns why it was left out.
// tally() gives counts, excluded, first_excluded, values and used so far; notes and status are
// left to the caller, who knows where values come from.
class DigitCounter {
public:
    explicit DigitCounter(DigitTest test, const DigitExtractionOptions& options = {});
    bool needs_magnitude() const { return floor_ > 0; }  // add() compares magnitudes with a floor
    double minimum_magnitude() const { return floor_; }    // the floor: values with |x| below it are left out
    // Counts one value; returns the reason it was left out (a DigitExclusion), or -1 when counted.
    int add(const WrittenDigits& w) {
        ++values_;
        int why = -1;
        if (!w.is_number) why = static_cast<int>(DigitExclusion::not_a_number);
        else if (w.is_zero) why = static_cast<int>(DigitExclusion::zero);
        else if (w.magnitude < floor_) why = static_cast<int>(DigitExclusion::below_minimum);
        else if (w.significant < need_) why = static_cast<int>(DigitExclusion::too_few_digits);
        else if (last_ && w.has_exponent) why = static_cast<int>(DigitExclusion::exponent_notation);
        else {
            int slot = 0;
            switch (test_) {
                case DigitTest::first: slot = w.first - '1'; break;
                case DigitTest::second: slot = w.second - '0'; break;
                case DigitTest::first_two: slot = 10 * (w.first - '0') + (w.second - '0') - 10; break;
                case DigitTest::last: slot = w.last - '0'; break;
                case DigitTest::last_even: {
                    const int d = w.last - '0';
                    if (d % 2 != 0) { why = static_cast<int>(DigitExclusion::odd_last_digit); break; }
                    slot = d / 2;  // 0, 2, 4, 6, 8 in slots 0..4
                    break;
                }
            }
            if (why < 0) {
                ++counts_[slot];  // whole numbers: no floating-point add in the loop
                return -1;
            }
        }
        if (excluded_[why]++ == 0) first_excluded_[why] = values_;
        return why;
    }
    // add(cell_digits(cell, mark, needs_magnitude())), in one call.
    int add_cell(std::string_view cell, DecimalMark mark);
    DigitTally tally() const;
private:
    static constexpr int kSlots = 90;  // the most categories: first-two digits 10..99
    DigitTest test_;
    double floor_ = 0;
    int need_ = 1;
    bool last_ = false;
    std::size_t values_ = 0;
    std::size_t counts_[kSlots] = {};
    std::size_t excluded_[kDigitExclusionReasons] = {};
    std::size_t first_excluded_[kDigitExclusionReasons] = {};
};

}  // namespace tallyproof
