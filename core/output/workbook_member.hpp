// The result document's "workbook" member (docs/analysis-document.md, docs/workbooks.md): the sheet
// and range of a workbook that were read, and every sheet with whether it is hidden, so a script
// can tell what the counts came from and ask for another sheet.
#pragma once
#include <string>

#include "input_text.hpp"

namespace tallyproof {

// {"sheet":"Counts","range":"A1:C12","sheets":[{"name":"Counts","hidden":false},...]}
std::string workbook_member_json(const InputText& input);
// Adds "workbook" as the last member of `document` (a JSON object) when the input was a workbook.
void add_workbook_member(std::string* document, const InputText& input);

}  // namespace tallyproof
