// Benford probabilities from log1p(1/d) / ln 10, which keeps full relative accuracy for the
// small first-two-digit shares (Benford 1938; Hill 1995, Statistical Science 10:354-363, for the
// second-digit sum); uniform last digits are 1/10 and 1/5 exactly as doubles allow.
#include "digit_laws.hpp"

#include <cmath>
#include <limits>

namespace tallyproof {
namespace {

constexpr double kLn10 = 2.302585092994045684;
double log10_one_plus_inverse(double x) { return std::log1p(1.0 / x) / kLn10; }

}  // namespace

const char* digit_test_name(DigitTest test) {
    switch (test) {
        case DigitTest::first: return "first digit";
        case DigitTest::second: return "second digit";
        case DigitTest::first_two: return "first two digits";
        case DigitTest::last: return "last digit";
        case DigitTest::last_even: return "last digit (even values only)";
    }
    return "unknown";
}

std::vector<int> digit_values(DigitTest test) {
    std::vector<int> v;
    switch (test) {
        case DigitTest::first: for (int d = 1; d <= 9; ++d) v.push_back(d); break;
        case DigitTest::second:
        case DigitTest::last: for (int d = 0; d <= 9; ++d) v.push_back(d); break;
        case DigitTest::first_two: for (int d = 10; d <= 99; ++d) v.push_back(d); break;
        case DigitTest::last_even: for (int d = 0; d <= 8; d += 2) v.push_back(d); break;
    }
    return v;
}

std::vector<double> digit_probabilities(DigitTest test) {
    std::vector<double> p;
    for (int d : digit_values(test)) {
        switch (test) {
            case DigitTest::first: p.push_back(benford_first_digit(d)); break;
            case DigitTest::second: p.push_back(benford_second_digit(d)); break;
            case DigitTest::first_two: p.push_back(benford_first_two_digits(d)); break;
            case DigitTest::last: p.push_back(0.1); break;
            case DigitTest::last_even: p.push_back(0.2); break;
        }
    }
    return p;
}

double benford_first_digit(int d) {
    if (d < 1 || d > 9) return std::numeric_limits<double>::quiet_NaN();
    return log10_one_plus_inverse(d);
}

double benford_second_digit(int d) {
    if (d < 0 || d > 9) return std::numeric_limits<double>::quiet_NaN();
    double s = 0;
    for (int k = 1; k <= 9; ++k) s += std::log1p(1.0 / (10 * k + d));
    return s / kLn10;
}

double benford_first_two_digits(int d) {
    if (d < 10 || d > 99) return std::numeric_limits<double>::quiet_NaN();
    return log10_one_plus_inverse(d);
}

}  // namespace tallyproof
