// Digit laws: the expected shares of first, second and first-two significant digits under
// Benford's law (Benford 1938, Proceedings of the American Philosophical Society 78:551-572;
// Nigrini 2012, "Benford's Law", Wiley, ch. 5), and uniform last digits (all ten, or the five
// even ones for instruments that show only even values). Accurate to a few ulps (log1p).
#pragma once
#include <vector>

namespace tallyproof {

enum class DigitTest {
    first,      // first significant digit, 1..9
    second,     // second significant digit, 0..9
    first_two,  // first two significant digits, 10..99
    last,       // last written digit, 0..9, uniform
    last_even,  // last written digit when only even values are shown: 0, 2, 4, 6, 8, uniform
};

const char* digit_test_name(DigitTest test);  // "first digit", "second digit", ...

std::vector<int> digit_values(DigitTest test);           // the categories, ascending
std::vector<double> digit_probabilities(DigitTest test);  // expected shares, one per digit_values entry

double benford_first_digit(int d);       // log10(1 + 1/d), d = 1..9; NaN otherwise
double benford_second_digit(int d);      // sum_{k=1..9} log10(1 + 1/(10k + d)), d = 0..9; NaN otherwise
double benford_first_two_digits(int d);  // log10(1 + 1/d), d = 10..99; NaN otherwise

}  // namespace tallyproof
