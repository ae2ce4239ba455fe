// The sheets of an .xlsx workbook (Office Open XML SpreadsheetML, ECMA-376 Part 1, 5th edition):
// the package's relationships (Part 2, 9.3), the workbook part (18.2.27 workbook, 18.2.19 sheet
// with its state), shared strings (18.4.8 si, 18.4.4 r rich text runs, 18.4.6 rPh skipped), styles
// (18.8.30 numFmt, 18.8.10 cellXfs) and each worksheet's cells (18.3.1.4 c, 18.3.1.96 v, 18.3.1.40
// f, 18.18.11 ST_CellType, 18.3.1.55 mergeCell). Every cell keeps its value's text (cell_values).
#pragma once
#include <string_view>

#include "sheet_cells.hpp"
#include "zip_archive.hpp"

namespace tallyproof {

WorkbookCells read_xlsx_cells(std::string_view bytes, ZipArchive* zip, const ZipBudget& budget);

}  // namespace tallyproof
