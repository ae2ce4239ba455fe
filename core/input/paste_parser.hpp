// Paste parser: turns text copied from a spreadsheet or exported as CSV into categories and
// observed counts (and optionally an expected column), or a refusal naming line and column.
// Shapes, separators and number formats are detected and stated in plain sentences; the
// conventions are common practice for clipboard and CSV text (RFC 4180; CLDR number formats).
#pragma once
#include <cstddef>
#include <string_view>
#include <vector>

#include "delimited_text.hpp"
#include "parsed_input.hpp"

namespace tallyproof {

// Reads pasted text in any recognised shape; never throws, refuses with a located message.
// `rows`, when given, receives every non-blank row of the text as split with the separator
// chosen (the reading's `separator`), when the reader split them all (a table; raw
// observations of at most a sample's rows), read or refused; else it is left empty. Another
// reading of the same text (read_input.hpp) starts from them instead of splitting it again.
ParsedInput parse_input(std::string_view text, const ParseOptions& options = {}, std::vector<TableRow>* rows = nullptr);

// parse_input in steps, for a caller that must stay responsive (the page): the leading rows are
// sampled and the shape decided at the start; a table's further rows are then split a budget of
// rows per step; the table read (or the raw values streamed) at the last step. The same
// operations in the same order as parse_input, so the same reading. `text` must outlive it.
struct PasteReading {
    std::string_view text;
    ParseOptions options;
    ParsedInput out;                  // complete when `done`
    std::vector<TableRow> rows;       // when done: every non-blank row, when all were split (as parse_input's `rows`)
    bool done = false;
    // The run's state.
    DelimitedReader reader{std::string_view(), Separator::tab};
    std::vector<TableRow> grouped;    // space-separated rows regrouped
    bool more = false, words = false, all_rows = false;
};
void start_paste_reading(std::string_view text, const ParseOptions& options, PasteReading* r);
// About `budget` rows split (at least one step of work); true when done (then r->out is the reading).
bool step_paste_reading(PasteReading* r, std::size_t budget);
// Bytes of the text split so far: for progress.
std::size_t paste_reading_offset(const PasteReading& r);

struct ParsedCounts {
    Status status;                        // !ok: message names the line (and column) at fault
    std::vector<std::string> categories;  // labels ("Category 1".. when the paste has none)
    std::vector<double> observed;         // non-negative whole counts
    std::vector<std::string> notes;       // what was detected (header row kept, etc.)
};

// The simple entry point of the page and the tool: parse_input with default options.
ParsedCounts parse_counts(std::string_view text);

}  // namespace tallyproof
