// Paste parser: turns text copied from a spreadsheet (lines of `label<TAB>count`, or a single
// column of counts) into categories and observed counts, or a refusal naming line and column.
#pragma once
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct ParsedCounts {
    Status status;                        // !ok: message names the line (and column) at fault
    std::vector<std::string> categories;  // labels ("Category 1".. when the paste has none)
    std::vector<double> observed;         // non-negative whole counts
    std::vector<std::string> notes;       // what was detected (header row kept, etc.)
};

ParsedCounts parse_counts(std::string_view text);

}  // namespace tallyproof
