// Writing an .xlsx workbook (Office Open XML, ECMA-376 Part 1, SpreadsheetML; the minimal package
// of its Part 1 annex: [Content_Types].xml, _rels/.rels, xl/workbook.xml and its rels, one
// worksheet per sheet, shared strings and styles). ZIP with zlib's deflate and CRC-32 (APPNOTE
// 6.3.x). Text cells are strings (a label that looks like a formula is never a formula), numbers
// are numbers in full precision. The first row of every sheet is its header, in bold, and stays
// in view while scrolling; p-values take the number format "0.000E+00" so a small one keeps its
// exponent on screen.
//
// Index: WorkbookCell and its makers, WorkbookSheet, write_xlsx. The parts written are in
// xlsx_writing.cpp; the container in zip_writer.hpp; text escaping in xml_text_writing.hpp; sheet
// names in sheet_name_rules.hpp.
#pragma once
#include <string>
#include <vector>

namespace tallyproof {

struct WorkbookCell {
    enum class Kind { empty, text, number } kind = Kind::empty;
    std::string text;   // Kind::text (UTF-8)
    double number = 0;  // Kind::number (finite)
    enum class Format { general, scientific } format = Format::general;  // scientific: "0.000E+00" (p-values)
};
WorkbookCell workbook_text(std::string text);
WorkbookCell workbook_number(double x);      // a non-finite x is an empty cell
WorkbookCell workbook_scientific(double x);  // a number shown as 0.000E+00 (a p-value); non-finite: empty

struct WorkbookSheet {
    std::string name;  // made valid: at most 31 characters, none of : \ / ? * [ ], unique in the workbook
    std::vector<std::vector<WorkbookCell>> rows;  // the first row is the header (text)
};

// The bytes of the .xlsx file (one empty sheet when `sheets` is empty); empty only when it cannot
// be written at all (no memory, past ZIP's 4 GiB). Never throws.
std::string write_xlsx(const std::vector<WorkbookSheet>& sheets);

}  // namespace tallyproof
