// The sheets of an .ods workbook (OpenDocument 1.3, OASIS, Part 3 "Schema"): content.xml's
// table:table (9.1.2, its name and, through its automatic style's table:display, 17.15, whether it
// is hidden), table:table-row (9.1.3, number-rows-repeated), table:table-cell and
// table:covered-table-cell (9.1.4, 9.1.5, number-columns-repeated, spans) and each cell's value
// (19.385 office:value-type with office:value, date-value, time-value, boolean-value; text:p).
#pragma once
#include <string_view>

#include "sheet_cells.hpp"
#include "zip_archive.hpp"

namespace tallyproof {

inline constexpr std::string_view ods_mimetype = "application/vnd.oasis.opendocument.spreadsheet";

WorkbookCells read_ods_cells(std::string_view bytes, ZipArchive* zip, const ZipBudget& budget);

}  // namespace tallyproof
