// Reads grouped tables (long, wide, raw with a group column) into a groups x categories matrix.
// Which column holds the groups: the one named by `by`, else the first. Which shape: a group
// named on several lines means a long table (two further columns: category and count) or raw
// values (one further column); every group on one line means a wide table. A first row whose
// count cells are not numbers is a header row, and so is a first row whose group cell is text above
// category cells that are whole numbers in equal increasing steps (digits 0..9, years, sizes) when
// the rows below are not. Common practice for spreadsheet exports. Group names and category labels
// enter through label_text (NFC, invisible characters as codes), as the one-sample reader's labels.
#include "grouped_table.hpp"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <unordered_map>
#include <string_view>
#include <unordered_set>

#include "paste_parser.hpp"  // parse_input
#include "label_text.hpp"
#include "number_format.hpp"
#include "table_shape.hpp"  // TableRow, looks_numeric

namespace tallyproof {
namespace {

constexpr double kMaxCount = 9007199254740992.0;  // 2^53

std::string lower_ascii(std::string s) {
    for (char& c : s)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return s;
}

void add_group_problem(GroupedCounts* out, int line, int column, const std::string& message) {
    if (out->status.ok) out->status = Status::failure(message, line, column);
    if (out->problems.size() < kMaxProblems) out->problems.push_back(CellProblem{line, column, message});
}

// The cell at 0-based `column` of a row, or "" when the row is shorter.
const std::string& cell_at(const TableRow& row, std::size_t column) {
    static const std::string empty;
    return column < row.cells.size() ? row.cells[column] : empty;
}

// A count cell as a count, or a located problem (false).
bool read_count(std::string_view cell, int line, int column, DecimalMark mark, GroupedCounts* out, double* count) {
    // The common cell, ASCII digits only (at most 15: below 2^53), as read_number reads it.
    if (!cell.empty() && cell.size() <= 15) {
        std::uint64_t v = 0;
        std::size_t i = 0;
        for (; i < cell.size() && cell[i] >= '0' && cell[i] <= '9'; ++i) v = v * 10 + static_cast<std::uint64_t>(cell[i] - '0');
        if (i == cell.size()) {
            *count = static_cast<double>(v);
            return true;
        }
    }
    const NumberReading n = read_number(cell, mark);
    const char* fault = nullptr;
    if (cell.empty()) fault = "the count cell is empty; expected a non-negative whole number.";
    else if (!n.ok || n.percent) fault = " is not a count; expected a non-negative whole number.";
    else if (n.negative && n.value != 0) fault = " is negative; counts must be non-negative whole numbers.";
    else if (n.value != std::floor(n.value)) fault = " is not a whole number; counts must be whole numbers.";
    else if (n.value >= kMaxCount) fault = " is too large; expected a count below 2^53.";
    if (fault != nullptr) {
        add_group_problem(out, line, column, cell_location(line, column) + (cell.empty() ? "" : quote_cell(cell)) + fault);
        return false;
    }
    *count = n.value;
    return true;
}

// An empty or missing group cell of a data row with `size` cells: the located problem.
void missing_group_cell(int line, std::size_t size, std::size_t column, GroupedCounts* out) {
    out->group_problem = true;
    const int col = static_cast<int>(column) + 1;
    if (column >= size)  // a short row: the group column is missing, not empty
        add_group_problem(out, line, col, cell_location(line, col) + "the row has only " + std::to_string(size) +
                                              (size == 1 ? " cell" : " cells") + ", so the group column (" +
                                              std::to_string(col) + ") is missing; every row needs the name of its group.");
    else
        add_group_problem(out, line, col, cell_location(line, col) + "the group cell is empty; every row needs the name of its group.");
}

// The group cell of a data row, normalised into `name` (its cell as written in `spelling`), or a
// located problem when it is empty (false).
bool group_cell(const TableRow& row, std::size_t column, GroupedCounts* out, std::string* name, std::string* spelling) {
    *spelling = cell_at(row, column);
    if (!spelling->empty()) {
        *name = normalised_label(*spelling);
        return true;
    }
    missing_group_cell(row.line, row.cells.size(), column, out);
    return false;
}

bool whole_number_labels(const std::vector<std::string>& labels, std::vector<double>* values) {
    values->clear();
    for (const auto& s : labels) {
        const NumberReading n = read_number(s, DecimalMark::point);
        if (!n.ok || n.percent || n.value != std::floor(n.value)) return false;
        values->push_back(n.value);
    }
    return true;
}

// A note naming groups whose rows wrote the name in more than one Unicode form (read as one group).
void note_respelled(const GroupNameIndex& groups, GroupedCounts* out) {
    if (groups.respelled.empty()) return;
    out->notes.push_back(std::string(groups.respelled.size() == 1 ? "The group " : "Groups ") +
                         quoted_labels(out->groups, groups.respelled) + (groups.respelled.size() == 1 ? " is" : " are") +
                         " written in more than one Unicode form (composed and decomposed accents): read as one group each "
                         "(names are compared in NFC).");
}

// The first row as the header of a wide table whose categories are numbered: a text cell in the
// group column above at least three whole numbers increasing in equal steps (digits 0..9, years,
// sizes 36, 38, 40), while at most one in ten of the rows below (up to 200) is such a sequence.
// `step` receives the step. Common practice: digit and year tables are laid out this way.
bool numbered_header_row(const std::vector<TableRow>& rows, std::size_t group_col, double* step) {
    if (rows.size() < 2 || group_col >= rows[0].cells.size() || looks_numeric(rows[0].cells[group_col])) return false;
    auto sequence = [&](const TableRow& row, double* d) {
        std::vector<double> v;
        for (std::size_t c = 0; c < row.cells.size(); ++c) {
            if (c == group_col) continue;
            const NumberReading n = read_number(row.cells[c], DecimalMark::point);
            if (!n.ok || n.percent || n.value != std::floor(n.value)) return false;
            v.push_back(n.value);
        }
        if (v.size() < 3 || !(v[1] > v[0])) return false;
        for (std::size_t i = 2; i < v.size(); ++i)
            if (v[i] - v[i - 1] != v[1] - v[0]) return false;
        *d = v[1] - v[0];
        return true;
    };
    if (!sequence(rows[0], step)) return false;
    std::size_t below = 0, alike = 0;
    for (std::size_t r = 1; r < rows.size() && r <= 200; ++r, ++below) {
        double d = 0;
        alike += rows[r].cells.size() == rows[0].cells.size() && sequence(rows[r], &d);
    }
    return below > 0 && 10 * alike <= below;
}

// Long table: group, category, count on every line (in the columns found by the caller), counted
// into the job's matrix as read. `cells`: the row's `size` cells. False when a limit stops the reading.
bool add_long_count(GroupedRowsJob& j, std::size_t g, std::size_t c, double count, int line);
bool read_long_cells(GroupedRowsJob& j, int line, const std::string_view* cells, std::size_t size) {
    GroupedCounts* out = &j.out;
    auto at = [&](std::size_t c) { return c < size ? cells[c] : std::string_view(); };
    const std::string_view group = at(j.group_col), category = at(j.category_col);
    if (group.empty()) {
        missing_group_cell(line, size, j.group_col, out);
        return true;
    }
    if (category.empty()) {
        const int col = static_cast<int>(j.category_col) + 1;
        add_group_problem(out, line, col, cell_location(line, col) + "the category cell of group " + quote_cell(normalised_label(group)) + " is empty.");
        return true;
    }
    double count = 0;
    if (!read_count(at(j.count_col), line, static_cast<int>(j.count_col) + 1, j.mark, out, &count)) return true;
    const std::size_t widest = std::max({j.group_col, j.category_col, j.count_col});
    if (size > widest + 1) {
        const int col = static_cast<int>(widest) + 2;
        add_group_problem(out, line, col, cell_location(line, col) + "found " + std::to_string(size) +
                                              " cells; expected group, category and count on every line.");
        return true;
    }
    // The group: the last one again when written the same (a table sorted by group), else by its
    // normalised name; a cell written as before names the same group and adds no note.
    std::size_t g = j.last_group;
    if (g == static_cast<std::size_t>(-1) || group != j.last_group_cell) {
        const std::string spelling(group);
        g = j.names.find_or_add(normalised_label(group), spelling, line, out);
        j.last_group = g;
        j.last_group_cell = spelling;
    }
    std::size_t c = static_cast<std::size_t>(-1);
    for (const auto& [written, index] : j.category_cells)
        if (written == category) { c = index; break; }
    if (c == static_cast<std::size_t>(-1)) {
        const std::string label = normalised_label(category);
        const auto [it, fresh] = j.category_index.emplace(label, out->categories.size());
        if (fresh) out->categories.push_back(label);
        c = it->second;
        if (j.category_cells.size() < 32) j.category_cells.emplace_back(std::string(category), c);
    }
    if (out->groups.size() > kMaxGroups || out->categories.size() > kMaxCategories) {
        add_group_problem(out, line, 0, cell_location(line, 0) + "more than " + std::to_string(kMaxGroups) +
                                            " groups or " + std::to_string(kMaxCategories) + " categories; expected fewer.");
        return false;
    }
    return add_long_count(j, g, c, count, line);
}

// Group g's count of category c (first-seen order) added to the matrix; false past kMaxGroupCells.
bool add_long_count(GroupedRowsJob& j, std::size_t g, std::size_t c, double count, int line) {
    GroupedCounts* out = &j.out;
    const std::size_t groups = out->groups.size(), k = out->categories.size();
    if (groups * k > kMaxGroupCells) {
        add_group_problem(out, line, 0, cell_location(line, 0) + std::to_string(groups) + " groups of " + std::to_string(k) +
                                            " categories are more than " + std::to_string(kMaxGroupCells) + " cells; screen fewer at once.");
        return false;
    }
    if (c >= j.stride) {  // a new category: the rows laid out wider (by a quarter at least once they are many)
        const std::size_t rows = j.stride == 0 ? 0 : j.sums.size() / j.stride;
        const std::size_t wider = rows <= 1024 ? c + 1 : std::max(c + 1, j.stride + (j.stride + 3) / 4);
        std::vector<double> sums(rows * wider, 0.0);
        std::vector<unsigned char> seen(rows * wider, 0);
        for (std::size_t r = 0; r < rows; ++r)
            for (std::size_t i = 0; i < j.stride; ++i) {
                sums[r * wider + i] = j.sums[r * j.stride + i];
                seen[r * wider + i] = j.seen[r * j.stride + i];
            }
        j.sums = std::move(sums);
        j.seen = std::move(seen);
        j.stride = wider;
    }
    if (j.sums.size() < groups * j.stride) {
        j.sums.resize(groups * j.stride, 0.0);
        j.seen.resize(groups * j.stride, 0);
    }
    const std::size_t cell = g * j.stride + c;
    j.sums[cell] += count;
    if (j.seen[cell] && j.repeated++ == 0) j.first_repeat = line;
    j.seen[cell] = 1;
    ++j.long_rows;
    return true;
}

// A held row of a long table read.
bool read_long_row(GroupedRowsJob& j, const TableRow& row) {
    j.scratch.assign(row.cells.begin(), row.cells.end());
    return read_long_cells(j, row.line, j.scratch.data(), j.scratch.size());
}

// The long table's rows read: the counts placed, categories in numeric order when whole numbers.
void finish_long_rows(GroupedRowsJob& j) {
    GroupedCounts* out = &j.out;
    if (!out->status.ok) return;
    const std::size_t k = out->categories.size(), groups = out->groups.size();
    if (groups * k > kMaxGroupCells) {
        out->status = Status::failure(std::to_string(groups) + " groups of " + std::to_string(k) +
                                      " categories are more than " + std::to_string(kMaxGroupCells) + " cells; screen fewer at once.");
        return;
    }
    // Whole-number categories (digits, scores) are put in numeric order.
    std::vector<double> values;
    std::vector<std::size_t> order(k);
    for (std::size_t i = 0; i < k; ++i) order[i] = i;
    if (whole_number_labels(out->categories, &values)) {
        std::stable_sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return values[a] < values[b]; });
        out->ordered = true;
    }
    std::vector<std::size_t> position(k);
    for (std::size_t i = 0; i < k; ++i) position[order[i]] = i;
    std::vector<std::string> sorted(k);
    for (std::size_t i = 0; i < k; ++i) sorted[position[i]] = out->categories[i];
    out->categories = std::move(sorted);
    // The rows of stride j.stride made rows of k in category order, in place (row g's new place
    // ends no later than its old one starts the next row: k <= stride).
    j.sums.resize(groups * j.stride, 0.0);
    j.seen.resize(groups * j.stride, 0);
    std::vector<double> sum_row(k);
    std::vector<unsigned char> seen_row(k);
    for (std::size_t g = 0; g < groups; ++g) {
        for (std::size_t i = 0; i < k; ++i) {
            sum_row[position[i]] = j.sums[g * j.stride + i];
            seen_row[position[i]] = j.seen[g * j.stride + i];
        }
        std::copy(sum_row.begin(), sum_row.end(), j.sums.begin() + static_cast<std::ptrdiff_t>(g * k));
        std::copy(seen_row.begin(), seen_row.end(), j.seen.begin() + static_cast<std::ptrdiff_t>(g * k));
    }
    j.sums.resize(groups * k);
    j.seen.resize(groups * k);
    out->counts = std::move(j.sums);
    out->counts.shrink_to_fit();
    std::size_t missing = 0, first_missing = 0;
    for (std::size_t i = 0; i < j.seen.size(); ++i)
        if (j.seen[i] == 0 && missing++ == 0) first_missing = i;
    { std::vector<unsigned char> spent; std::swap(j.seen, spent); }
    out->notes.push_back("Read a long table of " + std::to_string(j.long_rows) + " rows: " + std::to_string(groups) +
                         " groups, " + std::to_string(k) + " categories.");
    if (missing > 0)
        out->notes.push_back(std::to_string(missing) + " combinations of group and category do not appear in the table: read as zero counts "
                             "(the first: group " + quote_cell(out->groups[first_missing / k]) + ", first on line " +
                             std::to_string(out->group_lines[first_missing / k]) + ", has no row for category " +
                             quote_cell(out->categories[first_missing % k]) + ").");
    if (j.repeated > 0)
        out->notes.push_back(std::to_string(j.repeated) + " rows repeat a group and category already seen (first on line " +
                             std::to_string(j.first_repeat) + "): their counts were added together.");
    note_respelled(j.names, out);
}

// Wide table: a header row naming the categories, then one row per group. The categories from
// the header (false: too many).
bool begin_wide_rows(GroupedRowsJob& j, std::size_t width) {
    GroupedCounts* out = &j.out;
    for (std::size_t c = 0; c < width; ++c)
        if (c != j.group_col) j.count_cols.push_back(c);
    for (std::size_t i = 0; i < j.count_cols.size(); ++i) {
        std::string label = j.first == 1 ? normalised_label(cell_at(j.rows[0], j.count_cols[i])) : "";
        if (label.empty()) label = "Category " + std::to_string(i + 1);
        out->categories.push_back(label);
    }
    if (out->categories.size() > kMaxCategories) { out->status = Status::failure("More than " + std::to_string(kMaxCategories) + " category columns."); return false; }
    return true;
}

// One row of a wide table read; false when a limit stops the reading.
bool read_wide_row(GroupedRowsJob& j, const TableRow& row) {
    GroupedCounts* out = &j.out;
    const std::size_t k = out->categories.size();
    std::string name, spelling;
    if (!group_cell(row, j.group_col, out, &name, &spelling)) return true;
    const std::size_t before = out->groups.size();
    const std::size_t g = j.names.find_or_add(name, spelling, row.line, out);
    if (out->groups.size() == before) {
        out->group_problem = true;
        add_group_problem(out, row.line, static_cast<int>(j.group_col) + 1,
                          cell_location(row.line, static_cast<int>(j.group_col) + 1) + "the group " + quote_cell(name) +
                              " appears again (first on line " + std::to_string(out->group_lines[g]) +
                              (spelling != j.names.first_spelling[g] ? ", written there in another Unicode form; group names are compared in NFC" : "") +
                              "); a wide table has one row per group.");
        return true;
    }
    if (out->groups.size() > kMaxGroups || out->groups.size() * k > kMaxGroupCells) {
        add_group_problem(out, row.line, 0, cell_location(row.line, 0) + "too many groups; screen fewer at once.");
        return false;
    }
    out->counts.resize(out->groups.size() * k, 0.0);
    for (std::size_t i = 0; i < k; ++i) {
        const std::string& cell = cell_at(row, j.count_cols[i]);
        double count = 0;
        if (cell.empty()) continue;  // an empty cell is a zero count (noted below)
        if (read_count(cell, row.line, static_cast<int>(j.count_cols[i]) + 1, j.mark, out, &count)) out->counts[g * k + i] = count;
    }
    return true;
}

void finish_wide_rows(GroupedRowsJob& j) {
    GroupedCounts* out = &j.out;
    if (!out->status.ok) return;
    std::vector<double> values;
    out->ordered = whole_number_labels(out->categories, &values);
    out->notes.push_back("Read a wide table: " + std::to_string(out->groups.size()) + " groups (one per row), " +
                         std::to_string(out->categories.size()) + " categories (one per column" +
                         (j.first == 1 ? ", named by the header row" : "") + ").");
}

// A message about the values read one per line, with "line N" (and its "column 1") turned into
// the line and column of the pasted table each value came from.
std::string original_lines(const std::string& message, const std::vector<int>& lines, int value_column) {
    std::string out;
    std::size_t i = 0;
    while (i < message.size()) {
        const bool at_line = (message.compare(i, 5, "line ") == 0 || message.compare(i, 5, "Line ") == 0) &&
                             i + 5 < message.size() && message[i + 5] >= '0' && message[i + 5] <= '9';
        if (!at_line) { out += message[i++]; continue; }
        std::size_t j = i + 5;
        std::size_t n = 0;
        while (j < message.size() && message[j] >= '0' && message[j] <= '9' && n < 100000000) n = n * 10 + static_cast<std::size_t>(message[j++] - '0');
        out += message.substr(i, 5);
        out += n >= 1 && n <= lines.size() ? std::to_string(lines[n - 1]) : message.substr(i + 5, j - i - 5);
        i = j;
        if (message.compare(i, 10, ", column 1") == 0 && (i + 10 == message.size() || message[i + 10] < '0' || message[i + 10] > '9')) {
            out += ", column " + std::to_string(value_column);
            i += 10;
        }
    }
    return out;
}

// Raw values with a group column: each group's values tallied as the one-sample reader tallies
// raw observations; the categories (and bin edges) are those of all values pooled, so that
// every group is counted into the same categories.
void read_raw_rows(const std::vector<TableRow>& rows, std::size_t first, std::size_t group_col, std::size_t value_col,
                   const ParseOptions& parse, GroupedCounts* out) {
    GroupNameIndex groups;
    std::vector<std::string> texts;  // the values of each group, one per line
    std::vector<std::vector<int>> lines;  // original line of each value, per group
    std::string pooled;
    std::vector<int> pooled_lines;
    for (std::size_t r = first; r < rows.size(); ++r) {
        const TableRow& row = rows[r];
        std::string name, spelling;
        if (!group_cell(row, group_col, out, &name, &spelling)) continue;
        const std::size_t g = groups.find_or_add(name, spelling, row.line, out);
        if (out->groups.size() > kMaxGroups) { add_group_problem(out, row.line, 0, cell_location(row.line, 0) + "too many groups."); return; }
        if (texts.size() < out->groups.size()) { texts.emplace_back(); lines.emplace_back(); }
        std::string value = cell_at(row, value_col);
        for (char& c : value)
            if (c == '\n' || c == '\r') c = ' ';
        texts[g] += value + "\n";
        lines[g].push_back(row.line);
        pooled += value + "\n";
        pooled_lines.push_back(row.line);
    }
    if (!out->status.ok) return;
    ParseOptions options = parse;
    options.raw = parse.digits || parse.bins.kind != BinChoice::Kind::none ? parse.raw : true;
    options.separator = Separator::tab;  // one value per line
    const int value_column = static_cast<int>(value_col) + 1;
    auto located = [&](const Status& s, const std::vector<int>& at) {
        Status t = s;
        t.message = original_lines(s.message, at, value_column);
        if (s.line >= 1 && static_cast<std::size_t>(s.line) <= at.size()) {
            t.line = at[s.line - 1];
            t.column = value_column;
        }
        return t;
    };
    const ParsedInput all = parse_input(pooled, options);
    if (!all.status.ok) { out->status = located(all.status, pooled_lines); return; }
    out->categories = all.categories;
    out->ordered = all.ordered;
    out->digit_test = all.digit_test;
    out->edges = all.edges;
    const std::size_t k = out->categories.size();
    if (out->groups.size() * k > kMaxGroupCells) { out->status = Status::failure("Too many groups x categories; screen fewer at once."); return; }
    std::unordered_map<std::string, std::size_t> category;
    for (std::size_t i = 0; i < k; ++i) category.emplace(out->categories[i], i);
    ParseOptions each = options;
    each.shape = all.shape;
    if (!all.edges.empty()) { each.bins.kind = BinChoice::Kind::edges; each.bins.edges = all.edges; }
    out->counts.assign(out->groups.size() * k, 0.0);
    for (std::size_t g = 0; g < out->groups.size(); ++g) {
        const ParsedInput one = parse_input(texts[g], each);
        if (!one.status.ok && one.categories.empty()) {
            // A group whose values all fall outside the tally (no digit, ...) has zero counts.
            if (all.shape == InputShape::raw_digits || all.shape == InputShape::raw_bins) continue;
            Status s = located(one.status, lines[g]);
            s.message = "Group " + quote_cell(out->groups[g]) + ": " + s.message;
            out->status = s;
            return;
        }
        for (std::size_t i = 0; i < one.categories.size(); ++i) {
            const auto it = category.find(one.categories[i]);
            if (it != category.end()) out->counts[g * k + it->second] += one.observed[i];
        }
    }
    for (const auto& note : all.notes) out->notes.push_back("All values pooled: " + original_lines(note, pooled_lines, value_column));
    note_respelled(groups, out);
    out->notes.insert(out->notes.begin(), "Read raw values with a group column: " + std::to_string(pooled_lines.size()) +
                                              " values in " + std::to_string(out->groups.size()) + " groups, tallied into " +
                                              std::to_string(k) + " categories shared by every group.");
}

// The shape: groups repeated over lines are a long table or raw values, else a wide table.
GroupShape detect_group_shape(const std::vector<TableRow>& rows, std::size_t first, std::size_t group_col,
                              std::size_t width, const ParseOptions& parse) {
    if (parse.digits || parse.bins.kind != BinChoice::Kind::none || parse.raw) return GroupShape::raw_values;
    std::unordered_set<std::string_view> seen;  // views of the rows' cells: no copies
    seen.reserve(rows.size());
    bool repeats = false;
    for (std::size_t r = first; r < rows.size() && !repeats; ++r) repeats = !seen.insert(cell_at(rows[r], group_col)).second;
    // A wide table holds only counts beside the group names; text there makes it long.
    bool counts_only = true;
    for (std::size_t r = first; r < rows.size() && r < first + 200 && counts_only; ++r)
        for (std::size_t c = 0; c < rows[r].cells.size(); ++c)
            if (c != group_col && !rows[r].cells[c].empty() && !looks_numeric(rows[r].cells[c])) counts_only = false;
    if (!repeats && width >= 3 && counts_only) return GroupShape::wide_table;
    if (width == 2) return GroupShape::raw_values;
    return GroupShape::long_table;
}

}  // namespace

std::size_t GroupNameIndex::find_or_add(const std::string& name, const std::string& spelling, int line, GroupedCounts* out) {
    const auto [it, fresh] = index.emplace(name, out->groups.size());
    if (fresh) {
        out->groups.push_back(name);
        out->group_lines.push_back(line);
        first_spelling.push_back(spelling);
        noted.push_back(0);
    } else if (!noted[it->second] && spelling != first_spelling[it->second]) {
        noted[it->second] = 1;
        respelled.push_back(it->second);
    }
    return it->second;
}

std::string group_look_alike_note(const std::vector<std::string>& groups, const std::vector<std::vector<std::size_t>>& alike) {
    if (alike.empty()) return "";
    std::string s;
    for (std::size_t g = 0; g < alike.size() && g < 3; ++g) s += (g ? "; " : "") + quoted_labels(groups, alike[g]);
    if (alike.size() > 3) s += "; and " + std::to_string(alike.size() - 3) + " more";
    return "Group names that look the same (they differ only by invisible characters, case or surrounding spaces): " + s +
           ". They are screened as separate groups; if they are one group, join their rows under one name.";
}

const char* group_shape_name(GroupShape shape) {
    switch (shape) {
        case GroupShape::long_table: return "long";
        case GroupShape::wide_table: return "wide";
        case GroupShape::raw_values: return "raw";
    }
    return "long";
}

bool group_shape_from_name(const std::string& name, GroupShape* shape) {
    if (name == "long") *shape = GroupShape::long_table;
    else if (name == "wide") *shape = GroupShape::wide_table;
    else if (name == "raw") *shape = GroupShape::raw_values;
    else return false;
    return true;
}

void start_grouped_text(std::string_view text, const GroupReadOptions& options, GroupedRowsJob* job) {
    { GroupedRowsJob fresh; std::swap(*job, fresh); }
    job->options = options;
    if (text.size() > kMaxInputBytes) {
        job->out.status = Status::failure("The pasted text has more than " + std::to_string(kMaxInputBytes >> 20) + " MB.");
        job->done = true;
        return;
    }
    text = skip_byte_order_mark(text);
    job->text = text;
    job->sep = options.parse.separator ? *options.parse.separator : detect_separator(text);
    job->reader = DelimitedReader(text, job->sep);
    job->splitting = true;
}

void start_grouped_rows(std::vector<TableRow> rows, Separator sep, const GroupReadOptions& options, GroupedRowsJob* job) {
    { GroupedRowsJob fresh; std::swap(*job, fresh); }
    job->options = options;
    job->sep = sep;
    job->rows = std::move(rows);
}

GroupedCounts read_grouped_text(std::string_view text, const GroupReadOptions& options) {
    GroupedRowsJob job;
    start_grouped_text(text, options, &job);
    while (!step_grouped_rows(&job, 0)) {}
    return std::move(job.out);
}

// The group column named by `by`: a 1-based number, or a header cell of the first row (any
// case); empty `by` leaves the first column. Refused by name when there is no such column.
Status find_group_column(const std::vector<TableRow>& rows, std::size_t width, const std::string& by, std::size_t* group_col,
                         bool* header_named) {
    if (by.empty()) return Status::success();
    const NumberReading n = read_number(by, DecimalMark::point);
    if (n.ok && n.value == std::floor(n.value) && n.value >= 1 && !n.percent) {
        if (n.value > static_cast<double>(width))
            return Status::failure("The group column " + by + " does not exist: the table has " + std::to_string(width) + " columns.");
        *group_col = static_cast<std::size_t>(n.value) - 1;
    } else {
        const auto& head = rows[0].cells;
        std::size_t i = 0;
        while (i < head.size() && lower_ascii(head[i]) != lower_ascii(by)) ++i;
        if (i == head.size()) {
            std::string names;
            for (const auto& h : head) names += (names.empty() ? "" : ", ") + quote_cell(h);
            return Status::failure("No column is named " + quote_cell(by) + "; the first line has " + names +
                                   " (or give the column's number).", rows[0].line, 0);
        }
        *group_col = i;
        *header_named = true;
    }
    return Status::success();
}

namespace {

// The table's layout from its rows (all split): group column, header row, shape, the columns
// read. False when that already refuses the table (job->out says why).
bool plan_grouped_rows(GroupedRowsJob& j) {
    GroupedCounts& out = j.out;
    const std::vector<TableRow>& rows = j.rows;
    const GroupReadOptions& options = j.options;
    const ParseOptions& parse = options.parse;
    if (rows.empty()) { out.status = Status::failure("Nothing to read: the pasted text is empty."); return false; }
    std::size_t width = 0;
    for (const auto& r : rows) width = std::max(width, r.cells.size());
    if (width < 2) {
        out.status = Status::failure("Line " + std::to_string(rows[0].line) +
                                     ": only one column; screening needs a group column beside the categories or values.", rows[0].line, 0);
        return false;
    }

    // The group column: named by `by` (a header cell or a number), else the first.
    std::size_t group_col = 0;
    bool header_named = false;
    out.status = find_group_column(rows, width, options.by, &group_col, &header_named);
    if (!out.status.ok) return false;
    // A header row: named by `by`, or a first row without numbers above rows with some, or the
    // numbered categories of a wide table (0..9, years) above a text cell; or as the options say.
    auto numeric_outside_group = [&](const TableRow& row) {
        std::size_t n = 0;
        for (std::size_t c = 0; c < row.cells.size(); ++c) n += c != group_col && looks_numeric(row.cells[c]);
        return n;
    };
    // Decided once per first row (the numbered header's check and the reading ask for the same).
    std::optional<GroupShape> detected[2];
    auto detect_shape = [&](std::size_t first) {
        if (options.shape) return *options.shape;
        if (!detected[first]) detected[first] = detect_group_shape(rows, first, group_col, width, parse);
        return *detected[first];
    };
    bool header = header_named || (rows.size() >= 2 && numeric_outside_group(rows[0]) == 0 && numeric_outside_group(rows[1]) > 0);
    double step = 0;
    bool numbered = false;
    if (!header && !options.header && numbered_header_row(rows, group_col, &step)) {
        j.numbered_candidate = true;  // the header then depends on the shape below line 1 (all rows)
        if (detect_shape(1) == GroupShape::wide_table) header = numbered = true;
    }
    if (options.header) header = *options.header;
    const std::size_t first = header ? 1 : 0;
    if (rows.size() <= first) { out.status = Status::failure("Only a header row: no groups to read."); return false; }
    out.header = header;
    out.numbered_header = numbered;
    j.first_line = rows[0].line;
    out.group_column = static_cast<int>(group_col) + 1;
    out.group_column_name = header ? normalised_label(cell_at(rows[0], group_col)) : "";
    if (out.group_column_name.empty()) out.group_column_name = "column " + std::to_string(out.group_column);
    const GroupShape shape = detect_shape(first);
    out.shape = shape;
    j.mark = parse.decimal ? *parse.decimal : j.sep == Separator::semicolon ? DecimalMark::comma : DecimalMark::point;
    j.group_col = group_col;
    j.first = first;
    j.next = first;
    j.numbered = numbered;
    j.step = step;
    std::vector<std::size_t> others;
    for (std::size_t c = 0; c < width; ++c)
        if (c != group_col) others.push_back(c);
    switch (shape) {
        case GroupShape::long_table: {
            if (others.size() < 2) { out.status = Status::failure("A long table needs three columns: group, category and count."); return false; }
            // The count column: the last of the two further columns unless only the other holds numbers.
            std::size_t category_col = others[0], count_col = others[1];
            std::size_t numeric0 = 0, numeric1 = 0;
            for (std::size_t r = first; r < rows.size() && r < first + 200; ++r) {
                numeric0 += looks_numeric(cell_at(rows[r], others[0]));
                numeric1 += looks_numeric(cell_at(rows[r], others[1]));
            }
            if (numeric1 == 0 && numeric0 > 0) std::swap(category_col, count_col);
            j.category_col = category_col;
            j.count_col = count_col;
            return true;
        }
        case GroupShape::wide_table: return begin_wide_rows(j, width);
        case GroupShape::raw_values:
            if (others.size() != 1) {
                out.status = Status::failure("Raw values with a group column need two columns: group and value (found " +
                                             std::to_string(width) + ").");
                return false;
            }
            j.value_col = others[0];
            j.next = rows.size();  // read whole at the end (read_raw_rows)
            return true;
    }
    return true;
}

// The rows read: the shape's last step, then the notes and checks every shape shares.
void finish_grouped_rows(GroupedRowsJob& j) {
    GroupedCounts& out = j.out;
    const std::vector<TableRow>& rows = j.rows;
    const GroupShape shape = out.shape;
    switch (shape) {
        case GroupShape::long_table: finish_long_rows(j); break;
        case GroupShape::wide_table: finish_wide_rows(j); break;
        case GroupShape::raw_values: read_raw_rows(rows, j.first, j.group_col, j.value_col, j.options.parse, &out); break;
    }
    // Raw values with a group column are only offered as groups, so their refusals stay one sample's.
    if (shape == GroupShape::raw_values) out.group_problem = false;
    if (!out.status.ok) return;
    if (j.numbered)
        out.notes.insert(out.notes.begin(), "Line " + std::to_string(j.first_line) + " read as a header row: its cells " +
                                                quote_cell(out.categories[0]) + ", " + quote_cell(out.categories[1]) + " ... " +
                                                quote_cell(out.categories.back()) + " are numbers in steps of " + format_plain(j.step) + " beside the text " +
                                                quote_cell(out.group_column_name) + ", so they name the categories (detected; the line can be read as a group instead).");
    else if (out.header) out.notes.insert(out.notes.begin(), "Line " + std::to_string(j.first_line) + " read as a header row.");
    out.notes.insert(out.notes.begin(), std::string("Groups read from ") + (out.header ? "column " + std::to_string(out.group_column) + " (" + quote_cell(out.group_column_name) + ")"
                                                                                      : out.group_column_name) +
                                            " as a " + group_shape_name(shape) + " table" +
                                            (j.options.by.empty() ? " (detected; another group column can be chosen)." : "."));
    out.look_alike_groups = look_alike_groups(out.groups);
    if (!out.look_alike_groups.empty()) out.notes.push_back(group_look_alike_note(out.groups, out.look_alike_groups));
    if (std::any_of(out.groups.begin(), out.groups.end(), [](const std::string& g) { return g.find("<U+") != std::string::npos; }))
        out.notes.push_back("Group names hold characters that draw nothing (direction marks, zero-width spaces); "
                            "they are shown as <U+XXXX> codes, as category labels are.");
    if (out.groups.size() < 2) {
        out.group_problem = shape != GroupShape::raw_values;
        out.status = Status::failure("Only one group (" + quote_cell(out.groups.empty() ? "" : out.groups[0]) +
                                         "): screening compares two or more groups; read its counts as one sample instead.",
                                     out.group_lines.empty() ? 0 : out.group_lines[0], out.group_column);
        return;
    }
    if (out.categories.size() < 2) {
        out.status = Status::failure("Only one category: a goodness-of-fit test needs at least two.");
        return;
    }
}

// After the first kPlanRows rows of a text: when they decide a layout the rest cannot change, the
// rows read and dropped, and the rest of the text counted as it is split. A long table found from
// these rows stays one whatever follows: a group repeated among them repeats in the whole, the
// text beside the groups is judged on the first 200 rows, the header on the first two (unless a
// numbered header row is in question, which depends on every row's shape); wider rows later
// change neither the group column nor the two columns after it (and are refused as too wide).
void try_streaming(GroupedRowsJob& j) {
    j.stream_tried = true;
    const GroupedCounts before = j.out;
    const bool planned = plan_grouped_rows(j);
    if (planned && j.out.shape == GroupShape::long_table && !j.numbered_candidate) {
        j.planned = j.streaming = true;
        for (; j.next < j.rows.size() && !j.stopped; ++j.next) j.stopped = !read_long_row(j, j.rows[j.next]);
        j.rows.clear();
        j.rows.shrink_to_fit();
        return;
    }
    // Planned again on every row once split.
    j.out = before;
    j.count_cols.clear();
    j.numbered_candidate = false;
}

}  // namespace

bool step_grouped_rows(GroupedRowsJob* job, std::size_t budget) {
    GroupedRowsJob& j = *job;
    if (j.done) return true;
    const std::size_t limit = budget == 0 ? static_cast<std::size_t>(-1) : budget;
    if (j.splitting) {
        Record rec;
        for (std::size_t n = 0; n < limit; ++n) {
            if (!j.reader.next(&rec)) {
                j.splitting = false;
                if (!j.reader.status().ok) {
                    add_group_problem(&j.out, j.reader.status().line, j.reader.status().column, j.reader.status().message);
                    j.done = true;
                    return true;
                }
                return false;  // the layout is decided at the next step
            }
            if (rec.blank()) continue;
            if (j.streaming) {  // a long table counted as it is split
                j.stopped = !read_long_cells(j, rec.line, rec.cells.data(), rec.cells.size());
                if (j.stopped) { j.splitting = false; return false; }  // refused: the rest is not read
                continue;
            }
            if (j.rows.size() == kMaxGroupRows) {
                j.out.status = Status::failure(cell_location(rec.line, 0) + "more than " + std::to_string(kMaxGroupRows) +
                                                   " rows; screen at most that many rows at once.", rec.line, 0);
                j.done = true;
                return true;
            }
            TableRow row;
            row.line = rec.line;
            row.cells.reserve(rec.cells.size());
            for (auto c : rec.cells) row.cells.emplace_back(c);
            j.rows.push_back(std::move(row));
            if (j.rows.size() == kPlanRows && !j.stream_tried) try_streaming(j);
        }
        return false;
    }
    if (j.streaming && !j.rows_read) {  // the text split and counted
        j.rows_read = true;
        if (budget != 0) return false;
    }
    if (!j.planned) {
        j.planned = true;
        if (!plan_grouped_rows(j)) { j.done = true; return true; }
        return false;
    }
    if (j.releasing) {  // the rows' memory handed back a budget at a time (a million cells take a while)
        for (std::size_t n = 0; n < limit && !j.rows.empty(); ++n) j.rows.pop_back();
        if (!j.rows.empty()) return false;
        j.rows.shrink_to_fit();
        j.done = true;
        return true;
    }
    if (!j.rows_read) {
        const bool long_table = j.out.shape == GroupShape::long_table;
        for (std::size_t n = 0; n < limit && j.next < j.rows.size() && !j.stopped; ++n, ++j.next)
            j.stopped = !(long_table ? read_long_row(j, j.rows[j.next]) : read_wide_row(j, j.rows[j.next]));
        if (j.next < j.rows.size() && !j.stopped) return false;
        j.rows_read = true;
        if (budget != 0) return false;  // the notes and checks at the next step
    }
    finish_grouped_rows(j);
    if (budget != 0 && !j.rows.empty()) {
        j.releasing = true;
        return false;
    }
    j.done = true;
    return true;
}

double grouped_rows_fraction(const GroupedRowsJob& j) {
    if (j.done) return 1.0;
    // Splitting counts for the first half, reading the rows for the second.
    if (j.splitting) {  // a long table counted as it is split is read by then
        const double split = j.text.empty() ? 0.0 : static_cast<double>(j.reader.offset()) / static_cast<double>(j.text.size());
        return std::min(0.99, (j.streaming ? 1.0 : 0.5) * split);
    }
    if (j.streaming) return 0.99;
    const double split = j.text.empty() ? 0.0 : 0.5;
    const double read = j.rows.empty() ? 0.0 : static_cast<double>(j.next) / static_cast<double>(j.rows.size());
    return std::min(0.99, split + (1.0 - split) * read);
}

GroupedCounts read_grouped_rows(std::vector<TableRow> rows, Separator sep, const GroupReadOptions& options) {
    GroupedRowsJob job;
    start_grouped_rows(std::move(rows), sep, options, &job);
    while (!step_grouped_rows(&job, 0)) {}
    return std::move(job.out);
}

}  // namespace tallyproof
