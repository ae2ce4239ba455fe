// The bytes of a file or a paste turned into the text the readers take: a workbook (.xlsx, .ods)
// into its chosen sheet's cells as tab-separated lines (read_workbook), anything else decoded
// (decode_text). The one step before read_input, for the page and the command-line tool alike.
#pragma once
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"
#include "text_decoding.hpp"
#include "workbook_reading.hpp"

namespace tallyproof {

struct InputText {
    Status status;                          // !ok: refused (not text, or a workbook refused), by name
    std::string text;                       // UTF-8 text for read_input; refused as not text: the bytes as given
    std::string notice;                     // a plain sentence: the decoding, or which sheet and range were read
    bool from_workbook = false;
    std::vector<WorkbookSheetInfo> sheets;  // from_workbook: every sheet, for a choice of another
    std::size_t sheet_index = 0;            // from_workbook: the sheet read (0-based)
    CellRange range;                        // from_workbook: the cells read (1-based, closed)
    std::vector<std::string> notes;         // from_workbook: read_workbook's notes
};

// `name` is the file's name for the messages (may be empty); `choice` applies to workbooks only.
InputText input_text(std::string bytes, std::string_view name = {}, const WorkbookChoice& choice = {});

}  // namespace tallyproof
