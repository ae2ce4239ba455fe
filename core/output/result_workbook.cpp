// Table rows (table_export.hpp) turned into workbook cells (xlsx_writing.hpp). Cell types follow
// ECMA-376 Part 1, 18.3.1.4: numbers as numbers, every text a shared string; the rows themselves
// come from the functions that build the CSV/TSV table and the TSV write-up, so the columns are
// listed in one place only.
#include "result_workbook.hpp"

#include <cmath>

namespace tallyproof {
namespace {

constexpr const char* kBelowRangeNote =
    "Note: a p-value below about 1E-308 cannot be a spreadsheet number; it is written as text "
    "computed from its logarithm (for example 3.16e-401).";

}  // namespace

WorkbookSheet table_sheet(std::string name, const std::vector<std::vector<TableCell>>& rows) {
    WorkbookSheet sheet;
    sheet.name = std::move(name);
    bool below_range = false;
    for (const auto& row : rows) {
        std::vector<WorkbookCell> cells;
        cells.reserve(row.size());
        for (const TableCell& c : row) {
            if (!c.is_number) cells.push_back(workbook_text(c.text));
            else if (std::isfinite(c.value)) cells.push_back(c.probability ? workbook_scientific(c.value) : workbook_number(c.value));
            else if (!c.text.empty()) {
                cells.push_back(workbook_text(c.text));
                below_range = below_range || c.probability;
            } else cells.emplace_back();
        }
        sheet.rows.push_back(std::move(cells));
    }
    if (below_range) {
        sheet.rows.emplace_back();
        sheet.rows.push_back({workbook_text(kBelowRangeNote)});
    }
    return sheet;
}

std::string result_workbook(const Analysis& a, const Result& r, const WriteupOptions& o) {
    WriteupOptions plain = o;
    plain.decimal_comma = false;
    plain.style = WriteupStyle::tsv;
    std::vector<std::vector<TableCell>> numbers = {{text_cell("Quantity"), text_cell("Value")}};
    for (auto& row : writeup_quantities(a, r, plain)) numbers.push_back(std::move(row));
    return write_xlsx({table_sheet("Categories", category_rows(r, false)), table_sheet("Numbers", numbers)});
}

}  // namespace tallyproof
