// Reading a spreadsheet workbook: .xlsx (Office Open XML, ECMA-376 Part 1, SpreadsheetML) and
// .ods (OpenDocument 1.2/1.3, OASIS, table:table) opened from their bytes; one sheet's cells in a
// chosen or used range turned into tab-separated lines for the paste reader (read_input), so every
// shape pasted text can have, a workbook can have. ZIP with zlib's inflate, XML with expat; the
// container and part names from the two standards. Refusals by name (encrypted, legacy .xls,
// .xlsb, corrupt, a decompression bomb past the budget below), never an exception.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "cell_reference.hpp"
#include "status.hpp"

namespace tallyproof {

enum class WorkbookKind { none, xlsx, ods, refused };  // refused: a workbook we recognise and cannot read (legacy, encrypted, .xlsb)

// By content only (a ZIP holding [Content_Types].xml with a spreadsheet part, or an ODF
// "mimetype" of a spreadsheet; an OLE compound file), never by the file's name.
WorkbookKind workbook_kind(std::string_view bytes);

struct WorkbookSheetInfo {
    std::string name;
    bool hidden = false;         // hidden or "very hidden": listed, read only when chosen
    bool empty = false;          // no cell with a value
    std::size_t rows = 0, columns = 0;  // the used range's size
};

struct WorkbookChoice {
    std::string sheet;  // a sheet's name or its 1-based number; empty: the first non-empty visible sheet
    std::string range;  // A1 notation (parse_cell_range); empty: the sheet's used range
};

// Budgets against a decompression bomb, checked on the sizes the ZIP declares before anything is
// inflated, and again while inflating (a declared size can lie).
inline constexpr std::size_t workbook_max_inflated_bytes = 512u << 20;  // all parts read, inflated
inline constexpr std::size_t workbook_max_entries = 10000;              // entries in the ZIP
inline constexpr double workbook_max_ratio = 1000;                      // inflated / stored, per part over 1 MB

struct WorkbookReading {
    Status status;                         // !ok: refused, the message says why and what to do instead
    WorkbookKind kind = WorkbookKind::none;
    std::vector<WorkbookSheetInfo> sheets;  // every sheet, in the workbook's order (also when refused for the choice)
    std::size_t sheet_index = 0;           // 0-based: the sheet read
    CellRange range;                       // the cells read, 1-based (the used range, or the choice's within it)
    std::string text;                      // one line per row, cells separated by tabs (a tab or line break
                                           // inside a cell becomes a space); numbers in full precision
                                           // (shortest text that reads back to the same double), dates as
                                           // ISO 8601 text, booleans TRUE/FALSE, formulas by cached value
    std::vector<std::string> notes;        // plain sentences: formulas without a cached value (named by
                                           // cell), macros or external links ignored, merged cells, ...
};

WorkbookReading read_workbook(std::string_view bytes, const WorkbookChoice& choice = {});

}  // namespace tallyproof
