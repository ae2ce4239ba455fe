// The screening members of the analysis document (docs/analysis-document.md, "Screening"):
// `groups` [{name, observed}] with the shared top-level `categories`, `screen` {against, adjust,
// q, and how the screen was read and looked at: shape, header, sort, ascending, opened} and `by`
// (the group column a paste was read by). Read into GroupedCounts / ScreenChoice / ScreenView and
// written back, so a saved file, an autosave or a share link restores the screen as it was left.
#pragma once
#include <string>
#include <string_view>

#include "analysis.hpp"
#include "screen_groups.hpp"
#include "grouped_table.hpp"
#include "json_writer.hpp"
#include "status.hpp"

namespace tallyproof {

// How the screen was being looked at: the table's order and the group opened as a single analysis.
struct ScreenView {
    std::string sort;       // "" (input order), "name", "n", "statistic", "df", "p", "q", "w", "flag"
    bool ascending = true;
    std::string opened;     // the name of the group shown as a single analysis; "": the table
};
bool screen_sort_known(const std::string& column);  // one of the names above

// Sets *is_screen when the document carries `groups`; then reads them into `counts` and the
// `screen` settings into `choice` (and `view`). Group names enter as category labels do (NFC,
// invisible characters as codes; names equal after that are refused as twice the same group).
// Refusals name the member ("groups[3].observed[2]"); "groups" that is null or not a list is refused.
Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, bool* is_screen);
Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, ScreenView* view, bool* is_screen);

// The analysis document of a screen (one line of JSON): format, categories, the settings of `base`
// (model, statistic, p-value method...; not its observed counts), `by`, `groups` [{name, observed}]
// and `screen` {against, adjust, q, shape, header, sort, ascending, opened}. read_screen_document
// reads it back to the same counts, choice and view; encode_share_fragment turns it into a link.
std::string write_screen_document(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice,
                                  const ScreenView& view = {});

// Opens the "screen" member and writes its settings (against ... opened); the caller may add
// members (the result document adds its counts and summary) and closes it.
void begin_screen_settings(JsonWriter& j, const GroupedCounts& counts, const ScreenChoice& choice, const ScreenView& view);

}  // namespace tallyproof
