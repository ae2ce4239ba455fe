// The screen's two sheets, built from the rows the groups table and the screening report already
// use (screen_report.hpp) and written by core/workbook (ECMA-376 Part 1 SpreadsheetML).
#include "screen_workbook.hpp"

#include "multiplicity.hpp"
#include "result_workbook.hpp"
#include "screen_report.hpp"

namespace tallyproof {

std::string screen_workbook(const ScreenResult& s) {
    std::vector<std::vector<TableCell>> about = {{text_cell("Quantity"), text_cell("Value")}};
    auto add = [&](const char* name, TableCell value) { about.push_back({text_cell(name), std::move(value)}); };
    if (!s.status.ok) add("Not analysed", text_cell(s.status.message));
    else {
        add("Model", text_cell(s.model_description));
        add("Statistic", text_cell(s.statistic_symbol));
        add("Compared with", text_cell(s.choice.against == ScreenAgainst::rest ? "the other groups pooled" : "the model"));
        add("Adjustment", text_cell(multiplicity_method_name(s.choice.adjust)));
        add("Flagged at q at most", number_cell(s.choice.q, 17));
        add("Groups", count_cell(static_cast<double>(s.groups.size())));
        add("Tested", count_cell(static_cast<double>(s.tested)));
        add("Flagged", count_cell(static_cast<double>(s.flagged)));
        add("Thin", count_cell(static_cast<double>(s.thin)));
        add("Summary", text_cell(screen_summary(s)));
        for (const auto& n : s.notes) add("Note", text_cell(n));
        for (const auto& c : s.cautions) add("Caution", text_cell(c));
    }
    return write_xlsx({table_sheet("Groups", group_rows(s)), table_sheet("Screen", about)});
}

}  // namespace tallyproof
