// Raw observations: one value per cell (or per line) tallied into categories while the text
// streams past, so memory grows with the number of categories, not of values: text values
// (trimmed, optionally case-folded), whole numbers as ordered categories with the gaps between
// minimum and maximum filled with zero counts, or a digit of each number (digit_extraction).
#pragma once
#include <string>
#include <utility>
#include <string_view>

#include "delimited_text.hpp"
#include "digit_extraction.hpp"
#include "number_reading.hpp"
#include "parsed_input.hpp"

namespace tallyproof {

struct RawSource {
    std::string_view text;      // byte-order mark removed
    Separator separator = Separator::tab;
    int header_line = 0;        // a header row to skip (its cells become column names), or 0
    bool whole_lines = false;   // each line is one value (space-separated words joined by one space)
    bool numbers = false;       // space-separated numbers: a line that reads as one number ("€ 250") is one
};

// Calls f(cell, line, column) for every non-empty cell after the header; stops when f returns false.
template <class F>
Status for_each_raw_cell(const RawSource& src, F&& f) {
    DelimitedReader reader(src.text, src.separator);
    Record rec;
    std::string joined;
    for (;;) {
        std::string_view cell;
        int line = 0;
        if (reader.next_single_cell(&cell, &line)) {  // one plain cell on its line: the same in every mode
            if (line != src.header_line && !f(cell, line, 1)) return reader.status();
            continue;
        }
        if (!reader.next(&rec)) break;
        if (rec.blank() || rec.line == src.header_line) continue;
        if (src.whole_lines) {
            joined.clear();
            for (std::size_t i = 0; i < rec.cells.size(); ++i) {
                if (i) joined += ' ';
                joined.append(rec.cells[i].data(), rec.cells[i].size());
            }
            if (!f(std::string_view(joined), rec.line, 1)) return reader.status();
            continue;
        }
        if (src.numbers && src.separator == Separator::spaces && rec.cells.size() > 1) {
            const char* b = rec.cells.front().data();
            const std::string_view line(b, static_cast<std::size_t>(rec.cells.back().data() + rec.cells.back().size() - b));
            const NumberReading n = read_number(line, DecimalMark::point);
            const NumberReading c = read_number(line, DecimalMark::comma);
            if ((n.ok && !n.grouped) || (c.ok && !c.grouped)) {
                if (!f(line, rec.line, 1)) return reader.status();
                continue;
            }
        }
        for (std::size_t i = 0; i < rec.cells.size(); ++i)
            if (!rec.cells[i].empty() && !f(rec.cells[i], rec.line, static_cast<int>(i) + 1)) return reader.status();
    }
    return reader.status();
}

// Text values tallied in first-seen order (or sorted with options.sorted).
void tally_raw_text(const RawSource& src, const ParseOptions& options, ParsedInput* out);

// Whole numbers as ordered categories min..max; out->decimal gives the decimal mark.
void tally_raw_whole_numbers(const RawSource& src, const ParseOptions& options, ParsedInput* out);

// The digit `test` of each number (digit_extraction's DigitCounter), one value at a time.
void tally_raw_digits(const RawSource& src, DigitTest test, ParsedInput* out);

// What tally_raw_digits puts into `out` once the values are counted: the categories, counts and
// notes of `total` (`first_where`: line and column of the first value left out, per
// DigitExclusion). Shared with the streamed tally (stream_tally.hpp), so both say the same.
void put_digit_tally(const DigitTally& total, const std::pair<int, int>* first_where, DigitTest test, ParsedInput* out);

}  // namespace tallyproof
