// Reads pasted counts. Cells are split on tabs (what spreadsheets put on the clipboard); text
// without tabs is split on runs of spaces, the last cell being the count. A first row whose
// count cell is not a number is a header row. Counts must be non-negative whole numbers.
#include "paste_parser.hpp"

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <set>

namespace tallyproof {
namespace {

std::string_view trim(std::string_view s) {
    const char* ws = " \t\r\n\f\v";
    const auto b = s.find_first_not_of(ws);
    if (b == std::string_view::npos) return {};
    const auto e = s.find_last_not_of(ws);
    return s.substr(b, e - b + 1);
}

std::vector<std::string_view> split_lines(std::string_view text) {
    std::vector<std::string_view> lines;
    std::size_t start = 0;
    for (std::size_t i = 0; i < text.size(); ++i) {
        if (text[i] == '\n' || text[i] == '\r') {
            lines.push_back(text.substr(start, i - start));
            if (text[i] == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
            start = i + 1;
        }
    }
    if (start < text.size()) lines.push_back(text.substr(start));
    return lines;
}

std::vector<std::string_view> split_cells(std::string_view line, bool tabs) {
    std::vector<std::string_view> cells;
    if (tabs) {
        std::size_t start = 0;
        for (std::size_t i = 0; i <= line.size(); ++i) {
            if (i == line.size() || line[i] == '\t') {
                cells.push_back(trim(line.substr(start, i - start)));
                start = i + 1;
            }
        }
        while (!cells.empty() && cells.back().empty()) cells.pop_back();
        return cells;
    }
    // No tabs: the count is the last space-separated word, the label everything before it.
    line = trim(line);
    const auto cut = line.find_last_of(" \t");
    if (cut == std::string_view::npos) return {line};
    return {trim(line.substr(0, cut)), trim(line.substr(cut + 1))};
}

bool parse_number(std::string_view cell, double* value) {
    if (cell.empty() || cell.size() > 64) return false;
    std::string s(cell);
    char* end = nullptr;
    errno = 0;
    const double v = std::strtod(s.c_str(), &end);
    if (end != s.c_str() + s.size() || errno == ERANGE || !std::isfinite(v)) return false;
    *value = v;
    return true;
}

std::string where(int line, int column) {
    return "Line " + std::to_string(line) + ", column " + std::to_string(column) + ": ";
}

std::string quoted(std::string_view cell) {
    std::string q(cell.substr(0, 40));
    if (cell.size() > 40) q += "...";
    return "\"" + q + "\"";
}

}  // namespace

ParsedCounts parse_counts(std::string_view text) {
    ParsedCounts out;
    if (text.size() >= 3 && text.substr(0, 3) == "\xEF\xBB\xBF") text.remove_prefix(3);  // byte-order mark
    const bool tabs = text.find('\t') != std::string_view::npos;
    const auto lines = split_lines(text);
    std::set<std::string> seen;
    bool first_row = true;
    for (std::size_t li = 0; li < lines.size(); ++li) {
        const int line_no = static_cast<int>(li) + 1;
        if (trim(lines[li]).empty()) continue;
        const auto cells = split_cells(lines[li], tabs);
        if (cells.size() > 2) {
            out.status = Status::failure(where(line_no, 3) + "found " + std::to_string(cells.size()) +
                                             " cells; expected a label and a count.", line_no, 3);
            return out;
        }
        const bool has_label = cells.size() == 2;
        const std::string_view count_cell = cells.back();
        const int count_col = has_label ? 2 : 1;
        double v = 0;
        if (!parse_number(count_cell, &v)) {
            if (first_row && has_label) {  // a header row such as "Grade<TAB>Count"
                out.notes.push_back("Line " + std::to_string(line_no) + " read as a header row.");
                first_row = false;
                continue;
            }
            out.status = Status::failure(where(line_no, count_col) + quoted(count_cell) +
                                             " is not a count; expected a non-negative whole number.",
                                         line_no, count_col);
            return out;
        }
        first_row = false;
        if (v < 0) {
            out.status = Status::failure(where(line_no, count_col) + quoted(count_cell) +
                                             " is negative; counts must be non-negative whole numbers.",
                                         line_no, count_col);
            return out;
        }
        if (v != std::floor(v)) {
            out.status = Status::failure(where(line_no, count_col) + quoted(count_cell) +
                                             " is not a whole number; counts must be whole numbers.",
                                         line_no, count_col);
            return out;
        }
        std::string label = has_label ? std::string(cells[0]) : "Category " + std::to_string(out.observed.size() + 1);
        if (label.empty()) label = "Category " + std::to_string(out.observed.size() + 1);
        if (!seen.insert(label).second) {
            out.status = Status::failure(where(line_no, 1) + "the label " + quoted(label) +
                                             " appears twice; each category needs its own label.",
                                         line_no, 1);
            return out;
        }
        out.categories.push_back(std::move(label));
        out.observed.push_back(v);
    }
    if (out.observed.empty()) {
        out.status = Status::failure(text.find_first_not_of(" \t\r\n") == std::string_view::npos
                                         ? "Nothing to read: the pasted text is empty."
                                         : "No counts found: paste lines of label and count.");
        return out;
    }
    return out;
}

}  // namespace tallyproof
