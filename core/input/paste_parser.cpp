// Reads pasted text: picks the separator, samples the first rows to detect the shape, then
// reads a table (table_shape) or streams raw observations into a tally (raw_observations,
// binning). Sizes are guarded so that no paste can exhaust memory or time. Common practice
// for spreadsheet clipboard and CSV text (RFC 4180), with every decision stated in a note.
#include "paste_parser.hpp"

#include <algorithm>

#include "binning.hpp"
#include "raw_observations.hpp"
#include "table_shape.hpp"

namespace tallyproof {
namespace {

// "tab-separated", "space-separated", ... for the notes on what was detected.
std::string separated(Separator sep) {
    const std::string name = separator_name(sep);
    return (name == "spaces" ? std::string("space") : name) + "-separated";
}


constexpr std::size_t kSampleRows = 2000;    // rows read before the shape is decided
constexpr std::size_t kSampleCells = 10000;  // raw cells that decide the decimal mark

bool is_raw(InputShape s) {
    return s == InputShape::raw_text || s == InputShape::raw_whole_numbers || s == InputShape::raw_digits ||
           s == InputShape::raw_bins;
}

TableRow to_row(const Record& rec) {
    TableRow row;
    row.line = rec.line;
    row.cells.reserve(rec.cells.size());
    for (auto c : rec.cells) row.cells.emplace_back(c);
    return row;
}

// The table read from its rows (all split), with the note on what was read.
void read_table_rows(const std::vector<TableRow>& rows, const std::vector<TableRow>& grouped, bool words, InputShape shape,
                     Separator sep, const ParseOptions& options, ParsedInput* out) {
    read_table(words ? grouped : rows, options, out);
    if (out->status.ok)
        out->notes.insert(out->notes.begin(), "Read " + std::to_string(out->categories.size()) + " categories as " +
                                                  (out->expected_kind == ExpectedKind::previous_sample
                                                       ? "label, observed and a previous sample's count"
                                                       : input_shape_words(shape)) + " (" + separated(sep) + ", " +
                                                  decimal_mark_name(out->decimal) + ").");
}

// Raw observations: the whole text streamed into a tally; `rows` (the sample) decide the
// header row and the decimal mark.
void read_raw_text(std::string_view text, const std::vector<TableRow>& rows, const std::vector<TableRow>& grouped,
                   bool words, InputShape shape, Separator sep, const ParseOptions& options, ParsedInput* out) {
    RawSource src;
    src.text = text;
    src.separator = sep;
    src.whole_lines = words && shape == InputShape::raw_text;
    src.numbers = shape != InputShape::raw_text;
    const std::vector<TableRow>& sample = src.whole_lines ? grouped : rows;
    const bool header = shape != InputShape::raw_text && raw_header_row(sample);
    if (header) {
        src.header_line = sample[0].line;
        out->column_names = sample[0].cells;
        out->notes.push_back("Line " + std::to_string(src.header_line) + " read as a header row.");
    }
    if (shape != InputShape::raw_text) {
        const DecimalMark fallback = sep == Separator::semicolon ? DecimalMark::comma : DecimalMark::point;
        if (options.decimal) out->decimal = *options.decimal;
        else {
            MarkVotes votes;
            std::size_t cells = 0;
            for (std::size_t r = header ? 1 : 0; r < rows.size() && cells < kSampleCells; ++r)
                for (std::size_t i = 0; i < rows[r].cells.size() && cells < kSampleCells; ++i, ++cells)
                    votes.add(rows[r].cells[i], rows[r].line, static_cast<int>(i) + 1);
            std::string note, alternative;
            out->decimal = decide_decimal_mark(votes, shape == InputShape::raw_whole_numbers, fallback, &note, &alternative);
            if (!note.empty()) out->notes.push_back(note);
            if (!alternative.empty()) out->alternatives.push_back(alternative);
        }
    }
    switch (shape) {
        case InputShape::raw_text: tally_raw_text(src, options, out); break;
        case InputShape::raw_whole_numbers: tally_raw_whole_numbers(src, options, out); break;
        case InputShape::raw_digits: tally_raw_digits(src, options.digits.value_or(DigitTest::first), out); break;
        default: count_into_bins(src, options.bins, out); break;
    }
    if (!out->status.ok) return;
    out->notes.insert(out->notes.begin(), std::string("Read as ") + input_shape_words(shape) + " (" + separated(sep) +
                                              (shape == InputShape::raw_text ? "" : std::string(", ") + decimal_mark_name(out->decimal)) +
                                              ").");
    if (out->categories.empty()) out->status = Status::failure("No values found: paste one value per line or per cell.");
    else if (out->categories.size() == 1 && shape != InputShape::raw_digits && shape != InputShape::raw_bins)
        out->status = Status::failure("Only one category (\"" + out->categories[0] +
                                      "\"): a goodness-of-fit test needs at least two.");
}

}  // namespace

void start_paste_reading(std::string_view text, const ParseOptions& options, PasteReading* r) {
    { PasteReading fresh; std::swap(*r, fresh); }
    r->options = options;
    ParsedInput& out = r->out;
    r->done = true;  // until the shape is decided
    if (text.size() > kMaxInputBytes) {
        out.status = Status::failure("The pasted text has " + std::to_string(text.size() >> 20) +
                                     " MB; at most " + std::to_string(kMaxInputBytes >> 20) + " MB can be read.");
        return;
    }
    text = skip_byte_order_mark(text);
    r->text = text;
    if (trim_cell(text).empty() && text.find_first_not_of(" \t\r\n\v\f") == std::string_view::npos) {
        out.status = Status::failure("Nothing to read: the pasted text is empty.");
        return;
    }
    const bool numbers_expected = options.digits || options.bins.kind != BinChoice::Kind::none ||
                                  (options.decimal && *options.decimal == DecimalMark::comma);
    const Separator sep = options.separator ? *options.separator : detect_separator(text, numbers_expected);
    out.separator = sep;

    // Sample the leading rows; the shape is decided from them.
    r->reader = DelimitedReader(text, sep);
    Record rec;
    std::vector<TableRow>& rows = r->rows;
    while (r->reader.next(&rec)) {
        if (rec.blank()) continue;
        if (rows.size() == kSampleRows) { r->more = true; break; }
        rows.push_back(to_row(rec));
    }
    if (!r->more && !r->reader.status().ok) {
        add_problem(&out, r->reader.status().line, r->reader.status().column, r->reader.status().message);
        rows.clear();
        return;
    }
    if (rows.empty()) {
        out.status = Status::failure("No counts found: paste lines of label and count.");
        return;
    }
    r->words = sep == Separator::spaces;
    if (r->words) {
        r->grouped = rows;
        regroup_space_words(&r->grouped);
    }
    std::string why;
    const InputShape shape = options.shape ? *options.shape : detect_shape(r->words ? r->grouped : rows, r->more, options, &why);
    out.shape = shape;
    if (!why.empty()) {
        out.notes.push_back(why);
        out.alternatives.push_back("Read as a single column of counts instead, with the counts-column shape.");
    }
    if (!is_raw(shape) && r->more) rows.push_back(to_row(rec));  // the rest of a table follows, in steps
    r->all_rows = !r->more;
    r->done = false;
}

bool step_paste_reading(PasteReading* r, std::size_t budget) {
    if (r->done) return true;
    ParsedInput& out = r->out;
    std::vector<TableRow>& rows = r->rows;
    const Separator sep = out.separator;
    if (is_raw(out.shape)) {  // raw observations: the whole text streamed into a tally, in one step
        read_raw_text(r->text, rows, r->grouped, r->words, out.shape, sep, r->options, &out);
        if (!r->all_rows) rows.clear();
        r->done = true;
        return true;
    }
    if (!r->all_rows) {  // the rest of a table: bounded by the category limit
        Record rec;
        for (std::size_t n = 0; n < budget || budget == 0; ++n) {
            if (!r->reader.next(&rec)) {
                if (!r->reader.status().ok) {
                    add_problem(&out, r->reader.status().line, r->reader.status().column, r->reader.status().message);
                    rows.clear();
                    r->done = true;
                    return true;
                }
                if (r->words) {
                    r->grouped = rows;
                    regroup_space_words(&r->grouped);
                }
                r->all_rows = true;
                return false;  // the table is read at the next step
            }
            if (rec.blank()) continue;
            if (rows.size() >= kMaxCategories + 1) {  // room for a header row
                out.status = Status::failure(cell_location(rec.line, 0) + "more than " + std::to_string(kMaxCategories) +
                                                 " rows; expected a table of at most that many categories.",
                                             rec.line, 0);
                rows.clear();
                r->done = true;
                return true;
            }
            rows.push_back(to_row(rec));
        }
        return false;
    }
    read_table_rows(rows, r->grouped, r->words, out.shape, sep, r->options, &out);
    r->done = true;
    return true;
}

std::size_t paste_reading_offset(const PasteReading& r) { return r.done || r.all_rows ? r.text.size() : r.reader.offset(); }

ParsedInput parse_input(std::string_view text, const ParseOptions& options, std::vector<TableRow>* rows_out) {
    PasteReading r;
    start_paste_reading(text, options, &r);
    while (!step_paste_reading(&r, 0)) {}
    if (rows_out) *rows_out = std::move(r.rows);
    return std::move(r.out);
}

ParsedCounts parse_counts(std::string_view text) {
    ParsedInput in = parse_input(text, ParseOptions{});
    ParsedCounts out;
    out.status = std::move(in.status);
    out.categories = std::move(in.categories);
    out.observed = std::move(in.observed);
    out.notes = std::move(in.notes);
    return out;
}

}  // namespace tallyproof
