// Digit extraction by reading the written characters (no floating-point round trip), so that
// "0.0347" gives 3 then 4 and "12.50" ends in 0 exactly as written. The first-two floor of 10
// is Nigrini's (2012) practice; the other rules are documented choices (digit_extraction.hpp).
// Cells in the plain form are validated and their digits found in one pass with no string or
// double built (a million amounts a second is the common case); other forms go to read_number.
#include "digit_extraction.hpp"

#include <algorithm>
#include <cstdlib>
#include <cmath>

namespace tallyproof {
namespace {


bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_space(char c) { return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f'; }

int default_minimum_digits(DigitTest test) {
    return test == DigitTest::second || test == DigitTest::first_two ? 2 : 1;
}

// The token without surrounding white space, or an empty view when it is not a number by the
// grammar of digit_extraction.hpp.
std::string_view token_number(std::string_view s) {
    std::size_t b = 0, e = s.size();
    while (b < e && is_space(s[b])) ++b;
    while (e > b && is_space(s[e - 1])) --e;
    s = s.substr(b, e - b);
    std::size_t i = 0;
    if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
    // integer part, with commas allowed only as thousands separators
    std::size_t group = 0, digits = 0;
    bool commas = false;
    while (i < s.size() && (is_digit(s[i]) || s[i] == ',')) {
        if (s[i] == ',') {
            if ((!commas && (group < 1 || group > 3)) || (commas && group != 3)) return {};
            commas = true;
            group = 0;
        } else {
            ++digits;
            ++group;
        }
        ++i;
    }
    if (commas && group != 3) return {};
    if (i < s.size() && s[i] == '.') {
        ++i;
        while (i < s.size() && is_digit(s[i])) { ++digits; ++i; }
    }
    if (digits == 0) return {};
    if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
        ++i;
        if (i < s.size() && (s[i] == '+' || s[i] == '-')) ++i;
        const std::size_t start = i;
        while (i < s.size() && is_digit(s[i])) ++i;
        if (i == start) return {};
    }
    if (i != s.size()) return {};
    return s;
}

// |value| of a token that token_number accepted; strtod never throws, overflow gives inf.
double token_magnitude(std::string_view s) {
    std::string plain;
    for (char c : s) if (c != ',') plain += c;
    return std::fabs(std::strtod(plain.c_str(), nullptr));
}

}  // namespace

WrittenDigits written_digits(std::string_view s) {
    WrittenDigits w;
    w.is_number = true;
    std::size_t i = 0;
    for (; i < s.size(); ++i) {
        const char c = s[i];
        if (c == 'e' || c == 'E') { w.has_exponent = true; break; }
        if (!is_digit(c)) continue;
        w.last = c;
        if (w.significant == 0 && c == '0') continue;
        if (w.significant == 0) w.first = c;
        else if (w.significant == 1) w.second = c;
        ++w.significant;
    }
    w.is_zero = w.significant == 0;
    return w;
}

namespace {

// cell_digits for cells in any form but the plain one: read_number decides.
WrittenDigits general_cell_digits(std::string_view cell, DecimalMark mark) {
    const NumberReading r = read_number(cell, mark);
    if (!r.ok) return WrittenDigits{};
    WrittenDigits w = written_digits(cell);
    w.magnitude = std::fabs(r.value);
    return w;
}

// cell_digits; inline so that DigitCounter::add_cell keeps the digits in registers.
inline WrittenDigits plain_cell_digits(std::string_view cell, DecimalMark mark, bool with_magnitude) {
    const char decimal = mark == DecimalMark::point ? '.' : ',';
    const std::size_t n = cell.size();
    if (n > 0 && n <= 200) {  // read_number refuses longer cells; plain ones up to 200 bytes are finite
        const char* p = cell.data();
        const char* const end = p + n;
        if (*p == '-') ++p;
        const char* const begin = p;
        const char* mark_at = nullptr;
        for (; p < end; ++p) {  // leading zeros, and the decimal mark among them
            if (*p == '0') continue;
            if (*p != decimal || mark_at != nullptr) break;
            mark_at = p;
        }
        const char* const first = p < end && is_digit(*p) ? p : nullptr;  // the first significant digit
        for (; p < end; ++p) {
            if (is_digit(*p)) continue;
            if (*p != decimal || mark_at != nullptr) break;
            mark_at = p;
        }
        const std::size_t written = static_cast<std::size_t>(end - begin) - (mark_at != nullptr ? 1 : 0);
        if (p == end && written > 0) {  // the plain form, which read_number always accepts
            WrittenDigits w;
            w.is_number = true;
            w.last = end - 1 != mark_at ? end[-1] : end[-2];
            if (first != nullptr) {
                w.significant = static_cast<int>(end - first) - (mark_at != nullptr && mark_at > first ? 1 : 0);
                w.first = first[0];
                if (w.significant >= 2) w.second = first + 1 != mark_at ? first[1] : first[2];
            } else {
                w.is_zero = true;
            }
            if (with_magnitude) w.magnitude = std::fabs(read_number(cell, mark).value);
            return w;
        }
    }
    return general_cell_digits(cell, mark);
}

}  // namespace

WrittenDigits cell_digits(std::string_view cell, DecimalMark mark, bool with_magnitude) {
    return plain_cell_digits(cell, mark, with_magnitude);
}

int DigitCounter::add_cell(std::string_view cell, DecimalMark mark) {
    return add(plain_cell_digits(cell, mark, floor_ > 0));
}

NumberToken read_number_token(std::string_view token, bool with_magnitude) {
    NumberToken t;
    const std::string_view s = token_number(token);
    if (s.empty()) return t;
    const WrittenDigits w = written_digits(s);
    t.is_number = true;
    t.is_zero = w.is_zero;
    t.last_digit = w.last;
    t.has_exponent = w.has_exponent;
    bool started = false;
    for (char c : s) {
        if (c == 'e' || c == 'E') break;
        if (!is_digit(c) || (!started && c == '0')) continue;
        started = true;
        t.significant += c;
    }
    if (with_magnitude) t.magnitude = token_magnitude(s);
    return t;
}

DigitCounter::DigitCounter(DigitTest test, const DigitExtractionOptions& options) : test_(test) {
    floor_ = options.minimum_absolute_value ? *options.minimum_absolute_value
                                            : (test == DigitTest::first_two ? 10.0 : 0.0);
    need_ = std::max(default_minimum_digits(test),
                     options.minimum_significant_digits ? *options.minimum_significant_digits : 0);
    last_ = test == DigitTest::last || test == DigitTest::last_even;
}

DigitTally DigitCounter::tally() const {
    DigitTally t;
    t.test = test_;
    t.digits = digit_values(test_);
    for (std::size_t i = 0; i < t.digits.size(); ++i) t.counts.push_back(static_cast<double>(counts_[i]));
    t.values = values_;
    for (std::size_t c : counts_) t.used += c;
    t.excluded.assign(excluded_, excluded_ + kDigitExclusionReasons);
    t.first_excluded.assign(first_excluded_, first_excluded_ + kDigitExclusionReasons);
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
    DigitCounter counter(test, options);
    for (const std::string& token : tokens) {
        const std::string_view s = token_number(token);
        WrittenDigits w;
        if (!s.empty()) {
            w = written_digits(s);
            if (counter.needs_magnitude()) w.magnitude = token_magnitude(s);
        }
        counter.add(w);
    }
    DigitTally r = counter.tally();
    for (int w = 0; w < kDigitExclusionReasons; ++w) {
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
