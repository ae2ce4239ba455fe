// The fast path of the streamed digit tally (stream_tally.hpp): lines that hold one plain
// number and nothing else (an optional '-', ASCII digits with at most one '.', a decimal point,
// LF or CRLF after it) are counted straight from the bytes, one pass, no cell or record built.
// It claims only lines whose reading by the general reader (DelimitedReader's
// next_single_cell, then digit_extraction's plain form in DigitCounter::add_cell) is provably
// the same, and stops at the first line it cannot prove, which the caller reads the general way.
// Exact: the same digits, exclusions and first places as the general reader (tests/unit/test_plain_number_lines.cpp).
#pragma once
#include <cstddef>
#include <string_view>
#include <utility>

#include "digit_extraction.hpp"
#include "raw_observations.hpp"
#include "status.hpp"

namespace tallyproof {

struct PlainLinesCounted {
    std::size_t bytes = 0;  // bytes of the lines counted: `text` from here on starts with a line not claimed
    int lines = 0;          // line ends passed (blank lines included)
};

// Whether the fast path can serve this counter: decimal point, and no magnitude floor other than
// the first-two test's 10, which the written digits decide exactly.
bool plain_lines_serve(const DigitCounter& counter, DecimalMark mark);

// Counts the lines of `text` from its start into `counter` until a line it cannot prove it reads
// as the general reader does. `text` is whole lines, except at the end of the input
// (`input_ends`: a last line without a line end is counted too). `line_before`: lines before
// `text`; the first value left out for each DigitExclusion is recorded in
// first_where[reason] = {line, 1} when still {0, 0}.
PlainLinesCounted count_plain_number_lines(std::string_view text, bool input_ends, int line_before,
                                           DigitCounter* counter, std::pair<int, int>* first_where);

// The values of `src.text` (whole lines; the last may lack its line end) counted into `counter`:
// plain-number lines by count_plain_number_lines, every other line by raw_observations'
// for_each_raw_cell and DigitCounter::add_cell on its own (a line holding a quote with all the text
// after it, since a quoted cell may run over lines; the lines up to src.header_line, when set, the
// general way too), so the counts and first places equal those of for_each_raw_cell over the whole
// text. Lines are numbered from line_before + 1, in first_where and in the status returned (the
// general reader's: a quote left open). *line_ends receives the line ends passed (LF, CRLF, lone CR).
Status count_digit_lines(const RawSource& src, DecimalMark mark, int line_before, DigitCounter* counter,
                         std::pair<int, int>* first_where, std::size_t* line_ends);

}  // namespace tallyproof
