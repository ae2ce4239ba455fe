// The screening members of the analysis document (docs/analysis-document.md, "Screening"):
// `groups` [{name, observed}] with the shared top-level `categories`, `screen` {against,
// adjust, q} and `by` (the group column a paste was read by, kept for the record).
#pragma once
#include <string_view>

#include "screen_groups.hpp"
#include "grouped_table.hpp"
#include "status.hpp"

namespace tallyproof {

// Sets *is_screen when the document carries `groups`; then reads them into `counts` and the
// `screen` settings into `choice`. Refusals name the member ("groups[3].observed[2]").
Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, bool* is_screen);

}  // namespace tallyproof
