// A screen of many groups handed over as an .xlsx workbook: sheet "Groups" (the rows of the
// CSV/TSV groups table, group_rows) and sheet "Screen" (Quantity, Value: how the screen was run,
// its counts, the summary sentence, notes and cautions). Numbers are the ScreenResult's doubles in
// full precision, p- and q-values in the format 0.000E+00, group names text (never formulas); as
// result_workbook.hpp, a p-value below the double range is text with a note row.
#pragma once
#include <string>

#include "screen_groups.hpp"

namespace tallyproof {

// The .xlsx bytes; empty only when the workbook cannot be written (no memory).
std::string screen_workbook(const ScreenResult& s);

}  // namespace tallyproof
