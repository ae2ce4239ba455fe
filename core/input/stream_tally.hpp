// A digit tally of raw numbers fed piece by piece (common practice for streaming a tally: the
// text is cut at line ends, each piece is read as the whole text would be, line numbers carry
// on), so that memory is that of the tally, not of the text. The shape (separator, decimal
// mark, header row) is decided once, by read_input on the first piece; every piece is then read
// by raw_observations' for_each_raw_cell and digit_extraction's DigitCounter, the readers of the
// whole text, so the counts and notes equal those of reading the whole text at once. Lines that
// hold one plain number go through plain_number_lines' fast path, which reads them identically.
#pragma once
#include <cstddef>
#include <optional>
#include <string>
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

// The one rule for a text that arrives a piece at a time (a file read in chunks by the command-line
// tool or by the page): its first kStreamHeadBytes bytes, cut at their last line end, decide. When
// they are plain UTF-8 text (no byte-order mark, not another encoding), not a document, and
// read_input (groups never) reads them as a raw-digits tally that DigitStreamTally::continues, the
// text is streamed: every later piece is cut at line ends and fed, and only the part of a line
// not yet ended is held. Otherwise the text is to be read whole (a text shorter than the head
// bytes too), from the bytes held so far and the rest.
constexpr std::size_t kStreamHeadBytes = 1u << 20;

class DigitStreamReader {
public:
    enum class State { deciding, streaming, whole, stopped };  // stopped: refused (finish() says why)
    explicit DigitStreamReader(ParseOptions options) : options_(std::move(options)) {}
    State push(std::string_view bytes);  // the next bytes of the text, any number
    State end();                         // the text ended after the last push
    State state() const { return state_; }
    bool ended() const { return ended_; }
    std::string take_held();             // State::whole: the bytes pushed so far (the text's start)
    // Streamed and ended, or stopped: the reading of the whole text (DigitStreamTally::finish).
    ParsedInput finish() const;
    std::size_t bytes() const { return bytes_; }  // pushed so far
    std::size_t values() const { return tally_ ? tally_->values() : 0; }
    std::size_t lines() const { return tally_ ? tally_->lines() : 0; }
private:
    void decide(bool at_end);
    void feed_lines(bool at_end);
    ParseOptions options_;
    State state_ = State::deciding;
    bool ended_ = false;
    std::string held_;                   // deciding: all bytes so far; streaming: a line not yet ended
    std::optional<DigitStreamTally> tally_;
    std::size_t first_bytes_ = 0, bytes_ = 0;
};

}  // namespace tallyproof
