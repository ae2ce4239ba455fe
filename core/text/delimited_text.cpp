// Splits text into records and cells. Quoting follows RFC 4180 (Shafranovich 2005, IETF),
// leniently: text after a closing quote joins the cell, and spaces around a quoted field are
// ignored as spreadsheets do when they read CSV. Linear time; no backtracking.
#include "delimited_text.hpp"

#include <algorithm>
#include <cstdint>
#include <cstring>

#include "number_reading.hpp"

namespace tallyproof {
namespace {

char separator_char(Separator sep) {
    switch (sep) {
        case Separator::tab: return '\t';
        case Separator::comma: return ',';
        case Separator::semicolon: return ';';
        case Separator::spaces: return ' ';
    }
    return '\t';
}

bool is_line_end(char c) { return c == '\n' || c == '\r'; }

}  // namespace

const char* separator_name(Separator sep) {
    switch (sep) {
        case Separator::tab: return "tab";
        case Separator::comma: return "comma";
        case Separator::semicolon: return "semicolon";
        case Separator::spaces: return "spaces";
    }
    return "tab";
}

std::string cell_location(int line, int column) {
    std::string s = "Line " + std::to_string(line);
    if (column > 0) s += ", column " + std::to_string(column);
    return s + ": ";
}

std::string quote_cell(std::string_view cell) {
    std::size_t n = std::min<std::size_t>(cell.size(), 40);
    while (n < cell.size() && n > 0 && (static_cast<unsigned char>(cell[n]) & 0xC0) == 0x80) --n;
    std::string q = "\"" + utf8_or_replacement(cell.substr(0, n));
    if (n < cell.size()) q += "...";
    return q + "\"";
}

namespace {

// Length of the well-formed UTF-8 sequence at s[i] (Unicode table 3-7), or 0.
std::size_t utf8_length(std::string_view s, std::size_t i) {
    const auto b = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
    const unsigned char c = b(0);
    if (c < 0x80) return 1;
    const std::size_t left = s.size() - i;
    auto cont = [&](std::size_t k) { return k < left && (b(k) & 0xC0) == 0x80; };
    if (c >= 0xC2 && c <= 0xDF) return cont(1) ? 2 : 0;
    if (c >= 0xE0 && c <= 0xEF) {
        if (!cont(1) || !cont(2)) return 0;
        if (c == 0xE0 && b(1) < 0xA0) return 0;  // overlong
        if (c == 0xED && b(1) > 0x9F) return 0;  // surrogates
        return 3;
    }
    if (c >= 0xF0 && c <= 0xF4) {
        if (!cont(1) || !cont(2) || !cont(3)) return 0;
        if (c == 0xF0 && b(1) < 0x90) return 0;
        if (c == 0xF4 && b(1) > 0x8F) return 0;
        return 4;
    }
    return 0;
}

}  // namespace

bool valid_utf8(std::string_view s) {
    for (std::size_t i = 0; i < s.size();) {
        if (i + 8 <= s.size()) {  // eight ASCII bytes at a time (the common case of a streamed file)
            std::uint64_t x;
            std::memcpy(&x, s.data() + i, 8);
            if ((x & 0x8080808080808080ULL) == 0) {
                i += 8;
                continue;
            }
        }
        const std::size_t n = utf8_length(s, i);
        if (n == 0) return false;
        i += n;
    }
    return true;
}

void append_utf8(std::string* s, std::uint32_t cp) {
    if (cp < 0x80) *s += static_cast<char>(cp);
    else if (cp < 0x800) { *s += static_cast<char>(0xC0 | (cp >> 6)); *s += static_cast<char>(0x80 | (cp & 0x3F)); }
    else if (cp < 0x10000) {
        *s += static_cast<char>(0xE0 | (cp >> 12)); *s += static_cast<char>(0x80 | ((cp >> 6) & 0x3F));
        *s += static_cast<char>(0x80 | (cp & 0x3F));
    } else {
        *s += static_cast<char>(0xF0 | (cp >> 18)); *s += static_cast<char>(0x80 | ((cp >> 12) & 0x3F));
        *s += static_cast<char>(0x80 | ((cp >> 6) & 0x3F)); *s += static_cast<char>(0x80 | (cp & 0x3F));
    }
}

std::string utf8_or_replacement(std::string_view s) {
    std::string out;
    for (std::size_t i = 0; i < s.size();) {
        const std::size_t n = utf8_length(s, i);
        if (n == 0) { out += "\xEF\xBF\xBD"; ++i; }
        else { out.append(s.data() + i, n); i += n; }
    }
    return out;
}

std::string_view skip_byte_order_mark(std::string_view text) {
    if (text.size() >= 3 && text.compare(0, 3, "\xEF\xBB\xBF") == 0) text.remove_prefix(3);
    return text;
}

DelimitedReader::DelimitedReader(std::string_view text, Separator sep) : text_(text), sep_(sep) {
    for (int c = 0x21; c < 0x7F; ++c) single_[c] = c != '"' && c != separator_char(sep);
}

void DelimitedReader::end_line() {
    const std::size_t n = text_.size();
    if (pos_ < n && text_[pos_] == '\r') ++pos_;
    else if (pos_ < n && text_[pos_] == '\n') { ++pos_; ++line_; return; }
    if (pos_ < n && text_[pos_] == '\n') ++pos_;
    ++line_;
}

namespace {

// Eight bytes (little-endian) whose flagged bytes (high bit set) include the first byte that
// is not printable ASCII or is `sep` or a quote; bytes above the first flagged one may be
// flagged wrongly, so only the lowest flag counts (the bit tricks of Anderson's "Bit Twiddling
// Hacks": haszero, hasless, hasmore).
inline std::uint64_t stop_flags(std::uint64_t x, char sep) {
    constexpr std::uint64_t ones = 0x0101010101010101ULL, highs = 0x8080808080808080ULL;
    auto zero = [&](std::uint64_t v) { return (v - ones) & ~v & highs; };
    const std::uint64_t below = (x - ones * 0x21) & ~x & highs;        // bytes < 0x21
    const std::uint64_t above = ((x + ones * (0x7F - 0x7E)) | x) & highs;  // bytes > 0x7E
    return below | above | zero(x ^ (ones * static_cast<unsigned char>(sep))) | zero(x ^ (ones * '"'));
}

}  // namespace

bool DelimitedReader::next_single_cell(std::string_view* cell, int* line) {
    const std::size_t n = text_.size();
    const char* const d = text_.data();
    std::size_t i = pos_;
#if defined(__BYTE_ORDER__) && __BYTE_ORDER__ == __ORDER_LITTLE_ENDIAN__ && defined(__GNUC__)
    for (const char sep = separator_char(sep_);;) {  // eight bytes at a time, no branch per byte
        if (i + 8 > n) {
            while (i < n && single_[static_cast<unsigned char>(d[i])]) ++i;
            break;
        }
        std::uint64_t x;
        std::memcpy(&x, d + i, 8);
        if (const std::uint64_t stop = stop_flags(x, sep)) {
            i += static_cast<std::size_t>(__builtin_ctzll(stop)) / 8;
            break;
        }
        i += 8;
    }
#else
    while (i < n && single_[static_cast<unsigned char>(d[i])]) ++i;
#endif
    if (i == pos_ || (i < n && d[i] != '\n' && d[i] != '\r')) return false;
    *cell = std::string_view(d + pos_, i - pos_);  // printable ends: trim_cell would keep it whole
    *line = line_;
    pos_ = i;
    end_line();
    return true;
}

bool DelimitedReader::next(Record* r) {
    r->cells.clear();
    r->quoted.clear();
    if (!unescaped_.empty()) unescaped_.clear();
    const std::size_t n = text_.size();
    if (pos_ >= n) return false;
    r->line = line_;
    if (sep_ == Separator::spaces) {
        const char* const d = text_.data();
        std::size_t i = pos_;
        while (i < n) {
            const char c = d[i];
            if (static_cast<unsigned char>(c) > ' ') {
                const std::size_t b = i;
                while (++i < n && static_cast<unsigned char>(d[i]) > ' ') {}
                const std::string_view word = trim_cell(std::string_view(d + b, i - b));  // no-break spaces at the ends
                if (!word.empty()) {
                    r->cells.push_back(word);
                    r->quoted.push_back(false);
                }
                continue;
            }
            if (c == '\n' || c == '\r') break;
            ++i;
        }
        pos_ = i;
        end_line();
        return true;
    }
    const char sep = separator_char(sep_);
    for (;;) {
        std::size_t i = pos_;
        while (i < n && text_[i] == ' ' && sep != ' ') ++i;
        if (i < n && text_[i] == '"') {
            const int open_line = line_;
            const int open_column = static_cast<int>(r->cells.size()) + 1;
            std::string& cell = unescaped_.emplace_back();
            ++i;
            bool closed = false;
            while (i < n) {
                const std::size_t q = text_.find('"', i);
                const std::size_t stop = q == std::string_view::npos ? n : q;
                for (std::size_t j = i; j < stop; ++j)  // count line breaks inside the quotes
                    if (text_[j] == '\n' || (text_[j] == '\r' && (j + 1 >= n || text_[j + 1] != '\n'))) ++line_;
                cell.append(text_.data() + i, stop - i);
                if (q == std::string_view::npos) { i = n; break; }
                if (q + 1 < n && text_[q + 1] == '"') { cell.push_back('"'); i = q + 2; continue; }
                i = q + 1;
                closed = true;
                break;
            }
            if (!closed && status_.ok)
                status_ = Status::failure("Line " + std::to_string(open_line) + ", column " + std::to_string(open_column) +
                                              ": the quote opened here is never closed; expected a closing \".",
                                          open_line, open_column);
            const std::size_t b = i;  // lenient: text after the closing quote joins the cell
            while (i < n && text_[i] != sep && !is_line_end(text_[i])) ++i;
            const std::string_view rest = trim_cell(text_.substr(b, i - b));
            cell.append(rest.data(), rest.size());
            r->cells.push_back(cell);
            r->quoted.push_back(true);
        } else {
            const std::size_t b = pos_;
            while (i < n && text_[i] != sep && !is_line_end(text_[i])) ++i;
            r->cells.push_back(trim_cell(text_.substr(b, i - b)));
            r->quoted.push_back(false);
        }
        pos_ = i;
        if (pos_ < n && text_[pos_] == sep) { ++pos_; continue; }
        break;
    }
    end_line();
    while (!r->cells.empty() && r->cells.back().empty()) { r->cells.pop_back(); r->quoted.pop_back(); }
    return true;
}

namespace {

Separator detect(std::string_view text, bool lines_may_be_numbers, bool honour_quotes, bool* open_quote) {
    int lines = 0, lines_semicolon = 0, lines_comma = 0, lines_number = 0, lines_grouped = 0;
    int comma_count = -1;
    bool comma_consistent = true;
    bool in_quotes = false;
    int tabs = 0, semis = 0, commas = 0;
    std::size_t line_start = 0;
    auto finish_line = [&](std::size_t end) {
        const std::string_view line = trim_cell(text.substr(line_start, end - line_start));
        if (!line.empty()) {
            ++lines;
            if (semis > 0) ++lines_semicolon;
            if (commas > 0) ++lines_comma;
            if (comma_count < 0) comma_count = commas;
            else if (commas != comma_count) comma_consistent = false;
            const NumberReading p = read_number(line, DecimalMark::point);
            if (read_number(line, DecimalMark::comma).ok || p.ok) ++lines_number;
            if (p.ok && p.grouped && line.find(',') != std::string_view::npos) ++lines_grouped;
        }
        semis = commas = 0;
    };
    for (std::size_t i = 0; i < text.size() && lines < 200; ++i) {
        const char c = text[i];
        if (c == '"' && honour_quotes) in_quotes = !in_quotes;
        if (in_quotes) continue;
        if (c == '\t') ++tabs;
        else if (c == ';') ++semis;
        else if (c == ',') ++commas;
        else if (c == '\n' || c == '\r') {
            finish_line(i);
            line_start = i + 1;
        }
        if (tabs > 0) return Separator::tab;
    }
    if (in_quotes) *open_quote = true;
    if (lines < 200) finish_line(text.size());
    if (lines == 0) return Separator::tab;
    if (lines_semicolon == lines) return Separator::semicolon;
    if (lines_comma == lines && comma_consistent) {
        if (lines_grouped == lines) return Separator::spaces;  // a column of "1,234": grouped numbers
        if (lines_may_be_numbers && lines_number == lines) return Separator::spaces;
        return Separator::comma;
    }
    return Separator::spaces;
}

}  // namespace

Separator detect_separator(std::string_view text, bool lines_may_be_numbers) {
    text = skip_byte_order_mark(text);
    bool open_quote = false;
    const Separator sep = detect(text, lines_may_be_numbers, true, &open_quote);
    if (!open_quote) return sep;
    // A quote never closed: judge the lines as written, so the reader can report the quote.
    return detect(text, lines_may_be_numbers, false, &open_quote);
}

}  // namespace tallyproof
