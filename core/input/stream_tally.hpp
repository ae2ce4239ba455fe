// A digit tally of raw numbers fed piece by piece (common practice for streaming a tally: the
// text is cut at line ends, each piece is read as the whole text would be, line numbers carry
// on), so that memory is that of the tally, not of the text. The shape (separator, decimal
// mark, header row) is decided once, by read_input on the first piece; every piece is then read
// by raw_observations' for_each_raw_cell and digit_extraction's DigitCounter, the readers of the
// whole text, so the counts and notes equal those of reading the whole text at once. Lines that
// hold one plain number go through plain_number_lines' fast path, which reads them identically.
#pragma once
#include <cstddef>
#include <string_view>
#include <utility>

#include "digit_extraction.hpp"
#include "parsed_input.hpp"

namespace tallyproof {

class DigitStreamTally {
public:
    // `first_reading`: read_input's reading of the first piece (the text it is given first).
    // Whether a reading can be continued this way: a raw-digits tally read as one sample.
    static bool continues(const ParsedInput& first_reading);
    explicit DigitStreamTally(ParsedInput first_reading);
    // Counts the values of `piece`: whole lines (the last one ends with a line end, except in the
    // last piece). The first piece fed must be the text first_reading was read from. Returns
    // false once the text is refused (status() says why and on which line).
    bool feed(std::string_view piece);
    const Status& status() const { return status_; }
    std::size_t lines() const { return lines_; }              // lines fed so far
    std::size_t values() const { return counter_.tally().values; }
    // The reading of all pieces: first_reading's shape and notes, the counts and tally notes of
    // every value, and a note that the text after the first `first_bytes` bytes was streamed.
    ParsedInput finish(std::size_t first_bytes, std::size_t total_bytes) const;
private:
    ParsedInput first_;
    DigitTest test_;
    DigitCounter counter_;
    std::pair<int, int> first_where_[kDigitExclusionReasons] = {};
    int header_line_ = 0;
    std::size_t lines_ = 0;
    bool fed_ = false;
    Status status_;
};

}  // namespace tallyproof
