// Reads tables of counts. A header row is a first row whose count cell is not a number; a
// totals row is a last row labelled Total (or Sum, ...) equal to the sum above it; expected
// values are shares when they add to 1, percentages when written with % or adding to 100,
// counts when they add to the observed total, ratio terms otherwise; a third column headed as
// an earlier sample (previous_sample_header.hpp), or chosen so, is a previous sample's whole
// counts instead. Common practice.
#include "table_shape.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <unordered_map>

#include "previous_sample_header.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::string plain(double x) { return format_general(x, 15); }

std::string lower_ascii(std::string s) {
    for (char& c : s)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return s;
}

bool is_totals_label(const std::string& label) {
    std::string s = lower_ascii(label);
    while (!s.empty() && (s.back() == ':' || s.back() == ' ')) s.pop_back();
    static const char* const names[] = {"total", "totals", "sum", "grand total", "all", "overall", "gesamt",
                                        "summe", "insgesamt", "totaal", "totale", "suma", "somme", "n"};
    for (const char* n : names)
        if (s == n) return true;
    return false;
}

struct Entry {
    int line = 0;
    std::string label;         // empty: numbered
    int label_column = 0;      // 0 when there is no label cell
    std::string count;
    int count_column = 0;
    std::string expected;      // empty when absent
    int expected_column = 0;
};

constexpr double kMaxCount = 9007199254740992.0;  // 2^53: larger counts are not exact in a double

// Whether the third column is read as a previous sample's counts, and why.
struct ThirdColumnReading {
    bool previous = false;
    bool chosen = false;  // by ParseOptions::third_column, not by its header
    std::string head;     // the third column's header, empty when there is none
    std::string described() const {  // "the third column, headed "Last month"," for sentences
        return head.empty() ? std::string("the third column") : "the third column, headed " + quote_cell(head) + ",";
    }
};

}  // namespace

bool looks_numeric(const std::string& cell) {
    return decimal_mark_evidence(cell) != MarkEvidence::not_a_number || is_unusable_number(cell);
}

void regroup_space_words(std::vector<TableRow>* rows) {
    bool two = !rows->empty(), fractions = false;
    std::size_t data_rows = 0;
    for (std::size_t r = 0; r < rows->size(); ++r) {
        const auto& c = (*rows)[r].cells;
        if (c.empty() || !looks_numeric(c.back())) { if (r == 0) continue; two = false; break; }
        ++data_rows;
        if (c.size() < 3 || !looks_numeric(c[c.size() - 2])) { two = false; break; }
        const NumberReading last = read_number(c.back(), DecimalMark::point);
        if (!last.ok || last.percent || last.value != std::floor(last.value)) fractions = true;
    }
    const std::size_t values = two && fractions && data_rows > 0 ? 2 : 1;
    for (auto& row : *rows) {
        auto& c = row.cells;
        if (c.size() < 2) continue;
        const std::size_t v = looks_numeric(c.back()) ? std::min(values, c.size() - 1) : 0;
        std::string label;
        for (std::size_t i = 0; i + v < c.size(); ++i) label += (i ? " " : "") + c[i];
        std::vector<std::string> regrouped{label};
        for (std::size_t i = c.size() - v; i < c.size(); ++i) regrouped.push_back(c[i]);
        c = std::move(regrouped);
    }
}

namespace {
bool first_row_is_header(const std::vector<TableRow>& rows) {
    if (rows.size() < 2) return false;
    for (const auto& cell : rows[0].cells)
        if (looks_numeric(cell)) return false;
    std::size_t numeric = 0, cells = 0;
    for (std::size_t r = 1; r < rows.size(); ++r)
        for (const auto& cell : rows[r].cells) { ++cells; if (looks_numeric(cell)) ++numeric; }
    return numeric * 2 > cells;
}
}  // namespace

bool raw_header_row(const std::vector<TableRow>& sample) {
    return first_row_is_header(sample) ||
           (sample.size() >= 2 && !looks_numeric(sample[0].cells[0]) && looks_numeric(sample[1].cells[0]));
}

InputShape detect_shape(const std::vector<TableRow>& rows, bool more_rows, const ParseOptions& options,
                        std::string* why) {
    if (options.digits) return InputShape::raw_digits;
    if (options.bins.kind != BinChoice::Kind::none) return InputShape::raw_bins;
    std::size_t maxc = 0;
    for (const auto& r : rows) maxc = std::max(maxc, r.cells.size());
    const bool header = first_row_is_header(rows);
    auto all_whole_numbers = [&] {
        for (std::size_t r = header ? 1 : 0; r < rows.size(); ++r)
            for (const auto& c : rows[r].cells) {
                const NumberReading n = read_number(c, DecimalMark::point);
                if (!n.ok || n.value != std::floor(n.value) || n.percent) return false;
            }
        return true;
    };
    if (options.raw) return all_whole_numbers() ? InputShape::raw_whole_numbers : InputShape::raw_text;
    if (rows.empty()) return InputShape::label_count;
    if (rows.size() == 1) {
        const auto& c = rows[0].cells;
        if (c.size() == 1) return InputShape::counts_column;
        if (c.size() == 2 && !looks_numeric(c[0]) && looks_numeric(c[1])) return InputShape::label_count;
        std::size_t numeric = 0;
        for (const auto& cell : c) numeric += looks_numeric(cell);
        return numeric == 0 ? InputShape::raw_text : InputShape::counts_row;
    }
    if (rows.size() == 2 && rows[0].cells.size() == rows[1].cells.size() && maxc >= 2) {
        bool top_text = true, bottom_numbers = true, bottom_rest_numbers = true;
        for (const auto& cell : rows[0].cells) top_text = top_text && !looks_numeric(cell);
        for (std::size_t i = 0; i < rows[1].cells.size(); ++i) {
            const bool n = looks_numeric(rows[1].cells[i]);
            bottom_numbers = bottom_numbers && n;
            if (i > 0) bottom_rest_numbers = bottom_rest_numbers && n;
        }
        if (top_text && (bottom_numbers || (maxc >= 3 && bottom_rest_numbers))) return InputShape::counts_row;
    }
    if (maxc == 1) {
        std::size_t numeric = 0, data = 0;
        double lo = HUGE_VAL, hi = -HUGE_VAL;
        for (std::size_t r = header || !looks_numeric(rows[0].cells[0]) ? 1 : 0; r < rows.size(); ++r) {
            ++data;
            const NumberReading n = read_number(rows[r].cells[0], DecimalMark::point);
            if (looks_numeric(rows[r].cells[0])) ++numeric;
            if (n.ok) { lo = std::min(lo, n.value); hi = std::max(hi, n.value); }
        }
        if (numeric * 2 <= data) return InputShape::raw_text;
        if (numeric == data && all_whole_numbers() && lo <= hi) {
            const double range = hi - lo + 1;
            if (more_rows || (data >= 20 && static_cast<double>(data) > 2 * range)) {
                if (why)
                    *why = std::to_string(data) + (more_rows ? "+" : "") + " whole numbers between " + plain(lo) + " and " +
                           plain(hi) + " repeat too often to be counts of categories: read as raw observations.";
                return InputShape::raw_whole_numbers;
            }
        }
        return InputShape::counts_column;
    }
    std::size_t numeric_values = 0;
    for (std::size_t r = 0; r < rows.size(); ++r)
        for (std::size_t i = 1; i < rows[r].cells.size(); ++i) numeric_values += looks_numeric(rows[r].cells[i]);
    if (numeric_values == 0) return InputShape::raw_text;
    return maxc == 2 ? InputShape::label_count : InputShape::label_observed_expected;
}

namespace {

// The cells of a table that hold its numbers, found by one shape's reader.
using TableCells = std::vector<Entry>;

// One row of counts across cells, optionally under a row of labels (and after a row heading).
TableCells read_counts_row(const std::vector<TableRow>& rows, ParsedInput* out) {
    TableCells entries;
    std::size_t value_row = 0;
    std::vector<std::string> labels;
    if (rows.size() >= 2) {
        value_row = 1;
        labels = rows[0].cells;
        out->column_names = rows[0].cells;
        out->notes.push_back("Line " + std::to_string(rows[0].line) + " read as the category labels.");
    }
    if (rows.size() > 2)
        add_problem(out, rows[2].line, 1,
                    cell_location(rows[2].line, 1) + "a third row; expected one row of counts, optionally under a row of labels.");
    const auto& c = rows[value_row].cells;
    std::size_t start = 0;
    if (!looks_numeric(c[0]) && c.size() >= 2) {  // a row heading such as "Count"
        start = 1;
        out->column_names.insert(out->column_names.begin(), c[0]);
        if (!labels.empty()) labels.erase(labels.begin());
    }
    for (std::size_t i = start; i < c.size(); ++i) {
        Entry e;
        e.line = rows[value_row].line;
        e.count = c[i];
        e.count_column = static_cast<int>(i) + 1;
        if (i - start < labels.size()) { e.label = labels[i - start]; e.label_column = e.count_column; }
        entries.push_back(e);
    }
    out->notes.push_back("Read one row of " + std::to_string(entries.size()) + " counts across cells, one category per cell.");
    return entries;
}

// One count per line, optionally under a header cell; the categories are numbered.
TableCells read_counts_column(const std::vector<TableRow>& rows, ParsedInput* out) {
    TableCells entries;
    std::size_t first = 0;
    if (!rows.empty() && !looks_numeric(rows[0].cells[0]) && rows.size() >= 2) {
        out->column_names = {rows[0].cells[0]};
        out->notes.push_back("Line " + std::to_string(rows[0].line) + " read as a header row.");
        first = 1;
    }
    for (std::size_t r = first; r < rows.size(); ++r) {
        Entry e;
        e.line = rows[r].line;
        e.count = rows[r].cells[0];
        e.count_column = 1;
        if (rows[r].cells.size() > 1)
            add_problem(out, rows[r].line, 2,
                        cell_location(rows[r].line, 2) + "found " + std::to_string(rows[r].cells.size()) +
                            " cells; expected one count per line.");
        entries.push_back(e);
    }
    return entries;
}

// A label and a count (and, with `with_expected`, an expected value) on every line.
TableCells read_label_rows(const std::vector<TableRow>& rows, bool with_expected, ParsedInput* out) {
    TableCells entries;
    const std::size_t want = with_expected ? 3 : 2;
    std::size_t first = 0;
    if (!rows.empty()) {
        const auto& c = rows[0].cells;
        const bool more_below = rows.size() >= 2;
        bool header = false;
        if (more_below && c.size() >= 2 && !looks_numeric(c[1])) header = true;
        if (more_below && c.size() >= 3 && want == 3 && !looks_numeric(c[2]) && !looks_numeric(c[0])) header = true;
        if (more_below && c.size() == 1 && !looks_numeric(c[0]) && rows[1].cells.size() >= 2) header = true;
        if (header) {
            out->column_names = c;
            out->notes.push_back("Line " + std::to_string(rows[0].line) + " read as a header row.");
            first = 1;
        }
    }
    const char* expected_shape = want == 3 ? "a label, a count and an expected value" : "a label and a count";
    for (std::size_t r = first; r < rows.size(); ++r) {
        const auto& c = rows[r].cells;
        const int line = rows[r].line;
        if (c.size() > want) {
            add_problem(out, line, static_cast<int>(want) + 1,
                        cell_location(line, static_cast<int>(want) + 1) + "found " + std::to_string(c.size()) +
                            " cells; expected " + expected_shape + ".");
            continue;
        }
        if (c.size() < want) {
            const int col = static_cast<int>(c.size()) + 1;
            add_problem(out, line, col,
                        cell_location(line, col) + "nothing after " + quote_cell(c.back()) + "; expected " +
                            expected_shape + " on every line.");
            continue;
        }
        Entry e;
        e.line = line;
        e.label = c[0];
        e.label_column = 1;
        e.count = c[1];
        e.count_column = 2;
        if (want == 3) { e.expected = c[2]; e.expected_column = 3; }
        entries.push_back(e);
    }
    return entries;
}

// The per-shape readers: each finds the cells holding labels, counts and expected values and
// notes the header rows it took; the steps below (decimal mark, numbers, totals row, expected
// column) are shared. A new table shape is one more reader here.
TableCells read_shape(const std::vector<TableRow>& rows, InputShape shape, ParsedInput* out) {
    switch (shape) {
        case InputShape::counts_row: return read_counts_row(rows, out);
        case InputShape::counts_column: return read_counts_column(rows, out);
        case InputShape::label_observed_expected: return read_label_rows(rows, true, out);
        default: return read_label_rows(rows, false, out);
    }
}

// The decimal mark, decided from the whole count (and expected) column.
DecimalMark table_decimal_mark(const TableCells& entries, const ParseOptions& options, ParsedInput* out) {
    MarkVotes counts, expected;
    for (const auto& e : entries) {
        counts.add(e.count, e.line, e.count_column);
        if (e.expected_column) expected.add(e.expected, e.line, e.expected_column);
    }
    const DecimalMark fallback = out->separator == Separator::semicolon ? DecimalMark::comma : DecimalMark::point;
    std::string note, alternative;
    DecimalMark mark = fallback;
    if (options.decimal) mark = *options.decimal;
    else if (counts.point + counts.comma + expected.point + expected.comma > 0)
        mark = counts.point + expected.point >= counts.comma + expected.comma ? DecimalMark::point : DecimalMark::comma;
    else if (counts.ambiguous > 0) mark = decide_decimal_mark(counts, true, fallback, &note, &alternative);
    else if (expected.ambiguous > 0) mark = decide_decimal_mark(expected, false, fallback, &note, &alternative);
    if (!note.empty()) out->notes.push_back(note);
    if (!alternative.empty()) out->alternatives.push_back(alternative);
    return mark;
}

// A count cell as a count, or a located problem (false).
bool read_count_cell(const Entry& e, DecimalMark mark, ParsedInput* out, double* count) {
    const std::string where = cell_location(e.line, e.count_column);
    const NumberReading n = read_number(e.count, mark);
    const char* fault = nullptr;
    if (n.out_of_range && std::isinf(n.value)) fault = " is too large; expected a count below 2^53.";
    else if (n.out_of_range) fault = " is too small to be read as a number; counts must be whole numbers.";
    else if (!n.ok) fault = " is not a count; expected a non-negative whole number.";
    else if (n.percent) fault = " is a percentage; counts must be non-negative whole numbers. Enter how many items fell in "
                                "each category: a test on percentages is wrong by a factor of N/100.";
    else if (n.negative && n.value != 0) fault = " is negative; counts must be non-negative whole numbers.";
    else if (n.value != std::floor(n.value)) fault = " is not a whole number; counts must be whole numbers.";
    else if (n.value >= kMaxCount) fault = " is too large; expected a count below 2^53.";
    if (fault != nullptr) {
        add_problem(out, e.line, e.count_column, where + quote_cell(e.count) + fault);
        return false;
    }
    *count = n.value;
    return true;
}

// A previous sample's cell as a count, or a located problem (false).
bool read_previous_cell(const Entry& e, DecimalMark mark, const ThirdColumnReading& third, ParsedInput* out, double* count) {
    const NumberReading n = read_number(e.expected, mark);
    const char* fault = nullptr;
    if (n.out_of_range && std::isinf(n.value)) fault = " is too large; expected a count below 2^53";
    else if (!n.ok) fault = " is not a count";
    else if (n.percent) fault = " is a percentage";
    else if (n.negative && n.value != 0) fault = " is negative";
    else if (n.value != std::floor(n.value)) fault = " is not a whole number";
    else if (n.value >= kMaxCount) fault = " is too large; expected a count below 2^53";
    if (fault == nullptr) {
        *count = n.value;
        return true;
    }
    add_problem(out, e.line, e.expected_column,
                cell_location(e.line, e.expected_column) + quote_cell(e.expected) + fault + "; " + third.described() +
                    " is read as a previous sample's counts, which must be non-negative whole numbers. If it holds "
                    "expected values, read the third column as expected values instead.");
    return false;
}

// The labels, counts and expected values (or previous sample's counts) of the entries into
// `out`; false when none may be used.
bool read_entries(const TableCells& entries, DecimalMark mark, const ThirdColumnReading& third, ParsedInput* out,
                  bool* any_percent) {
    std::unordered_map<std::string, int> seen;  // label -> line
    for (const Entry& e : entries) {
        double count = 0;
        if (!read_count_cell(e, mark, out, &count)) continue;
        std::string label = e.label.empty() ? "Category " + std::to_string(out->observed.size() + 1) : e.label;
        if (!valid_utf8(label)) {
            label = utf8_or_replacement(label);
            out->notes.push_back(cell_location(e.line, e.label_column) + "the label is not valid UTF-8 text; unreadable bytes are shown as \xEF\xBF\xBD.");
        }
        const auto [it, fresh] = seen.emplace(label, e.line);
        if (!fresh) {
            add_problem(out, e.line, e.label_column ? e.label_column : 1,
                        cell_location(e.line, e.label_column ? e.label_column : 1) + "the label " + quote_cell(label) +
                            " appears twice (first on line " + std::to_string(it->second) +
                            "); each category needs its own label.");
            continue;
        }
        double x = 0;
        if (e.expected_column && third.previous) {
            if (!read_previous_cell(e, mark, third, out, &x)) continue;
        } else if (e.expected_column) {
            const NumberReading m = read_number(e.expected, mark);
            const std::string ewhere = cell_location(e.line, e.expected_column);
            if (!m.ok) {
                add_problem(out, e.line, e.expected_column,
                            ewhere + quote_cell(e.expected) +
                                (m.out_of_range ? " is out of the range of numbers that can be read; expected"
                                                : " is not an expected value; expected") +
                                " a share, percentage, ratio term or expected count.");
                continue;
            }
            if (m.value < 0) {
                add_problem(out, e.line, e.expected_column,
                            ewhere + quote_cell(e.expected) + " is negative; expected values must be zero or more.");
                continue;
            }
            *any_percent = *any_percent || m.percent;
            x = m.value;
        }
        out->categories.push_back(std::move(label));
        out->observed.push_back(count);
        if (e.expected_column) out->expected.push_back(x);
    }
    return out->status.ok;
}

// A trailing totals row: dropped when it equals the sum above, refused when it does not (false).
bool drop_totals_row(const TableCells& entries, ParsedInput* out) {
    const std::size_t k = out->observed.size();
    if (k < 3) return true;
    const Entry& last = entries.back();
    double above = 0;
    for (std::size_t i = 0; i + 1 < k; ++i) above += out->observed[i];
    const bool labelled_total = !last.label.empty() && is_totals_label(last.label);
    const bool unlabelled_sum = last.label.empty() && k >= 4 && above > 0 && out->observed.back() == above;
    if (labelled_total && out->observed.back() != above) {
        add_problem(out, last.line, last.count_column,
                    cell_location(last.line, last.count_column) + "the totals row " + quote_cell(last.label) +
                        " gives " + plain(out->observed.back()) + ", but the counts above add up to " + plain(above) +
                        "; expected their sum, or no totals row.");
        return false;
    }
    if (labelled_total || unlabelled_sum) {
        out->categories.pop_back();
        out->observed.pop_back();
        if (!out->expected.empty()) out->expected.pop_back();
        out->notes.push_back("Line " + std::to_string(last.line) + " (" + plain(above) +
                             ") equals the sum of the counts above it: dropped as a totals row.");
        if (unlabelled_sum)
            out->alternatives.push_back("If line " + std::to_string(last.line) +
                                        " is a category rather than a total, give the categories labels.");
    }
    return true;
}

// A third column read as a previous sample's counts: its kind and the notes saying why.
void note_previous_sample(const TableCells& entries, const ThirdColumnReading& third, ParsedInput* out) {
    double sum = 0;
    for (double v : out->expected) sum += v;
    if (!(sum > 0)) {
        const Entry& e = entries.front();
        add_problem(out, e.line, e.expected_column,
                    cell_location(e.line, e.expected_column) + "the previous sample's counts are all zero; a previous "
                                                                "sample needs at least one count.");
        return;
    }
    out->expected_kind = ExpectedKind::previous_sample;
    std::string sentence = third.described();
    sentence[0] = 'T';
    out->notes.push_back(sentence + " is read as a previous sample's counts (" +
                         (third.chosen ? std::string("as chosen") : std::string("its header names an earlier sample")) +
                         "): the two samples are compared by a test of homogeneity, N = " + plain(sum) +
                         " in the previous sample.");
    if (!third.chosen)
        out->alternatives.push_back("If the third column holds expected counts, shares or ratios rather than a previous "
                                    "sample, read the third column as expected values.");
}

// What the expected column holds: shares, percentages, expected counts or ratio terms.
void classify_expected(const TableCells& entries, bool any_percent, const ThirdColumnReading& third, ParsedInput* out) {
    if (out->expected.empty()) return;
    if (third.previous) {
        note_previous_sample(entries, third, out);
        return;
    }
    const std::size_t k = out->observed.size();
    double sum = 0, total = 0;
    for (double v : out->expected) sum += v;
    for (double v : out->observed) total += v;
    if (!(sum > 0)) {
        const Entry& e = entries.front();
        add_problem(out, e.line, e.expected_column,
                    cell_location(e.line, e.expected_column) + "the expected values are all zero; expected shares, percentages, ratio terms or counts.");
        return;
    }
    ExpectedKind kind;
    std::string why;
    if (any_percent) { kind = ExpectedKind::percentages; why = "written with % signs"; }
    else if (std::fabs(sum - 1) <= 0.02) { kind = ExpectedKind::shares; why = "they add up to " + plain(sum); }
    else if (std::fabs(sum - total) <= std::max(0.5 * static_cast<double>(k), 1e-9 * total) && total > 0 &&
             std::fabs(total - 100) > 1e-9) {
        kind = ExpectedKind::counts; why = "they add up to the observed total " + plain(total);
    } else if (std::fabs(sum - 100) <= 2) { kind = ExpectedKind::percentages; why = "they add up to " + plain(sum); }
    else { kind = ExpectedKind::ratios; why = "they add up to " + plain(sum) + ", neither 1, 100 nor the observed total"; }
    out->expected_kind = kind;
    out->notes.push_back(std::string("The expected column was read as ") + expected_kind_name(kind) + " (" + why + ").");
}

}  // namespace

// Decimals in a count column that adds up to about 100 (or 1) are most likely percentages (or
// shares): the refusal says so. Other decimals (measurements pasted as counts) get no such note.
void note_percent_refusal(const TableCells& entries, DecimalMark mark, ParsedInput* out) {
    if (out->status.message.find("is not a whole number") == std::string::npos) return;
    double sum = 0;
    for (const Entry& e : entries)
        if (const NumberReading n = read_number(e.count, mark); n.ok && !n.out_of_range) sum += n.value;
    if (std::fabs(sum - 100) > 1 && std::fabs(sum - 1) > 0.01) return;
    const std::string note = " They add up to " + plain(sum) + ": if they are percentages or shares, enter how many items fell in "
                             "each category instead; a test on percentages is wrong by a factor of N/100.";
    out->status.message += note;
    if (!out->problems.empty()) out->problems.front().message += note;
}

// Whole counts under a header that names percentages ("%", "Percent", "Share") and totalling 100
// (or 1) are most likely percentages: a note says so (the counts are still read).
void note_percent_header(int count_column, ParsedInput* out) {
    if (count_column < 1 || static_cast<std::size_t>(count_column) > out->column_names.size()) return;
    const std::string& head = out->column_names[static_cast<std::size_t>(count_column) - 1];
    const std::string h = lower_ascii(head);
    const bool percent_like = h.find('%') != std::string::npos || h.find("percent") != std::string::npos ||
                              h.find("pct") != std::string::npos || h.find("share") != std::string::npos ||
                              h.find("proportion") != std::string::npos;
    double total = 0;
    for (double o : out->observed) total += o;
    if (!percent_like || !(total == 100 || total == 1)) return;
    out->notes.push_back("The count column is headed \"" + head + "\" and its values total " + plain(total) +
                         ": if they are percentages or proportions, enter the raw counts instead; a test on "
                         "percentages is wrong by a factor of N/100.");
}

void read_table(const std::vector<TableRow>& rows, const ParseOptions& options, ParsedInput* out) {
    const TableCells entries = read_shape(rows, out->shape, out);
    if (entries.size() > kMaxCategories) {
        add_problem(out, entries[kMaxCategories].line, 0,
                    cell_location(entries[kMaxCategories].line, 0) + "more than " + std::to_string(kMaxCategories) +
                        " categories; expected a table of at most that many.");
        return;
    }
    ThirdColumnReading third;
    if (out->shape == InputShape::label_observed_expected && options.third_column != ThirdColumn::expected) {
        if (out->column_names.size() >= 3) third.head = out->column_names[2];
        const std::string count_head = out->column_names.size() >= 2 ? out->column_names[1] : std::string();
        third.chosen = options.third_column == ThirdColumn::previous_sample;
        third.previous = third.chosen || (!third.head.empty() && names_previous_sample(third.head, count_head));
    }
    out->decimal = table_decimal_mark(entries, options, out);
    bool any_percent = false;
    if (!read_entries(entries, out->decimal, third, out, &any_percent)) {
        note_percent_refusal(entries, out->decimal, out);
        return;
    }
    if (!drop_totals_row(entries, out)) return;
    if (out->observed.empty()) {
        out->status = Status::failure("No counts found: paste lines of label and count.");
        return;
    }
    if (out->observed.size() == 1) {
        const Entry& e = entries.front();
        out->status = Status::failure("Only one category (\"" + out->categories[0] +
                                          "\"): a goodness-of-fit test needs at least two.",
                                      e.line, e.count_column);
        return;
    }
    classify_expected(entries, any_percent, third, out);
    note_percent_header(entries.front().count_column, out);
}

}  // namespace tallyproof
