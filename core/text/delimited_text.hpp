// Delimited text: pasted or exported text split into records and cells. Separators tab, comma,
// semicolon or runs of spaces; quoted fields as in RFC 4180 (Shafranovich 2005) with embedded
// separators, doubled quotes and line breaks; LF, CRLF or CR line ends; a UTF-8 byte-order
// mark is skipped. Streaming: one record at a time, memory proportional to one record.
#pragma once
#include <cstddef>
#include <cstdint>
#include <deque>
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"

namespace tallyproof {

enum class Separator { tab, comma, semicolon, spaces };
const char* separator_name(Separator sep);  // "tab", "comma", "semicolon", "spaces"

struct Record {
    int line = 0;                        // 1-based line on which the record starts
    std::vector<std::string_view> cells; // trimmed; valid until the next call to next()
    std::vector<bool> quoted;            // cell was quoted (its content is taken literally)
    bool blank() const { return cells.empty(); }
};

// Reads records one at a time. Trailing empty cells are dropped; a blank line is a record
// without cells. A quote left open is reported through status() once the text ends.
class DelimitedReader {
public:
    DelimitedReader(std::string_view text, Separator sep);
    bool next(Record* record);           // false when the text is used up
    // The common raw column, fast: when the next line is one cell of printable ASCII with no
    // separator, quote or space in it, consumes the line and gives the cell and its line (what
    // next() would give); otherwise consumes nothing and returns false (call next()).
    bool next_single_cell(std::string_view* cell, int* line);
    const Status& status() const { return status_; }
    std::size_t offset() const { return pos_; }  // bytes consumed so far
private:
    std::string_view text_;
    Separator sep_;
    std::size_t pos_ = 0;
    int line_ = 1;
    Status status_;
    std::deque<std::string> unescaped_;    // cells whose doubled quotes were undone
    bool single_[256] = {};                // bytes next_single_cell accepts in a cell
    void end_line();                       // past the line end at pos_ (LF, CRLF or CR)
};

// The separator the text most likely uses, judged from its first lines (outside quotes):
// tab if any; else semicolon or comma when every such line splits consistently; else spaces.
// With `lines_may_be_numbers` a text whose every line reads as one number ("12,5") is taken
// as one column, not as comma-separated cells.
Separator detect_separator(std::string_view text, bool lines_may_be_numbers = false);

// "Line 3, column 2: " for messages that point at a cell (column 0: the line only).
std::string cell_location(int line, int column);
// The cell as quoted in messages: "\"many\"", shortened to 40 bytes (whole UTF-8 characters).
std::string quote_cell(std::string_view cell);

// UTF-8 well-formedness (Unicode 15, table 3-7): labels must be valid text for display and JSON.
bool valid_utf8(std::string_view s);
// The text with each ill-formed byte replaced by U+FFFD.
std::string utf8_or_replacement(std::string_view s);

std::string_view skip_byte_order_mark(std::string_view text);

// Appends code point `cp` (at most U+10FFFF, not a surrogate) as UTF-8.
void append_utf8(std::string* s, std::uint32_t cp);

}  // namespace tallyproof
