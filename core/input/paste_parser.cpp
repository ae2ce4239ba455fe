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

// The rest of a table after its sampled rows (`rec` the first row past the sample when `more`),
// then the table read; `rows_out` receives the rows when all of them were read.
void read_table_text(DelimitedReader& reader, Record& rec, bool more, std::vector<TableRow>& rows,
                     std::vector<TableRow>& grouped, bool words, InputShape shape, Separator sep,
                     const ParseOptions& options, ParsedInput* out, std::vector<TableRow>* rows_out) {
    if (more) {  // the rest of a table: bounded by the category limit
        rows.push_back(to_row(rec));
        while (reader.next(&rec)) {
            if (rec.blank()) continue;
            if (rows.size() >= kMaxCategories + 1) {  // room for a header row
                out->status = Status::failure(cell_location(rec.line, 0) + "more than " + std::to_string(kMaxCategories) +
                                                  " rows; expected a table of at most that many categories.",
                                              rec.line, 0);
                return;
            }
            rows.push_back(to_row(rec));
        }
        if (!reader.status().ok) {
            add_problem(out, reader.status().line, reader.status().column, reader.status().message);
            return;
        }
        if (words) {
            grouped = rows;
            regroup_space_words(&grouped);
        }
    }
    read_table(words ? grouped : rows, options, out);
    if (out->status.ok)
        out->notes.insert(out->notes.begin(), "Read " + std::to_string(out->categories.size()) + " categories as " +
                                                  (out->expected_kind == ExpectedKind::previous_sample
                                                       ? "label, observed and a previous sample's count"
                                                       : input_shape_words(shape)) + " (" + separated(sep) + ", " +
                                                  decimal_mark_name(out->decimal) + ").");
    if (rows_out) *rows_out = std::move(rows);
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

ParsedInput parse_input(std::string_view text, const ParseOptions& options, std::vector<TableRow>* rows_out) {
    ParsedInput out;
    if (rows_out) rows_out->clear();
    if (text.size() > kMaxInputBytes) {
        out.status = Status::failure("The pasted text has " + std::to_string(text.size() >> 20) +
                                     " MB; at most " + std::to_string(kMaxInputBytes >> 20) + " MB can be read.");
        return out;
    }
    text = skip_byte_order_mark(text);
    if (trim_cell(text).empty() && text.find_first_not_of(" \t\r\n\v\f") == std::string_view::npos) {
        out.status = Status::failure("Nothing to read: the pasted text is empty.");
        return out;
    }
    const bool numbers_expected = options.digits || options.bins.kind != BinChoice::Kind::none ||
                                  (options.decimal && *options.decimal == DecimalMark::comma);
    const Separator sep = options.separator ? *options.separator : detect_separator(text, numbers_expected);
    out.separator = sep;

    // Sample the leading rows; the shape is decided from them.
    DelimitedReader reader(text, sep);
    Record rec;
    std::vector<TableRow> rows;
    bool more = false;
    while (reader.next(&rec)) {
        if (rec.blank()) continue;
        if (rows.size() == kSampleRows) { more = true; break; }
        rows.push_back(to_row(rec));
    }
    if (!more && !reader.status().ok) {
        add_problem(&out, reader.status().line, reader.status().column, reader.status().message);
        return out;
    }
    if (rows.empty()) {
        out.status = Status::failure("No counts found: paste lines of label and count.");
        return out;
    }
    const bool words = sep == Separator::spaces;
    std::vector<TableRow> grouped;
    if (words) {
        grouped = rows;
        regroup_space_words(&grouped);
    }
    std::string why;
    const InputShape shape = options.shape ? *options.shape : detect_shape(words ? grouped : rows, more, options, &why);
    out.shape = shape;
    if (!why.empty()) {
        out.notes.push_back(why);
        out.alternatives.push_back("Read as a single column of counts instead, with the counts-column shape.");
    }
    if (!is_raw(shape)) read_table_text(reader, rec, more, rows, grouped, words, shape, sep, options, &out, rows_out);
    else {
        read_raw_text(text, rows, grouped, words, shape, sep, options, &out);
        if (rows_out && !more) *rows_out = std::move(rows);
    }
    return out;
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
