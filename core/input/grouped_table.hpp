// Grouped tables: pasted text holding the counts of many groups (samples) at once, read into a
// groups x categories matrix for screening (screen_groups.hpp). Three shapes: a long table (group,
// category, count per line), a wide table (a header row naming the categories, one row per
// group) and raw observations with a group column (group, value per line; the values tallied
// per group as the one-sample reader tallies them: text, whole numbers, a digit or bins).
// The group column and the shape are detected and stated in notes; both can be overridden.
// Rules are common practice for spreadsheet exports, each stated in the note it produces.
#pragma once
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "parsed_input.hpp"

namespace tallyproof {

enum class GroupShape {
    long_table,  // group, category, count on every line
    wide_table,  // one row per group, one column per category (header row naming them)
    raw_values,  // group, value on every line; values tallied per group
};
const char* group_shape_name(GroupShape shape);                          // "long", "wide", "raw"
bool group_shape_from_name(const std::string& name, GroupShape* shape);  // false if unknown

struct GroupReadOptions {
    std::string by;                  // the group column: a header name or a 1-based number; empty: detect
    std::optional<GroupShape> shape; // override the detected shape
    std::optional<bool> header;      // the first line is (true) or is not (false) a header row; unset: detect
    ParseOptions parse;              // raw values: digits, bins, case folding...; decimal mark, separator
};

constexpr std::size_t kMaxGroups = 200000;              // more groups are refused
constexpr std::size_t kMaxGroupCells = 20000000;        // groups x categories held at most
constexpr std::size_t kMaxGroupRows = 2000000;          // lines of a grouped paste read at most (rows are held whole)

struct GroupedCounts {
    Status status;                        // !ok: the first problem, naming line and group
    GroupShape shape = GroupShape::long_table;
    int group_column = 1;                 // 1-based
    std::string group_column_name;        // its header cell, or "column N"
    std::vector<std::string> categories;  // shared by every group
    std::vector<std::string> groups;      // in first-seen order
    std::vector<int> group_lines;         // the line where each group first appears
    std::vector<double> counts;           // groups x categories, row-major
    bool ordered = false;                 // whole-number or digit categories, bins
    std::optional<DigitTest> digit_test;  // raw values tallied by a digit
    std::vector<double> edges;            // raw values counted into bins
    bool header = false;                  // the first line was read as a header row
    bool numbered_header = false;         // ...detected by its numbered categories (0..9, years, sizes)
    std::vector<std::vector<std::size_t>> look_alike_groups;  // groups whose names look the same (label_text.hpp)
    bool group_problem = false;           // refused for what the groups are (one group, a group cell empty
                                          // or missing): the text is a table of groups, and this is its message
    std::vector<std::string> notes;       // what was detected, plain sentences
    std::vector<CellProblem> problems;    // offending cells (at most kMaxProblems)

    double count(std::size_t group, std::size_t category) const { return counts[group * categories.size() + category]; }
};

// One sentence naming up to three sets of groups whose names look the same (empty when none).
std::string group_look_alike_note(const std::vector<std::string>& groups, const std::vector<std::vector<std::size_t>>& alike);

// Reads a grouped paste; never throws, refuses with a message naming the line (and the group).
// Group names, like category labels, enter through label_text.hpp: NFC (one group however it is
// written), characters that draw nothing shown as <U+XXXX>; names that look alike are noted.
GroupedCounts read_grouped_text(std::string_view text, const GroupReadOptions& options = {});
// The same, from the text's non-blank rows already split with separator `sep` (parse_input's
// `rows`): the text is not split again.
GroupedCounts read_grouped_rows(std::vector<TableRow> rows, Separator sep, const GroupReadOptions& options = {});

}  // namespace tallyproof
