// Digit extraction by reading the written characters (no floating-point round trip), so that
// "0.0347" gives 3 then 4 and "12.50" ends in 0 exactly as written. The first-two floor of 10
// is Nigrini's (2012) practice; the other rules are documented choices (digit_extraction.hpp).
#include "digit_extraction.hpp"

#include <algorithm>
#include <cstdlib>
#include <cmath>

namespace tallyproof {
namespace {

constexpr int kReasons = 6;

bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f'; }

int default_minimum_digits(DigitTest test) {
    return test == DigitTest::second || test == DigitTest::first_two ? 2 : 1;
}

}  // namespace

NumberToken read_number_token(std::string_view s, bool with_magnitude) {
    NumberToken t;
    std::size_t b = 0, e = s.size();
    while (b < e && is_space(s[b])) ++b;
    while (e > b && is_space(s[e - 1])) --e;
    s = s.substr(b, e - b);
    std::size_t i = 0;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    std::string digits, plain;  // all written mantissa digits; the text strtod reads
    // integer part, with commas allowed only as thousands separators
    std::size_t group = 0;
    bool commas = false, group_ok = true;
    while (i < s.size() && (is_digit(s[i]) || s[i] == ',')) {
        if (s[i] == ',') {
            if ((!commas && (group < 1 || group > 3)) || (commas && group != 3)) group_ok = false;
            commas = true;
            group = 0;
        } else {
            digits += s[i];
            ++group;
        }
        ++i;
    }
    if (commas && group != 3) group_ok = false;
    if (!group_ok) return t;
    if (i < s.size() && s[i] == '.') {
        ++i;
        while (i < s.size() && is_digit(s[i])) digits += s[i++];
    }
    if (digits.empty()) return t;
    std::string exponent;
    if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
        ++i;
        if (i < s.size() && (s[i] == '+' || s[i] == '-')) exponent += s[i++];
        const std::size_t start = i;
        while (i < s.size() && is_digit(s[i])) exponent += s[i++];
        if (i == start) return t;
        t.has_exponent = true;
    }
    if (i != s.size()) return t;
    t.is_number = true;
    t.last_digit = digits.back();
    const std::size_t nz = digits.find_first_not_of('0');
    t.is_zero = nz == std::string::npos;
    if (!t.is_zero) t.significant = digits.substr(nz);
    if (!with_magnitude) return t;
    for (char c : s) if (c != ',') plain += c;
    t.magnitude = std::fabs(std::strtod(plain.c_str(), nullptr));  // strtod never throws; overflow gives inf
    return t;
}

const char* digit_exclusion_name(DigitExclusion reason) {
    switch (reason) {
        case DigitExclusion::not_a_number: return "not a number";
        case DigitExclusion::zero: return "zero";
        case DigitExclusion::too_few_digits: return "too few significant digits";
        case DigitExclusion::below_minimum: return "below the minimum value";
        case DigitExclusion::exponent_notation: return "written with an exponent";
        case DigitExclusion::odd_last_digit: return "odd last digit";
    }
    return "unknown";
}

DigitTally tally_digits(const std::vector<std::string>& tokens, DigitTest test, const DigitExtractionOptions& options) {
    DigitTally r;
    r.test = test;
    r.digits = digit_values(test);
    r.counts.assign(r.digits.size(), 0.0);
    r.excluded.assign(kReasons, 0);
    r.first_excluded.assign(kReasons, 0);
    const double floor = options.minimum_absolute_value ? *options.minimum_absolute_value
                                                        : (test == DigitTest::first_two ? 10.0 : 0.0);
    const int need = std::max(default_minimum_digits(test),
                              options.minimum_significant_digits ? *options.minimum_significant_digits : 0);
    const bool last = test == DigitTest::last || test == DigitTest::last_even;
    r.values = tokens.size();
    for (std::size_t k = 0; k < tokens.size(); ++k) {
        const NumberToken t = read_number_token(tokens[k], floor > 0);
        auto exclude = [&](DigitExclusion why) {
            const int w = static_cast<int>(why);
            if (r.excluded[w]++ == 0) r.first_excluded[w] = k + 1;
        };
        if (!t.is_number) { exclude(DigitExclusion::not_a_number); continue; }
        if (t.is_zero) { exclude(DigitExclusion::zero); continue; }
        if (t.magnitude < floor) { exclude(DigitExclusion::below_minimum); continue; }
        if (static_cast<int>(t.significant.size()) < need) { exclude(DigitExclusion::too_few_digits); continue; }
        if (last && t.has_exponent) { exclude(DigitExclusion::exponent_notation); continue; }
        int d = 0;
        switch (test) {
            case DigitTest::first: d = t.significant[0] - '0'; break;
            case DigitTest::second: d = t.significant[1] - '0'; break;
            case DigitTest::first_two: d = 10 * (t.significant[0] - '0') + (t.significant[1] - '0'); break;
            case DigitTest::last:
            case DigitTest::last_even: d = t.last_digit - '0'; break;
        }
        if (test == DigitTest::last_even && d % 2 != 0) { exclude(DigitExclusion::odd_last_digit); continue; }
        // digit_values is ascending and contiguous except for last_even (step 2)
        const std::size_t slot = test == DigitTest::last_even ? static_cast<std::size_t>(d / 2)
                                                              : static_cast<std::size_t>(d - r.digits.front());
        r.counts[slot] += 1;
        ++r.used;
    }
    for (int w = 0; w < kReasons; ++w) {
        if (r.excluded[w] == 0) continue;
        std::string note = std::to_string(r.excluded[w]) + " value" + (r.excluded[w] == 1 ? "" : "s") +
                           " left out of the " + digit_test_name(test) + " test: " +
                           digit_exclusion_name(static_cast<DigitExclusion>(w)) + " (first at value " +
                           std::to_string(r.first_excluded[w]) + ").";
        if (static_cast<DigitExclusion>(w) == DigitExclusion::odd_last_digit)
            note += " An odd last digit contradicts the even-values-only model.";
        r.notes.push_back(note);
    }
    if (r.used == 0)
        r.status = Status::failure(std::string("None of the ") + std::to_string(r.values) +
                                   " values can be used for the " + digit_test_name(test) + " test.");
    return r;
}

}  // namespace tallyproof
