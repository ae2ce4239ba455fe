// Sheet names a spreadsheet accepts: 1 to 31 characters, none of : \ / ? * [ ], not starting or
// ending with an apostrophe, not Excel's reserved "History", unique without regard to case
// (ECMA-376 Part 1, 18.2.19 sheet, attribute name; the further rules are Excel's, as its rename
// dialog states them: they are what makes a file open without a repair prompt).
#pragma once
#include <string>
#include <vector>

namespace tallyproof {

// The names to use for sheets wanted under `wanted`, in order: each made valid (a forbidden
// character becomes '_', controls are dropped, an empty name becomes "Sheet N", cut to 31 UTF-16
// units at a character boundary), then a repeated name numbered "Name (2)", "Name (3)" ...
std::vector<std::string> valid_sheet_names(const std::vector<std::string>& wanted);

}  // namespace tallyproof
