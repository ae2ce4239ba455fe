// Reads numbers as written in spreadsheets of the common locales. Grouping follows the usual
// rule (a first group of 1-3 digits not starting with 0, then groups of exactly 3, one kind of
// separator throughout). Values come from Clinger's (1990, PLDI "How to read floating point
// numbers accurately") exact fast path when it applies, else strtod: correctly rounded.
#include "number_reading.hpp"

#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <limits>

namespace tallyproof {
namespace {

bool is_digit(char c) { return c >= '0' && c <= '9'; }

// Byte-wise match of a short literal at s[i]; the first byte usually decides (hot path).
template <std::size_t N>
inline bool has_at(std::string_view s, std::size_t i, const char (&p)[N]) {
    if (i >= s.size() || s.size() - i < N - 1) return false;
    for (std::size_t k = 0; k < N - 1; ++k)
        if (s[i + k] != p[k]) return false;
    return true;
}

inline bool ascii(char c) { return static_cast<unsigned char>(c) < 0x80; }

// Length of a currency sign at s[i], or 0.
std::size_t currency_at(std::string_view s, std::size_t i) {
    if (i >= s.size()) return 0;
    if (s[i] == '$') return 1;
    if (ascii(s[i])) return 0;
    if (has_at(s, i, "\xC2\xA3") || has_at(s, i, "\xC2\xA5")) return 2;  // £ ¥
    if (has_at(s, i, "\xE2\x82\xAC")) return 3;                         // €
    return 0;
}

std::size_t currency_before(std::string_view s) {
    if (s.empty()) return 0;
    if (s.back() == '$') return 1;
    if (ascii(s.back())) return 0;
    for (std::size_t n : {2u, 3u})
        if (s.size() >= n && currency_at(s, s.size() - n) == n) return n;
    return 0;
}

// Length of a minus sign (ASCII or U+2212) at s[i], or 0.
std::size_t minus_at(std::string_view s, std::size_t i) {
    if (i >= s.size()) return 0;
    if (s[i] == '-') return 1;
    if (ascii(s[i])) return 0;
    if (has_at(s, i, "\xE2\x88\x92")) return 3;
    return 0;
}

// A thousands separator at s[i]: returns its length and sets its kind (a character code).
std::size_t group_at(std::string_view s, std::size_t i, char thousands, int* kind) {
    if (i >= s.size()) return 0;
    if (s[i] == thousands || s[i] == ' ' || s[i] == '\'') { *kind = s[i]; return 1; }
    if (ascii(s[i])) return 0;
    if (has_at(s, i, "\xC2\xA0")) { *kind = 0xA0; return 2; }
    if (has_at(s, i, "\xE2\x80\xAF")) { *kind = 0x202F; return 3; }
    if (has_at(s, i, "\xE2\x80\x99")) { *kind = 0x2019; return 3; }  // typographic apostrophe
    return 0;
}

std::size_t space_at(std::string_view s, std::size_t i) {
    if (i >= s.size()) return 0;
    if (s[i] == ' ' || s[i] == '\t') return 1;
    if (ascii(s[i])) return 0;
    if (has_at(s, i, "\xC2\xA0")) return 2;
    if (has_at(s, i, "\xE2\x80\xAF")) return 3;
    return 0;
}

std::string_view skip_spaces(std::string_view s) {
    std::size_t n;
    while ((n = space_at(s, 0)) > 0) s.remove_prefix(n);
    return s;
}

std::string_view drop_trailing_spaces(std::string_view s) {
    for (;;) {
        if (s.empty()) return s;
        if (s.back() == ' ' || s.back() == '\t') { s.remove_suffix(1); continue; }
        if (ascii(s.back())) return s;
        if (s.size() >= 2 && has_at(s, s.size() - 2, "\xC2\xA0")) { s.remove_suffix(2); continue; }
        if (s.size() >= 3 && has_at(s, s.size() - 3, "\xE2\x80\xAF")) { s.remove_suffix(3); continue; }
        return s;
    }
}

constexpr double kPow10[] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,  1e8,  1e9,  1e10, 1e11,
                             1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};

}  // namespace

const char* decimal_mark_name(DecimalMark mark) {
    return mark == DecimalMark::point ? "decimal point" : "decimal comma";
}

std::string_view trim_cell_ends(std::string_view s) {
    s = skip_spaces(s);
    s = drop_trailing_spaces(s);
    while (!s.empty() && (s.back() == '\r' || s.back() == '\n' || s.back() == '\v' || s.back() == '\f')) {
        s.remove_suffix(1);
        s = drop_trailing_spaces(s);
    }
    while (!s.empty() && (s.front() == '\r' || s.front() == '\n' || s.front() == '\v' || s.front() == '\f')) {
        s.remove_prefix(1);
        s = skip_spaces(s);
    }
    return s;
}

namespace {

// The common case, plain digits with at most a leading minus and one decimal mark ("1234.50"),
// read in one pass; false sends the cell to the general reader.
bool read_plain(std::string_view s, char decimal, NumberReading* r, std::string* canonical) {
    std::size_t i = 0;
    const bool negative = !s.empty() && s[0] == '-';
    if (negative) i = 1;
    std::uint64_t m = 0;
    int digits = 0, decimals = -1;
    bool leading = true;
    for (; i < s.size(); ++i) {
        const char c = s[i];
        if (c >= '0' && c <= '9') {
            if (leading && c == '0') { if (decimals >= 0) ++decimals; continue; }
            leading = false;
            if (++digits > 19) return false;
            m = m * 10 + static_cast<unsigned>(c - '0');
            if (decimals >= 0) ++decimals;
        } else if (c == decimal && decimals < 0) {
            decimals = 0;
        } else {
            return false;
        }
    }
    const std::size_t written = s.size() - (negative ? 1 : 0) - (decimals >= 0 ? 1 : 0);
    if (written == 0 || m > (std::uint64_t{1} << 53) || decimals > 22) return false;
    const double v = decimals > 0 ? static_cast<double>(m) / kPow10[decimals] : static_cast<double>(m);
    r->ok = true;
    r->negative = negative;
    r->value = negative ? -v : v;
    r->decimals = decimals > 0 ? decimals : 0;
    if (canonical != nullptr) {
        canonical->assign(s.data(), s.size());
        if (decimal == ',' && decimals >= 0) (*canonical)[canonical->find(',')] = '.';
    }
    return true;
}

}  // namespace

NumberReading read_number(std::string_view cell, DecimalMark mark, std::string* canonical) {
    NumberReading r;
    std::string_view s = trim_cell(cell);
    if (s.empty() || s.size() > 200) return r;
    if (read_plain(s, mark == DecimalMark::point ? '.' : ',', &r, canonical)) return r;
    r = NumberReading{};
    if (s.front() == '(' && s.back() == ')') {  // accounting negative
        r.negative = true;
        s = trim_cell(s.substr(1, s.size() - 2));
    }
    bool sign_seen = r.negative;
    for (int pass = 0; pass < 2; ++pass) {  // sign and currency sign, in either order
        std::size_t n;
        if (!sign_seen && (n = minus_at(s, 0)) > 0) { r.negative = true; sign_seen = true; s.remove_prefix(n); }
        else if (!sign_seen && !s.empty() && s[0] == '+') { sign_seen = true; s.remove_prefix(1); }
        else if (!r.currency && (n = currency_at(s, 0)) > 0) { r.currency = true; s = skip_spaces(s.substr(n)); }
    }
    for (int pass = 0; pass < 2; ++pass) {  // trailing percent or currency sign
        std::size_t n;
        if (!r.percent && !s.empty() && s.back() == '%') { r.percent = true; s = drop_trailing_spaces(s.substr(0, s.size() - 1)); }
        else if (!r.currency && (n = currency_before(s)) > 0) { r.currency = true; s = drop_trailing_spaces(s.substr(0, s.size() - n)); }
    }
    if (r.percent && r.currency) return NumberReading{};
    const char decimal = mark == DecimalMark::point ? '.' : ',';
    const char thousands = mark == DecimalMark::point ? ',' : '.';
    std::uint64_t mantissa = 0;
    int mantissa_digits = 0;  // significant digits gathered in `mantissa` (at most 19)
    bool overflow = false;    // more than 19 significant digits: leave the value to strtod
    auto take = [&](char c, bool) {
        if (mantissa_digits == 0 && c == '0') return;
        if (mantissa_digits < 19) { mantissa = mantissa * 10 + static_cast<unsigned>(c - '0'); ++mantissa_digits; }
        else overflow = true;
    };
    std::size_t i = 0;
    const std::size_t first_begin = i;
    while (i < s.size() && is_digit(s[i])) take(s[i++], false);
    std::size_t int_digits = i - first_begin;
    int kind = 0;
    for (;;) {
        int k = 0;
        const std::size_t n = group_at(s, i, thousands, &k);
        if (n == 0 || (kind != 0 && k != kind)) break;
        if (!(i + n + 3 <= s.size() && is_digit(s[i + n]) && is_digit(s[i + n + 1]) && is_digit(s[i + n + 2])))
            return NumberReading{};
        if (kind == 0 && (int_digits < 1 || int_digits > 3 || s[first_begin] == '0')) return NumberReading{};
        if (i + n + 3 < s.size() && is_digit(s[i + n + 3])) return NumberReading{};
        kind = k;
        for (std::size_t j = i + n; j < i + n + 3; ++j) take(s[j], false);
        i += n + 3;
        int_digits += 3;
        r.grouped = true;
    }
    const std::size_t int_end = i;
    bool has_decimal = false;
    std::size_t frac_begin = i;
    if (i < s.size() && s[i] == decimal) {
        has_decimal = true;
        frac_begin = ++i;
        while (i < s.size() && is_digit(s[i])) take(s[i++], true);
        r.decimals = static_cast<int>(i - frac_begin);
    }
    if (int_digits == 0 && r.decimals == 0) return NumberReading{};
    long exponent = 0;
    std::size_t exp_begin = i;
    if (i < s.size() && (s[i] == 'e' || s[i] == 'E')) {
        ++i;
        bool eneg = false;
        if (i < s.size() && (s[i] == '+' || s[i] == '-')) eneg = s[i++] == '-';
        const std::size_t b = i;
        while (i < s.size() && is_digit(s[i])) {
            if (exponent < 100000) exponent = exponent * 10 + (s[i] - '0');
            ++i;
        }
        if (i == b) return NumberReading{};
        if (eneg) exponent = -exponent;
        r.exponent = true;
    }
    if (i != s.size()) return NumberReading{};
    std::string local;
    std::string* out = canonical;
    if (out != nullptr) out->clear();
    auto build = [&](std::string* b) {
        if (r.negative) b->push_back('-');
        for (std::size_t j = first_begin; j < int_end; ++j)
            if (is_digit(s[j])) b->push_back(s[j]);
        if (has_decimal) {
            b->push_back('.');
            b->append(s.data() + frac_begin, static_cast<std::size_t>(r.decimals));
        }
        if (r.exponent) b->append(s.data() + exp_begin, s.size() - exp_begin);
    };
    if (out != nullptr) build(out);
    // Exact fast path: mantissa < 2^53 and a power of ten exactly representable.
    const long scale = exponent - r.decimals;
    double v = 0;
    if (!overflow && mantissa <= (std::uint64_t{1} << 53) && scale >= -22 && scale <= 22) {
        const double m = static_cast<double>(mantissa);
        v = scale < 0 ? m / kPow10[-scale] : m * kPow10[scale];
    } else if (mantissa == 0) {
        v = 0;
    } else {
        if (out == nullptr) { build(&local); out = &local; }
        const char* begin = out->c_str() + (r.negative ? 1 : 0);
        char* end = nullptr;
        v = std::strtod(begin, &end);  // C locale: the canonical form uses a decimal point
    }
    if (!std::isfinite(v) || (v == 0 && mantissa != 0)) {  // overflow, or underflow to zero
        NumberReading beyond;
        beyond.out_of_range = true;
        beyond.negative = r.negative;
        beyond.value = r.negative ? -v : v;  // an infinity (too large) or zero (too small)
        return beyond;
    }
    r.value = r.negative ? -v : v;
    r.ok = true;
    return r;
}

MarkEvidence decimal_mark_evidence(std::string_view cell) {
    const NumberReading p = read_number(cell, DecimalMark::point);
    const NumberReading c = read_number(cell, DecimalMark::comma);
    if (!p.ok && !c.ok) return MarkEvidence::not_a_number;
    if (p.ok && c.ok) return p.value == c.value ? MarkEvidence::neutral : MarkEvidence::ambiguous;
    return p.ok ? MarkEvidence::point : MarkEvidence::comma;
}

bool is_unusable_number(std::string_view cell) {
    std::string_view s = trim_cell(cell);
    if (s.empty() || s.size() > 200) return false;
    if (read_number(s, DecimalMark::point).out_of_range || read_number(s, DecimalMark::comma).out_of_range) return true;
    static const char* const errors[] = {"#DIV/0!", "#N/A", "#NA", "#VALUE!", "#REF!", "#NAME?", "#NUM!", "#NULL!", "#ERROR!"};
    std::string upper;
    for (char c : s) upper += (c >= 'a' && c <= 'z') ? static_cast<char>(c - 'a' + 'A') : c;
    for (const char* e : errors)
        if (upper == e) return true;
    std::size_t n;
    if ((n = minus_at(upper, 0)) > 0) upper.erase(0, n);
    else if (!upper.empty() && upper[0] == '+') upper.erase(0, 1);
    return upper == "NAN" || upper == "INF" || upper == "INFINITY" || upper == "\xE2\x88\x9E";  // ∞
}

void MarkVotes::add(std::string_view cell, int at_line, int at_column) {
    switch (decimal_mark_evidence(cell)) {
        case MarkEvidence::point: ++point; break;
        case MarkEvidence::comma: ++comma; break;
        case MarkEvidence::ambiguous: {
            ++ambiguous;
            const double p = read_number(cell, DecimalMark::point).value;
            const double c = read_number(cell, DecimalMark::comma).value;
            if (p != std::floor(p)) whole_if_point = false;
            if (c != std::floor(c)) whole_if_comma = false;
            if (first_ambiguous.empty()) {
                first_ambiguous = std::string(trim_cell(cell).substr(0, 40));
                line = at_line;
                column = at_column;
            }
            break;
        }
        default: break;
    }
}

DecimalMark decide_decimal_mark(const MarkVotes& v, bool want_whole, DecimalMark fallback,
                                std::string* note, std::string* alternative) {
    if (v.point > 0 || v.comma > 0) return v.point >= v.comma ? DecimalMark::point : DecimalMark::comma;
    if (v.ambiguous == 0) return fallback;
    DecimalMark mark = fallback;
    std::string why = "the usual reading here";
    if (want_whole && v.whole_if_point != v.whole_if_comma) {
        mark = v.whole_if_point ? DecimalMark::point : DecimalMark::comma;
        why = "counts are whole numbers";
    }
    const DecimalMark other = mark == DecimalMark::point ? DecimalMark::comma : DecimalMark::point;
    auto plain = [](double x) {
        char buf[64];
        std::snprintf(buf, sizeof buf, "%.15g", x);
        return std::string(buf);
    };
    const std::string& cell = v.first_ambiguous;
    const double as_mark = read_number(cell, mark).value, as_other = read_number(cell, other).value;
    if (note != nullptr)
        *note = "\"" + cell + "\" (line " + std::to_string(v.line) + ", column " + std::to_string(v.column) +
                ") could be read two ways; read as " + plain(as_mark) + " with a " + decimal_mark_name(mark) +
                ", as " + why + (v.ambiguous > 1 ? " (" + std::to_string(v.ambiguous) + " such cells)." : ".");
    if (alternative != nullptr)
        *alternative = "With a " + std::string(decimal_mark_name(other)) + ", \"" + cell + "\" would be " +
                       plain(as_other) + ".";
    return mark;
}

namespace {
bool same_ascii_lower(std::string_view text, std::string_view word) {
    if (text.size() != word.size()) return false;
    for (std::size_t i = 0; i < text.size(); ++i) {
        char c = text[i];
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
        if (c != word[i]) return false;
    }
    return true;
}
}  // namespace

bool read_typed_number(std::string_view text, double* value) {
    text = trim_cell_ends(text);
    if (text.empty()) return false;
    // Words for what is not a finite number: read as such, for the caller's range check.
    std::string_view body = text;
    bool minus = false;
    if (body.front() == '+' || body.front() == '-') { minus = body.front() == '-'; body.remove_prefix(1); }
    else if (body.substr(0, 3) == "\xE2\x88\x92") { minus = true; body.remove_prefix(3); }  // U+2212 minus sign
    if (same_ascii_lower(body, "inf") || same_ascii_lower(body, "infinity") || body == "\xE2\x88\x9E") {  // ∞
        *value = minus ? -HUGE_VAL : HUGE_VAL;
        return true;
    }
    if (same_ascii_lower(body, "nan")) {
        *value = std::numeric_limits<double>::quiet_NaN();
        return true;
    }
    // The decimal mark from the text itself; "1.234" with the point, "1,234" refused.
    const MarkEvidence evidence = decimal_mark_evidence(text);
    if (evidence == MarkEvidence::ambiguous && text.find(',') != std::string_view::npos) return false;
    const DecimalMark mark = evidence == MarkEvidence::comma ? DecimalMark::comma : DecimalMark::point;
    const NumberReading r = read_number(text, mark);
    if (r.percent || r.currency) return false;
    if (!r.ok && !r.out_of_range) return false;
    *value = r.value;  // beyond the double range: the infinity or zero it rounds to
    return true;
}

}  // namespace tallyproof
