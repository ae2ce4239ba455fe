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

}  // namespace tallyproof
