// Plain-number lines counted from their bytes (plain_number_lines.hpp): one pass over each line
// computing what digit_extraction's plain_cell_digits computes (written digits, first, second and
// last digit, zero), then DigitCounter::add. The first-two floor of 10 is decided from the
// written integer digits: two or more significant integer digits is at least 10; fewer, with at
// most 15 significant digits in all, is below 10 also as a double (the spacing of doubles near 10
// is 1.8e-15); longer ones go to the general reader, which converts to a double.
// Short lines (a line end within 16 bytes, the common case) are read eight bytes at a time
// (SWAR, "SIMD within a register": Lamport 1975, CACM 18(8); the byte-range masks of Knuth,
// TAOCP 4A, 7.1.3), exact for ASCII bytes, which is checked first; other lines byte by byte.
#include "plain_number_lines.hpp"

#include <cstdint>
#include <cstring>

namespace tallyproof {
namespace {

inline bool digit(char c) { return static_cast<unsigned char>(c - '0') < 10; }

#if defined(__BYTE_ORDER__) && __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__ && defined(__GNUC__)
constexpr std::uint64_t kOnes = 0x0101010101010101ULL;
constexpr std::uint64_t kHigh = 0x8080808080808080ULL;

inline std::uint64_t load8(const char* p) {
    std::uint64_t x;
    std::memcpy(&x, p, 8);
    return x;
}
// Bit 7 of each byte of ASCII `x` (every byte below 0x80: no carry crosses a byte) that is at
// least `c`, equal to `c`.
inline std::uint64_t at_least(std::uint64_t x, unsigned c) { return (x + kOnes * (0x80u - c)) & kHigh; }
inline std::uint64_t equal_to(std::uint64_t x, unsigned c) { return ~((x ^ (kOnes * c)) + kOnes * 0x7Fu) & kHigh; }
inline int byte_at(std::uint64_t mask) { return __builtin_ctzll(mask) >> 3; }
// The bytes below `n` (0..8) of a word.
inline std::uint64_t below(int n) { return n >= 8 ? ~0ULL : (1ULL << (8 * n)) - 1; }

// One line of at most 15 bytes and its line end, read from the 16 bytes at p (all inside the
// text): its written digits into *w and the next line's start into *next, or false when the
// line is not provably plain (the byte-by-byte reader then looks at it).
inline bool short_plain_line(const char* p, bool floor10, WrittenDigits* w, const char** next) {
    const std::uint64_t a = load8(p), b = load8(p + 8);
    if (((a | b) & kHigh) != 0) return false;
    const std::uint64_t na = equal_to(a, '\n'), nb = equal_to(b, '\n');
    if ((na | nb) == 0) return false;
    // the line end's position, without a branch on which word holds it (line lengths vary at random)
    int end = na != 0 ? byte_at(na) : 8 + byte_at(nb);
    *next = p + end + 1;
    if (end > 0 && p[end - 1] == '\r') --end;  // CRLF
    if (end == 0) return false;                 // a blank line: the byte reader skips it
    const std::uint64_t va = below(end) & kHigh, vb = below(end - 8 < 0 ? 0 : end - 8) & kHigh;
    const std::uint64_t da = (at_least(a, '0') & ~at_least(a, '9' + 1)) & va;
    const std::uint64_t db = (at_least(b, '0') & ~at_least(b, '9' + 1)) & vb;
    const std::uint64_t dota = equal_to(a, '.') & va, dotb = equal_to(b, '.') & vb;
    std::uint64_t other_a = va & ~da & ~dota;
    const std::uint64_t other_b = vb & ~db & ~dotb;
    const bool minus = p[0] == '-';
    if (minus) other_a &= ~0x80ULL;
    const bool dots = (dota & (dota - 1)) != 0 || (dotb & (dotb - 1)) != 0 || (dota != 0 && dotb != 0);  // two or more
    if ((other_a | other_b) != 0 || dots) return false;
    if ((da | db) == 0) return false;  // "-", ".", "-.": the general reader's business
    const int dot = dota != 0 ? byte_at(dota) : dotb != 0 ? 8 + byte_at(dotb) : 99;
    const std::uint64_t fa = at_least(a, '1') & da, fb = at_least(b, '1') & db;
    w->is_number = true;
    w->last = p[end - 1 - (p[end - 1] == '.')];
    if ((fa | fb) == 0) {
        w->is_zero = true;
        return true;
    }
    const int first = fa != 0 ? byte_at(fa) : 8 + byte_at(fb);
    const int dot_after = dot < end && dot > first;
    w->significant = end - first - dot_after;
    w->first = p[first];
    w->second = w->significant >= 2 ? p[first + 1 + (first + 1 == dot)] : 0;  // first + 2 < 16: inside
    if (floor10 && (dot >= end ? w->significant : dot - first) >= 2) w->magnitude = 10;
    return true;  // at most 15 significant digits: below 10 stays below 10 as a double
}
#define TALLYPROOF_SHORT_LINES 1
#endif

}  // namespace

bool plain_lines_serve(const DigitCounter& counter, DecimalMark mark) {
    const double floor = counter.minimum_magnitude();
    return mark == DecimalMark::point && (floor == 0 || floor == 10);
}

PlainLinesCounted count_plain_number_lines(std::string_view text, bool input_ends, int line_before,
                                           DigitCounter* counter, std::pair<int, int>* first_where) {
    PlainLinesCounted done;
    const bool floor10 = counter->minimum_magnitude() == 10;
    const char* const begin = text.data();
    const char* const end = begin + text.size();
    const char* p = begin;
    int line = line_before;  // line ends passed: the line being read is line + 1
    while (p < end) {
#ifdef TALLYPROOF_SHORT_LINES
        if (end - p >= 16) {
            WrittenDigits w;
            const char* next = nullptr;
            if (short_plain_line(p, floor10, &w, &next)) {
                const int why = counter->add(w);
                if (why >= 0 && first_where[why].first == 0) first_where[why] = {line + 1, 1};
                ++line;
                p = next;
                continue;
            }
        }
#endif
        const char* q = p;
        if (*q == '\n') { ++line; p = q + 1; continue; }  // a blank line
        if (*q == '\r') {
            if (q + 1 < end && q[1] == '\n') { ++line; p = q + 2; continue; }
            break;  // a lone CR: the general reader's business
        }
        if (*q == '-') ++q;
        const char* const digits = q;
        const char* dot = nullptr;
        const char* first = nullptr;  // the first significant digit
        for (; q < end; ++q) {
            const char c = *q;
            if (digit(c)) {
                if (first == nullptr && c != '0') first = q;
            } else if (c == '.' && dot == nullptr) {
                dot = q;
            } else {
                break;
            }
        }
        const char* next;  // the start of the next line
        if (q == end) {
            if (!input_ends) break;  // a line cut off by the piece's end (not expected): not claimed
            next = q;
        } else if (*q == '\n') {
            next = q + 1;
        } else if (*q == '\r' && q + 1 < end && q[1] == '\n') {
            next = q + 2;
        } else {
            break;  // anything else on the line
        }
        const std::ptrdiff_t written = (q - digits) - (dot != nullptr ? 1 : 0);
        if (written <= 0 || q - p > 200) break;  // "-", ".", or a cell read_number refuses by its length
        WrittenDigits w;
        w.is_number = true;
        w.last = q - 1 != dot ? q[-1] : q[-2];
        if (first != nullptr) {
            w.significant = static_cast<int>(q - first) - (dot != nullptr && dot > first ? 1 : 0);
            w.first = first[0];
            if (w.significant >= 2) w.second = first + 1 != dot ? first[1] : first[2];
            if (floor10) {
                const int integer_digits = dot == nullptr ? w.significant
                                           : (dot > first ? static_cast<int>(dot - first) : 0);
                if (integer_digits >= 2) w.magnitude = 10;  // at least 10, also as a double
                else if (w.significant > 15) break;         // might round up to 10: the general reader decides
            }
        } else {
            w.is_zero = true;
        }
        const int why = counter->add(w);
        if (why >= 0 && first_where[why].first == 0) first_where[why] = {line + 1, 1};
        if (next != q) ++line;  // a last line without a line end ends no line
        p = next;
    }
    done.bytes = static_cast<std::size_t>(p - begin);
    done.lines = line - line_before;
    return done;
}

namespace {

std::size_t count_line_ends(std::string_view s) {  // DelimitedReader's rule: LF, CRLF or a lone CR
    std::size_t n = 0;
    for (std::size_t i = 0; i < s.size(); ++i)
        if (s[i] == '\n' || (s[i] == '\r' && (i + 1 == s.size() || s[i + 1] != '\n'))) ++n;
    return n;
}

// `text` read the general way, its lines numbered after `before`; a failure's line renumbered.
Status general_lines(const RawSource& like, std::string_view text, int header_line, DecimalMark mark, int before,
                     DigitCounter* counter, std::pair<int, int>* first_where) {
    RawSource src = like;
    src.text = text;
    src.header_line = header_line;
    Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        const int why = counter->add_cell(cell, mark);
        if (why >= 0 && first_where[why].first == 0) first_where[why] = {line + before, column};
        return true;
    });
    if (!read.ok) {
        const std::string said = "Line " + std::to_string(read.line);
        if (read.message.rfind(said, 0) == 0)
            read.message = "Line " + std::to_string(read.line + before) + read.message.substr(said.size());
        read.line += before;
    }
    return read;
}

}  // namespace

Status count_digit_lines(const RawSource& src, DecimalMark mark, int line_before, DigitCounter* counter,
                         std::pair<int, int>* first_where, std::size_t* line_ends) {
    const std::string_view text = src.text;
    std::size_t pos = 0, ends = 0;
    if (src.header_line > 0) {  // the lines up to the header row's end, the general way
        std::size_t i = 0;
        for (int line = 1; i < text.size() && line <= src.header_line; ++i) {
            if (text[i] == '\n') ++line;
            else if (text[i] == '\r') {
                if (i + 1 < text.size() && text[i + 1] == '\n') ++i;
                ++line;
            }
        }
        const std::string_view head = text.substr(0, i);
        if (head.find('"') != std::string_view::npos) {  // a quoted cell may run on: all of it the general way
            const Status s = general_lines(src, text, src.header_line, mark, line_before, counter, first_where);
            *line_ends = count_line_ends(text);
            return s;
        }
        const Status s = general_lines(src, head, src.header_line, mark, line_before, counter, first_where);
        if (!s.ok) return s;
        pos = head.size();
        ends = count_line_ends(head);
    }
    const bool input_ends = text.empty() || (text.back() != '\n' && text.back() != '\r');
    while (pos < text.size()) {
        const PlainLinesCounted fast = count_plain_number_lines(text.substr(pos), input_ends,
                                                                line_before + static_cast<int>(ends), counter, first_where);
        pos += fast.bytes;
        ends += static_cast<std::size_t>(fast.lines);
        if (pos >= text.size()) break;
        const std::string_view rest = text.substr(pos);
        const std::size_t nl = rest.find('\n');
        std::string_view line = nl == std::string_view::npos ? rest : rest.substr(0, nl + 1);
        if (line.find('"') != std::string_view::npos) line = rest;
        const Status s = general_lines(src, line, 0, mark, line_before + static_cast<int>(ends), counter, first_where);
        if (!s.ok) return s;
        ends += count_line_ends(line);
        pos += line.size();
    }
    *line_ends = ends;
    return Status::success();
}

}  // namespace tallyproof
