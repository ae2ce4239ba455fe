// The streamed digit tally's fast path (core/input/plain_number_lines.hpp, used by
// DigitStreamTally::feed) against the general reader it must equal: for_each_raw_cell and
// DigitCounter::add_cell over the same pieces with the same line offsets (the streamed reader as
// it was before the fast path), and read_input's reading of the whole text. The reference is
// those readers, run here on the same bytes: the counts, every note (how many values were left
// out for each reason and the line and column of the first) and refusals must be identical.
// The texts are adversarial: leading zeros, 0.000x, negatives, exponents, thousands separators,
// decimal commas, quotes (also over two lines), CRLF, lone CR, blank and junk lines, long lines,
// the first-two floor at 10 and just below it, a last line without a line end, and values on
// both sides of 1 MiB piece boundaries.
#include <doctest/doctest.h>

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

#include "raw_observations.hpp"
#include "read_input.hpp"
#include "stream_tally.hpp"

using namespace tallyproof;

namespace {

const char* const kTokens[] = {
    "12.50", "0012.50", "-0.0004", "0.0042", "0.000", "0", "-0", "000", "7", "7.", ".5", "-.5", "-", ".", "--5",
    "1.2.3", "1e5", "1.2E-3", "-4.5e+2", "1,234.5", "12,5", "1,23", "+7", "+0.5", " 42", "42 ", "\t3", "3\t",
    "5 6", "€ 250", "250 €", "12%", "abc", "n/a", "\"12\"", "\"1\n2\"", "9.9999999999999999", "9.99999999999999",
    "99.5", "10", "-10.0", "9.99", "0009.5", "00010", "1234567890123456789", "0.1234567890123456789", "１２",
    "12.5.", "1..2", "-12.", "3.14159", "100", "100.00", "5e", "1e", "NaN", "inf", "0x1F", ";", ",", "12;5",
    "1;2", "\"", "x\"y",
};

// Lines of tokens from a fixed linear congruential sequence, with LF, CRLF, a lone CR now and
// then, blank lines, and (when `plain_tail`) many plain amounts so that the fast path runs long.
std::string adversarial(int n, std::uint64_t seed, bool lone_cr, bool quotes) {
    std::string t;
    std::uint64_t x = seed;
    const int kinds = static_cast<int>(sizeof kTokens / sizeof kTokens[0]);
    for (int i = 0; i < n; ++i) {
        x = x * 6364136223846793005ULL + 1442695040888963407ULL;
        const unsigned r = static_cast<unsigned>(x >> 33);
        if (r % 3 == 0) {
            const std::string tok = kTokens[(r / 3) % static_cast<unsigned>(kinds)];
            if (!quotes && tok.find('"') != std::string::npos) continue;
            t += tok;
        } else if (r % 3 == 1) {
            t += (r & 8 ? "-" : "") + std::to_string((x >> 20) % 100000) + "." + std::to_string((x >> 12) % 100);
        } else {
            t += std::string((x >> 40) % 4, '0') + std::to_string((x >> 24) % 1000);
        }
        const unsigned e = (r >> 8) % 16;
        t += e == 0 ? "\r\n" : e == 1 ? "\n\n" : e == 2 && lone_cr ? "\r" : e == 3 ? "\r\n\r\n" : "\n";
    }
    return t;
}

std::vector<std::string_view> pieces(const std::string& text, std::size_t size) {
    std::vector<std::string_view> out;  // cut after the last LF within each `size` bytes, as the tool cuts
    for (std::size_t at = 0; at < text.size();) {
        std::size_t end = at + size >= text.size() ? text.size() : text.rfind('\n', at + size - 1);
        end = end == std::string::npos || end < at || end == text.size() ? text.size() : end + 1;
        out.push_back(std::string_view(text).substr(at, end - at));
        at = end;
    }
    return out;
}

ParsedInput head_for(DigitTest test, Separator sep) {
    ParsedInput h;
    h.shape = InputShape::raw_digits;
    h.digit_test = test;
    h.separator = sep;
    h.decimal = DecimalMark::point;
    return h;
}

std::size_t ends_of(std::string_view s) {
    std::size_t n = 0;
    for (std::size_t i = 0; i < s.size(); ++i)
        if (s[i] == '\n' || (s[i] == '\r' && (i + 1 == s.size() || s[i + 1] != '\n'))) ++n;
    return n;
}

// The general reader over the same pieces (the streamed tally without its fast path).
ParsedInput general(const std::vector<std::string_view>& parts, DigitTest test, Separator sep, bool* ok, int header_line = 0) {
    DigitCounter counter(test);
    std::pair<int, int> where[kDigitExclusionReasons] = {};
    std::size_t lines = 0;
    *ok = true;
    for (std::string_view piece : parts) {
        RawSource src;
        src.text = piece;
        src.separator = sep;
        src.numbers = true;
        src.header_line = lines == 0 ? header_line : 0;
        const int offset = static_cast<int>(lines);
        const Status s = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
            const int why = counter.add_cell(cell, DecimalMark::point);
            if (why >= 0 && where[why].first == 0) where[why] = {line + offset, column};
            return true;
        });
        if (!s.ok) { *ok = false; break; }
        lines += ends_of(piece);
    }
    ParsedInput out = head_for(test, sep);
    put_digit_tally(counter.tally(), where, test, &out);
    return out;
}

ParsedInput fast(const std::vector<std::string_view>& parts, DigitTest test, Separator sep, bool* ok, std::size_t total) {
    DigitStreamTally tally(head_for(test, sep));
    *ok = true;
    for (std::string_view piece : parts)
        if (!tally.feed(piece)) { *ok = false; break; }
    return tally.finish(total, total);  // no "streamed" note: compare every other note
}

void same(const std::string& text, std::size_t size, Separator sep) {
    const auto parts = pieces(text, size);
    for (DigitTest test : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last, DigitTest::last_even}) {
        CAPTURE(static_cast<int>(test));
        bool ok_g = false, ok_f = false;
        const ParsedInput g = general(parts, test, sep, &ok_g);
        const ParsedInput f = fast(parts, test, sep, &ok_f, text.size());
        CHECK(ok_g == ok_f);  // source: the general reader (for_each_raw_cell + DigitCounter::add_cell)
        if (!ok_g || !ok_f) continue;
        CHECK(g.categories == f.categories);  // source: the general reader
        CHECK(g.observed == f.observed);      // source: the general reader
        CHECK(g.notes == f.notes);            // source: the general reader (counts left out, first line and column)
    }
}

}  // namespace

TEST_CASE("fast path: adversarial lines give the general reader's counts and notes, in any pieces") {
    const std::string text = adversarial(20000, 2028, true, false);
    for (Separator sep : {Separator::tab, Separator::comma, Separator::semicolon, Separator::spaces}) {
        CAPTURE(static_cast<int>(sep));
        for (std::size_t size : {std::size_t(37), std::size_t(1000), std::size_t(1) << 20}) {
            CAPTURE(size);
            same(text, size, sep);
        }
    }
}

TEST_CASE("fast path: quotes over two lines go to the general reader with the rest of the piece") {
    const std::string text = adversarial(5000, 77, false, true);
    for (std::size_t size : {std::size_t(500), std::size_t(1) << 20}) same(text, size, Separator::tab);
}

TEST_CASE("fast path: a last line without a line end, and empty, blank and CR-only texts") {
    for (const char* t : {"12.5\n7", "12.5\r\n0.0042", "-0", "7", "", "\n\n", "\r\n", "\r", "1\r2\r3", "5\n\r\n\n-0.00"}) {
        CAPTURE(t);
        same(t, std::size_t(1) << 20, Separator::tab);
        same(t, 2, Separator::tab);
    }
}

TEST_CASE("fast path: values on both sides of 1 MiB piece boundaries, against the whole text read at once") {
    // 2.5 MiB of amounts with junk, zeros and CRLF; pieces of 1 MiB cut after the last LF (the
    // tool's cut), so the values nearest each boundary fall in different pieces.
    std::string text = "Amount\n";
    std::uint64_t x = 99;
    for (int i = 0; text.size() < (5u << 19); ++i) {
        x = x * 6364136223846793005ULL + 1442695040888963407ULL;
        if (i % 1009 == 0) text += "n/a\n";
        else if (i % 997 == 0) text += "0.00\r\n";
        else text += std::to_string((x >> 33) % 100000) + "." + std::to_string((x >> 20) % 100) + "\n";
    }
    text += "0.0042";  // a last line without a line end
    for (DigitTest test : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last}) {
        ParseOptions o;
        o.digits = test;
        ReadInputOptions how;
        how.groups = GroupsReading::never;
        const ParsedInput a = read_input(text, o, how).sample;  // source: read_input's whole-text reading
        const auto parts = pieces(text, std::size_t(1) << 20);
        REQUIRE(parts.size() == 3);
        const ParsedInput head = read_input(std::string(parts[0]), o, how).sample;
        REQUIRE(DigitStreamTally::continues(head));
        DigitStreamTally tally(head);
        for (std::string_view p : parts) CHECK(tally.feed(p));
        ParsedInput b = tally.finish(parts[0].size(), text.size());
        REQUIRE(a.status.ok);
        REQUIRE(b.status.ok);
        CHECK(a.observed == b.observed);  // source: read_input's whole-text reading
        b.notes.pop_back();               // "was streamed"
        CHECK(a.notes == b.notes);        // source: read_input's whole-text reading
    }
}

TEST_CASE("fast path: the whole text read at once (tally_raw_digits), with and without a header row") {
    for (int header : {0, 1, 3}) {
        std::string text = header == 0 ? "" : header == 1 ? "Amount\r\n" : "\n\nAmount\n";
        text += adversarial(8000, 4242, true, header != 3);
        for (Separator sep : {Separator::tab, Separator::comma, Separator::spaces}) {
            for (DigitTest test : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last, DigitTest::last_even}) {
                CAPTURE(header);
                CAPTURE(static_cast<int>(test));
                bool ok = false;
                const ParsedInput g = general({std::string_view(text)}, test, sep, &ok, header);
                RawSource src;
                src.text = text;
                src.separator = sep;
                src.numbers = true;
                src.header_line = header;
                ParsedInput f = head_for(test, sep);
                tally_raw_digits(src, test, &f);
                CHECK(ok == f.status.ok);             // source: the general reader
                CHECK(g.observed == f.observed);      // source: the general reader
                CHECK(g.notes == f.notes);            // source: the general reader (counts left out, first line and column)
            }
        }
    }
}
