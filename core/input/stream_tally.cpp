// The streamed digit tally of stream_tally.hpp: common practice (cut at line ends, read each
// piece with the whole text's readers, carry the line count). Exact counting.
#include "stream_tally.hpp"

#include <algorithm>
#include <string>

#include "delimited_text.hpp"
#include "plain_number_lines.hpp"
#include "raw_observations.hpp"
#include "read_input.hpp"
#include "text_decoding.hpp"

namespace tallyproof {
namespace {

// The notes put_digit_tally writes (its own wording), so that a first piece's are replaced.
bool digit_tally_note(const std::string& note) {
    return (note.rfind("Read ", 0) == 0 && note.find(" raw numbers for the ") != std::string::npos) ||
           (note.find(" left out: ") != std::string::npos && note.find(" (first at line ") != std::string::npos);
}

std::size_t line_ends(std::string_view s) {
    // LF, CRLF or a lone CR end a line (DelimitedReader's rule)
    std::size_t n = 0;
    for (std::size_t i = 0; i < s.size(); ++i)
        if (s[i] == '\n' || (s[i] == '\r' && (i + 1 == s.size() || s[i + 1] != '\n'))) ++n;
    return n;
}

}  // namespace

bool DigitStreamTally::continues(const ParsedInput& r) {
    return r.status.ok && r.shape == InputShape::raw_digits && r.digit_test.has_value();
}

DigitStreamTally::DigitStreamTally(ParsedInput first_reading)
    : first_(std::move(first_reading)), test_(first_.digit_test.value_or(DigitTest::first)), counter_(test_) {}

bool DigitStreamTally::feed(std::string_view piece) {
    if (!status_.ok) return false;
    const bool first_piece = !fed_;
    fed_ = true;
    if (first_piece && !piece.empty() && piece.substr(0, 3) == "\xEF\xBB\xBF") piece.remove_prefix(3);
    if (!first_piece && !valid_utf8(piece)) {
        status_ = Status::failure("The text after line " + std::to_string(lines_) +
                                  " is not UTF-8 text; the lines read before it are not reported on their own.");
        return false;
    }
    if (first_piece && !first_.column_names.empty()) {
        // The header row is the first line with a value (read_raw_text's rows begin there).
        int line = 1;
        for (std::size_t i = 0; i < piece.size(); ++i) {
            const char c = piece[i];
            if (c == '\n' || c == '\r') {
                if (c == '\r' && i + 1 < piece.size() && piece[i + 1] == '\n') ++i;
                ++line;
            } else if (c != ' ' && c != '\t') {
                header_line_ = line;
                break;
            }
        }
    }
    RawSource src;
    src.text = piece;
    src.separator = first_.separator;
    src.numbers = true;
    src.header_line = first_piece ? header_line_ : 0;
    const int offset = static_cast<int>(lines_);
    std::size_t ends = 0;
    if (plain_lines_serve(counter_, first_.decimal)) {
        // plain-number lines on the fast path, the others the general way (count_digit_lines)
        const Status read = count_digit_lines(src, first_.decimal, offset, &counter_, first_where_, &ends);
        if (!read.ok) {
            status_ = read;
            return false;
        }
        lines_ += ends;
        return true;
    }
    const DecimalMark mark = first_.decimal;
    const Status read = for_each_raw_cell(src, [&](std::string_view cell, int line, int column) {
        const int why = counter_.add_cell(cell, mark);
        if (why >= 0 && first_where_[why].first == 0) first_where_[why] = {line + offset, column};
        return true;
    });
    if (!read.ok) {
        status_ = read;
        status_.line = read.line + offset;
        const std::string said = "Line " + std::to_string(read.line);
        if (read.message.rfind(said, 0) == 0)
            status_.message = "Line " + std::to_string(read.line + offset) + read.message.substr(said.size());
        return false;
    }
    lines_ += line_ends(piece);
    return true;
}

ParsedInput DigitStreamTally::finish(std::size_t first_bytes, std::size_t total_bytes) const {
    ParsedInput out = first_;
    out.categories.clear();
    out.observed.clear();
    if (!status_.ok) {
        out.status = status_;
        return out;
    }
    std::vector<std::string> before, after;
    bool seen = false;
    for (auto& note : first_.notes) {
        if (digit_tally_note(note)) { seen = true; continue; }
        (seen ? after : before).push_back(note);
    }
    out.notes = before;
    out.status = Status{};
    put_digit_tally(counter_.tally(), first_where_, test_, &out);
    out.notes.insert(out.notes.end(), after.begin(), after.end());
    if (total_bytes > first_bytes)
        out.notes.push_back("The shape was read from the first " + std::to_string(first_bytes) + " bytes; the rest (" +
                            std::to_string(total_bytes - first_bytes) + " bytes, " + std::to_string(lines_) +
                            " lines in all) was streamed through the same reader.");
    return out;
}

DigitStreamReader::State DigitStreamReader::push(std::string_view bytes) {
    if (ended_ || state_ == State::stopped) return state_;
    bytes_ += bytes.size();
    held_.append(bytes.data(), bytes.size());
    if (state_ == State::deciding && held_.size() >= kStreamHeadBytes) decide(false);
    else if (state_ == State::streaming) feed_lines(false);
    return state_;
}

DigitStreamReader::State DigitStreamReader::end() {
    if (ended_) return state_;
    ended_ = true;
    if (state_ == State::deciding) decide(true);
    else if (state_ == State::streaming) feed_lines(true);
    return state_;
}

void DigitStreamReader::decide(bool at_end) {
    state_ = State::whole;
    if (at_end) return;  // shorter than the head: read whole
    const std::string_view chunk = std::string_view(held_).substr(0, kStreamHeadBytes);
    const std::size_t cut = chunk.find_last_of('\n');
    if (cut == std::string_view::npos) return;
    const std::string_view first = chunk.substr(0, cut + 1);
    std::string probe(first);
    const TextDecoding decoded = decode_text(&probe);
    const std::size_t lead = first.find_first_not_of(" \t\r\n");
    if (!decoded.status.ok || !decoded.notice.empty() || lead == std::string_view::npos || first[lead] == '{') return;
    ReadInputOptions how;
    how.groups = GroupsReading::never;
    ParsedInput head = read_input(first, options_, how).sample;
    if (!DigitStreamTally::continues(head)) return;
    state_ = State::streaming;
    tally_.emplace(std::move(head));
    first_bytes_ = first.size();
    tally_->feed(first);
    held_.erase(0, first.size());
    if (!tally_->status().ok) state_ = State::stopped;
    else feed_lines(false);
}

void DigitStreamReader::feed_lines(bool at_end) {
    // Pieces of whole lines; a line longer than what is held waits for its end.
    const std::size_t end = at_end ? held_.size() : held_.find_last_of('\n') + 1;  // npos + 1 == 0
    if (!at_end && end == 0) return;
    if (!tally_->feed(std::string_view(held_).substr(0, end))) state_ = State::stopped;
    held_.erase(0, end);
}

std::string DigitStreamReader::take_held() {
    std::string out = std::move(held_);
    held_.clear();
    return out;
}

ParsedInput DigitStreamReader::finish() const {
    if (!tally_) {
        ParsedInput none;
        none.status = Status::failure("The text was not read as a stream.");
        return none;
    }
    return tally_->finish(first_bytes_, bytes_);
}

}  // namespace tallyproof
