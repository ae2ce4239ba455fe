// Reports of a ScreenResult: the summary sentence ("3 of 40 groups depart from ... at a false
// discovery rate of 5%: ..."), the plain-text report with the groups table and cautions, the
// groups table for spreadsheets (CSV/TSV, formulas neutralised as table_export.hpp) and the
// screening section of the result document (docs/analysis-document.md, "Screening").
#pragma once
#include <string>
#include <vector>

#include "analysis.hpp"
#include "screen_groups.hpp"
#include "screen_document.hpp"
#include "table_export.hpp"

namespace tallyproof {

// "false discovery rate of 5%" / "family-wise error rate of 5% (Holm)" / "unadjusted level of 5%".
std::string screen_level_phrase(const ScreenChoice& choice);
// The one-sentence summary of the screen, naming the flagged groups (at most ten, by q).
std::string screen_summary(const ScreenResult& s);
std::string screen_report_text(const ScreenResult& s);                    // summary, table, notes, cautions
std::string screen_writeup(const ScreenResult& s);                        // summary and cautions, to paste
// One printed page of a screen: the heading line, the summary, the flagged groups (the first
// `max_listed` by q) with N, q, w and their drivers, how many more are in the table, the cautions.
std::string screen_print_text(const ScreenResult& s, std::size_t max_listed = 25);
// The groups table's rows (header first), which the CSV/TSV table and the workbook's sheet share.
std::vector<std::vector<TableCell>> group_rows(const ScreenResult& s);
std::string group_table(const ScreenResult& s, const TableExportOptions& o);  // one row per group
// The result document of a screen: the input as the analysis document writes it (categories,
// settings, groups with observed, screen settings and `view`), so it reads back as the same screen,
// and the output.
// With `list_groups` false the "groups" list is empty and screen.groups_listed is false: the page's
// summary of a screen too large to hand over whole (its rows are asked for a page at a time).
std::string screen_json(const Analysis& base, const GroupedCounts& counts, const ScreenResult& s, const ScreenView* view = nullptr,
                        bool list_groups = true);
// The "groups" objects of screen_json for the groups given (indices into s.groups), in that order.
std::string screen_group_rows_json(const GroupedCounts& counts, const ScreenResult& s, const std::vector<std::size_t>& groups);

}  // namespace tallyproof
