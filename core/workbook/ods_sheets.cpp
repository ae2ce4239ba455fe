// Sheets of an .ods workbook, OpenDocument 1.3 Part 3 section numbers beside each rule. Repeated
// rows and cells (table:number-rows-repeated, table:number-columns-repeated) are expanded only
// when they hold a value: the empty repeats that fill a sheet to its last row and column
// (1,048,576 rows, 16,384 columns in LibreOffice) cost nothing.
#include "ods_sheets.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <set>

#include "cell_values.hpp"
#include "xml_events.hpp"

namespace tallyproof {
namespace {

constexpr const char* kTable = "urn:oasis:names:tc:opendocument:xmlns:table:1.0";
constexpr const char* kOffice = "urn:oasis:names:tc:opendocument:xmlns:office:1.0";
constexpr const char* kText = "urn:oasis:names:tc:opendocument:xmlns:text:1.0";
constexpr const char* kStyle = "urn:oasis:names:tc:opendocument:xmlns:style:1.0";

std::size_t count_attribute(const XmlAttributes& a, std::string_view local, const char* uri) {
    const char* v = a.find(local, uri);
    if (v == nullptr) return 1;
    const unsigned long long n = std::strtoull(v, nullptr, 10);
    return n == 0 ? 1 : n > (1ull << 30) ? (std::size_t{1} << 30) : static_cast<std::size_t>(n);
}

// 19.385 time-value: an ISO 8601 duration "PT13H45M00S" as "13:45:00" (hours may pass 24).
std::string duration_text(std::string_view d) {
    double h = 0, m = 0, s = 0, days = 0;
    double* slot = nullptr;
    std::string number;
    bool in_time = false;
    for (char c : d) {
        if ((c >= '0' && c <= '9') || c == '.' || c == ',') { number.push_back(c == ',' ? '.' : c); continue; }
        const double v = number.empty() ? 0 : std::strtod(number.c_str(), nullptr);
        number.clear();
        slot = nullptr;
        if (c == 'T') in_time = true;
        else if (c == 'D') slot = &days;
        else if (c == 'H') slot = &h;
        else if (c == 'M' && in_time) slot = &m;
        else if (c == 'S') slot = &s;
        if (slot) *slot = v;
    }
    const long long total = std::llround(((days * 24 + h) * 60 + m) * 60 + s);
    char buf[48];
    std::snprintf(buf, sizeof buf, "%02lld:%02lld:%02lld", total / 3600, total / 60 % 60, total % 60);
    return buf;
}

std::string date_value_text(std::string d) {
    if (d.size() >= 11 && d[10] == 'T') d[10] = ' ';
    const std::size_t dot = d.find('.', 10);
    if (dot != std::string::npos) d.resize(dot);
    if (d.size() > 10 && d.substr(10) == " 00:00:00") d.resize(10);
    return d;
}

struct ContentEvents : XmlEvents {
    WorkbookCells* out;
    std::set<std::string> hidden_styles;
    std::string style_name;  // the table style being read in office:automatic-styles
    std::size_t kept = 0, row = 0, column = 0, row_repeat = 1, cell_repeat = 1, span_rows = 1, span_columns = 1;
    std::vector<SheetCell> row_cells;
    std::string value, paragraphs;
    bool in_cell = false, has_formula = false, typed = false;
    int paragraph_depth = 0, annotation_depth = 0, table_depth = 0, paragraphs_seen = 0;

    SheetCells& sheet() { return out->sheets.back(); }
    void refuse(Status s) { stop = true; stop_status = std::move(s); }

    void start(const XmlName& n, const XmlAttributes& a) override {
        if (annotation_depth > 0 || (n.uri == kOffice && n.local == "annotation")) { ++annotation_depth; return; }
        if (n.uri == kStyle && n.local == "style") {
            const char* name = a.find("name", kStyle);
            style_name = name ? name : "";
        } else if (n.uri == kStyle && n.local == "table-properties") {
            const char* display = a.find("display", kTable);
            if (display && std::string_view(display) == "false") hidden_styles.insert(style_name);
        } else if (n.uri == kTable && n.local == "table") {
            if (++table_depth > 1) return;  // a table inside a cell is not a sheet
            const char* name = a.find("name", kTable);
            const char* style = a.find("style-name", kTable);
            out->sheets.push_back(SheetCells{});
            sheet().name = name ? name : "";
            sheet().hidden = style && hidden_styles.count(style) > 0;
            row = 0;
        } else if (table_depth == 1 && n.uri == kTable && n.local == "table-row") {
            row_repeat = count_attribute(a, "number-rows-repeated", kTable);
            row_cells.clear();
            column = 0;
        } else if (table_depth == 1 && n.uri == kTable && (n.local == "table-cell" || n.local == "covered-table-cell")) {
            start_cell(a);
        } else if (in_cell && n.uri == kText) {
            if (n.local == "p") { if (paragraph_depth++ == 0 && paragraphs_seen++ > 0) paragraphs.push_back(' '); }
            else if (n.local == "s") paragraphs.append(std::min<std::size_t>(count_attribute(a, "c", kText), 1000), ' ');
            else if (n.local == "tab" || n.local == "line-break") paragraphs.push_back(' ');
        }
    }
    void start_cell(const XmlAttributes& a);
    void end_cell();
    void end_row();
    void end(const XmlName& n) override {
        if (annotation_depth > 0) { --annotation_depth; return; }
        if (n.uri == kTable && n.local == "table") --table_depth;
        else if (table_depth == 1 && n.uri == kTable && (n.local == "table-cell" || n.local == "covered-table-cell")) end_cell();
        else if (table_depth == 1 && n.uri == kTable && n.local == "table-row") end_row();
        else if (in_cell && n.uri == kText && n.local == "p") --paragraph_depth;
    }
    void text(std::string_view s) override {
        if (in_cell && paragraph_depth > 0 && annotation_depth == 0) paragraphs.append(s);
    }
};

// 19.385 office:value-type and the value attribute that goes with it.
void ContentEvents::start_cell(const XmlAttributes& a) {
    in_cell = true;
    cell_repeat = count_attribute(a, "number-columns-repeated", kTable);
    span_rows = count_attribute(a, "number-rows-spanned", kTable);
    span_columns = count_attribute(a, "number-columns-spanned", kTable);
    paragraphs.clear();
    paragraphs_seen = paragraph_depth = 0;
    has_formula = a.find("formula", kTable) != nullptr;
    const char* type = a.find("value-type", kOffice);
    typed = type != nullptr;
    value.clear();
    if (!type) return;
    const std::string_view t = type;
    const char* v = nullptr;
    if (t == "float" || t == "percentage" || t == "currency") {
        if ((v = a.find("value", kOffice))) {
            char* end = nullptr;
            const double x = std::strtod(v, &end);
            value = end != v && *end == '\0' ? number_text(x) : std::string(v);
        }
    } else if (t == "date") {
        if ((v = a.find("date-value", kOffice))) value = date_value_text(v);
    } else if (t == "time") {
        if ((v = a.find("time-value", kOffice))) value = duration_text(v);
    } else if (t == "boolean") {
        if ((v = a.find("boolean-value", kOffice))) value = std::string_view(v) == "true" ? "TRUE" : "FALSE";
    } else if ((v = a.find("string-value", kOffice))) {
        value = v;
    }
}

void ContentEvents::end_cell() {
    in_cell = false;
    const std::size_t first = column + 1;
    if (value.empty() && (!typed || std::string_view(paragraphs).find_first_not_of(' ') != std::string_view::npos))
        value = paragraphs;  // strings (and untyped text) are their paragraphs
    if (value.find_first_not_of(' ') == std::string::npos) value.clear();
    if (has_formula && !typed && value.empty()) sheet().formulas_without_value.push_back(SheetCell{row + 1, first, {}});
    if (span_rows > 1 || span_columns > 1)
        sheet().merged.push_back(CellRange{row + 1, row + span_rows, first, first + span_columns - 1});
    column = std::min(column + cell_repeat, workbook_max_columns + 1);  // past the last column: a value there is refused
    if (value.empty()) return;
    if (column > workbook_max_columns) {
        refuse(keep_cell(&sheet(), row + 1, column, value, &kept));
        return;
    }
    for (std::size_t k = 0; k < cell_repeat; ++k) row_cells.push_back(SheetCell{0, first + k, value});
}

void ContentEvents::end_row() {
    if (!row_cells.empty()) {
        for (std::size_t r = 0; r < row_repeat && !stop; ++r)
            for (const auto& c : row_cells) {
                if (Status s = keep_cell(&sheet(), row + r + 1, c.column, c.text, &kept); !s.ok) { refuse(s); break; }
            }
    }
    row = std::min(row + row_repeat, workbook_max_rows + 1);  // no wrap-around of a 32-bit size_t (wasm)
}

}  // namespace

WorkbookCells read_ods_cells(std::string_view bytes, ZipArchive* zip, const ZipBudget& budget) {
    WorkbookCells out;
    const ZipEntry* e = find_zip_entry(*zip, "content.xml");
    if (e == nullptr) {
        out.status = Status::failure("The workbook has no part content.xml: it is damaged or not an .ods workbook. Open it in the "
                                     "spreadsheet program and save it again, or copy the cells.");
        return out;
    }
    std::string xml;
    if ((out.status = read_zip_entry(bytes, *e, budget, zip, &xml)), !out.status.ok) return out;
    ContentEvents events;
    events.out = &out;
    out.status = read_xml(xml, "content.xml", &events);
    for (const auto& entry : zip->entries)
        if (entry.name.rfind("Basic/", 0) == 0 || entry.name.rfind("Scripts/", 0) == 0) {
            out.notes.push_back("The workbook's macros were ignored (never run).");
            break;
        }
    return out;
}

}  // namespace tallyproof
