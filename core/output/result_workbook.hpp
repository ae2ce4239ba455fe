// A result handed over as an .xlsx workbook: the same rows as the CSV/TSV table and the TSV
// write-up (table_export.hpp, writeup.hpp), written by core/workbook with every number the
// Result's own double in full precision, p-values in the format 0.000E+00, and labels as text
// (never a formula). A p-value below the double range (about 1e-308) has no spreadsheet number:
// it is written as text from its log10 ("3.16e-401") and a note row under the sheet says so.
#pragma once
#include <string>
#include <vector>

#include "analysis.hpp"
#include "result.hpp"
#include "table_export.hpp"
#include "writeup.hpp"
#include "xlsx_writing.hpp"

namespace tallyproof {

// One sheet from table rows (header first): text cells text, number cells their `value`
// (scientific when `probability`), a number with text but no value as text, plus the note row.
WorkbookSheet table_sheet(std::string name, const std::vector<std::vector<TableCell>>& rows);

// The .xlsx bytes of one result: sheet "Categories" (category_rows) and sheet "Numbers"
// (Quantity, Value: writeup_quantities). Only `o.subject` is used (numbers are numbers, so the
// decimal mark is the reader's). Empty only when the workbook cannot be written (no memory).
std::string result_workbook(const Analysis& a, const Result& r, const WriteupOptions& o = {});

}  // namespace tallyproof
