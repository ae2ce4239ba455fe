// The per-category table of a Result as CSV (RFC 4180) or TSV for spreadsheets, with text cells
// neutralised against formula injection as OWASP recommends
// (https://owasp.org/www-community/attacks/CSV_Injection): a text cell starting with = + - @, tab
// or carriage return gets a leading single quote; numbers we format stay bare numbers.
// Exact by construction: every value is the Result's own, written to 6 significant digits.
#pragma once
#include <limits>
#include <string>
#include <string_view>
#include <vector>

#include "result.hpp"

namespace tallyproof {

enum class TableFormat { csv, tsv };

struct TableExportOptions {
    TableFormat format = TableFormat::csv;
    bool decimal_comma = false;     // numbers written 0,25; the CSV separator becomes ';' (TSV keeps tab)
    bool byte_order_mark = false;   // start with U+FEFF so spreadsheet programs read the file as UTF-8
};

// A cell: a number we formatted (never prefixed; '.' becomes ',' with decimal_comma) or text
// (neutralised and quoted as needed). An empty number cell stands for a value that is not available.
// A number cell also keeps the Result's own double (`value`, NaN when there is none), which a
// workbook stores in full precision; `probability` marks a p-value (a workbook shows it 0.000E+00).
// A p-value below the double range has no `value` (NaN) and its text from log10, "3.16e-401".
struct TableCell {
    bool is_number = false;
    std::string text;
    double value = std::numeric_limits<double>::quiet_NaN();
    bool probability = false;
};
TableCell text_cell(std::string text);
TableCell number_cell(double x, int significant_digits = 6);  // "%.6g"; empty when not finite
TableCell count_cell(double x);                               // whole counts without exponent
TableCell probability_cell(const TailProbability& p);         // 4 significant digits; from log10 below 1e-300

char table_separator(const TableExportOptions& o);  // ',' ';' or '\t'
// One text cell made inert: control characters become spaces (and, in TSV, tabs and line breaks
// too), a leading formula trigger gets a single quote, then RFC 4180 quoting where needed.
std::string neutralised_text(std::string_view text, const TableExportOptions& o);
// Rows of cells joined by the separator; CSV lines end CRLF (RFC 4180), TSV lines LF.
std::string write_table(const std::vector<std::vector<TableCell>>& rows, const TableExportOptions& o);

// Tested categories (after merging): label, observed, expected, observed and expected share,
// contribution, Pearson and adjusted residual, category p, adjusted p, direction, Sison-Glaz interval.
// The rows (header first) that the CSV/TSV table and the workbook's sheet are both written from;
// `decimal_comma` only changes the confidence level in the interval's header ("95% " stays).
std::vector<std::vector<TableCell>> category_rows(const Result& r, bool decimal_comma = false);
std::string category_table(const Result& r, const TableExportOptions& o);

}  // namespace tallyproof
