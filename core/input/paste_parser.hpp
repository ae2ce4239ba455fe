// Paste parser: turns text copied from a spreadsheet or exported as CSV into categories and
// observed counts (and optionally an expected column), or a refusal naming line and column.
// Shapes, separators and number formats are detected and stated in plain sentences; the
// conventions are common practice for clipboard and CSV text (RFC 4180; CLDR number formats).
#pragma once
#include <string_view>

#include "parsed_input.hpp"

namespace tallyproof {

// Reads pasted text in any recognised shape; never throws, refuses with a located message.
// `rows`, when given, receives every non-blank row of the text as split with the separator
// chosen (the reading's `separator`), when the reader split them all (a table; raw
// observations of at most a sample's rows), read or refused; else it is left empty. Another
// reading of the same text (read_input.hpp) starts from them instead of splitting it again.
ParsedInput parse_input(std::string_view text, const ParseOptions& options = {}, std::vector<TableRow>* rows = nullptr);

struct ParsedCounts {
    Status status;                        // !ok: message names the line (and column) at fault
    std::vector<std::string> categories;  // labels ("Category 1".. when the paste has none)
    std::vector<double> observed;         // non-negative whole counts
    std::vector<std::string> notes;       // what was detected (header row kept, etc.)
};

// The simple entry point of the page and the tool: parse_input with default options.
ParsedCounts parse_counts(std::string_view text);

}  // namespace tallyproof
