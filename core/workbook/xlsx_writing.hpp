// Writing an .xlsx workbook (Office Open XML, ECMA-376 Part 1, SpreadsheetML; the minimal package
// of its Part 1 annex: [Content_Types].xml, _rels/.rels, xl/workbook.xml and its rels, one
// worksheet per sheet, shared strings and styles). ZIP with zlib's deflate and CRC-32 (APPNOTE
// 6.3.x). Text cells are strings (a label that looks like a formula is never a formula), numbers
// are numbers in full precision.
#pragma once
#include <string>
#include <vector>

namespace tallyproof {

struct WorkbookCell {
    enum class Kind { empty, text, number } kind = Kind::empty;
    std::string text;   // Kind::text (UTF-8)
    double number = 0;  // Kind::number (finite)
};
WorkbookCell workbook_text(std::string text);
WorkbookCell workbook_number(double x);  // a non-finite x is an empty cell

struct WorkbookSheet {
    std::string name;  // made valid: at most 31 characters, none of : \ / ? * [ ], unique in the workbook
    std::vector<std::vector<WorkbookCell>> rows;  // the first row is the header (text)
};

// The bytes of the .xlsx file.
std::string write_xlsx(const std::vector<WorkbookSheet>& sheets);

}  // namespace tallyproof
