// Sheets of an .xlsx workbook, ECMA-376 Part 1 (5th edition, 2016) section numbers beside each rule;
// Part 2 (Open Packaging Conventions) 9.3 for relationships and their targets. Strings escape
// characters XML cannot hold as _xHHHH_ (Part 1, 22.4.2.4 ST_Xstring).
#include "xlsx_sheets.hpp"

#include <algorithm>
#include <cstdlib>
#include <map>

#include "cell_values.hpp"
#include "xml_events.hpp"

namespace tallyproof {
namespace {

struct Relationship { std::string target, type; };

// 22.4.2.4: _xHHHH_ is the character U+HHHH (so _x005F_ escapes an underscore).
std::string unescape_xstring(std::string s) {
    if (s.find("_x") == std::string::npos) return s;
    std::string out;
    for (std::size_t i = 0; i < s.size(); ++i) {
        const auto hex = [&](std::size_t k) { const char c = s[k]; return (c >= '0' && c <= '9') || ((c | 0x20) >= 'a' && (c | 0x20) <= 'f'); };
        if (s[i] == '_' && i + 6 < s.size() && s[i + 1] == 'x' && hex(i + 2) && hex(i + 3) && hex(i + 4) && hex(i + 5) && s[i + 6] == '_') {
            const unsigned long cp = std::strtoul(s.substr(i + 2, 4).c_str(), nullptr, 16);
            if (cp < 0x80) out.push_back(static_cast<char>(cp));
            else if (cp < 0x800) { out.push_back(static_cast<char>(0xC0 | cp >> 6)); out.push_back(static_cast<char>(0x80 | (cp & 0x3F))); }
            else if (cp < 0xD800 || cp > 0xDFFF) {
                out.push_back(static_cast<char>(0xE0 | cp >> 12));
                out.push_back(static_cast<char>(0x80 | (cp >> 6 & 0x3F)));
                out.push_back(static_cast<char>(0x80 | (cp & 0x3F)));
            } else out += "\xEF\xBF\xBD";
            i += 6;
        } else {
            out.push_back(s[i]);
        }
    }
    return out;
}

// Part 2, 9.3: relationships of one part; targets relative to the part's folder.
struct RelsEvents : XmlEvents {
    std::map<std::string, Relationship> by_id;
    void start(const XmlName& n, const XmlAttributes& a) override {
        if (n.local != "Relationship") return;
        const char* id = a.find("Id");
        const char* target = a.find("Target");
        const char* type = a.find("Type");
        const char* mode = a.find("TargetMode");
        if (id && target && !(mode && std::string_view(mode) == "External")) by_id[id] = Relationship{target, type ? type : ""};
    }
    void end(const XmlName&) override {}
};

// 18.2.19 sheet (name, state, r:id) and 18.2.28 workbookPr (date1904).
struct WorkbookEvents : XmlEvents {
    struct Sheet { std::string name, id; bool hidden = false; };
    std::vector<Sheet> sheets;
    bool date1904 = false;
    void start(const XmlName& n, const XmlAttributes& a) override {
        if (n.local == "sheet") {
            const char* name = a.find("name");
            const char* id = a.find("id");
            const char* state = a.find("state");
            sheets.push_back(Sheet{name ? name : "", id ? id : "", state && std::string_view(state) != "visible"});
        } else if (n.local == "workbookPr") {
            const char* d = a.find("date1904");
            date1904 = d && (std::string_view(d) == "1" || std::string_view(d) == "true");
        }
    }
    void end(const XmlName&) override {}
};

// 18.4.8 si: its t, or the t of its runs (18.4.4 r); phonetic runs (18.4.6 rPh) are not the text.
struct SharedStringsEvents : XmlEvents {
    std::vector<std::string> strings;
    std::string current;
    int in_phonetic = 0;
    bool in_t = false;
    void start(const XmlName& n, const XmlAttributes&) override {
        if (n.local == "si") current.clear();
        else if (n.local == "rPh") ++in_phonetic;
        else if (n.local == "t") in_t = in_phonetic == 0;
    }
    void end(const XmlName& n) override {
        if (n.local == "si") strings.push_back(unescape_xstring(std::move(current)));
        else if (n.local == "rPh") --in_phonetic;
        else if (n.local == "t") in_t = false;
    }
    void text(std::string_view s) override {
        if (in_t) current.append(s);
    }
};

// 18.8.30 numFmt and 18.8.10 cellXfs: which cell styles show a date or a time.
struct StylesEvents : XmlEvents {
    std::map<int, std::string> codes;
    std::vector<DateShow> styles;
    bool in_cell_xfs = false;
    void start(const XmlName& n, const XmlAttributes& a) override {
        if (n.local == "numFmt") {
            const char* id = a.find("numFmtId");
            const char* code = a.find("formatCode");
            if (id && code) codes[std::atoi(id)] = code;
        } else if (n.local == "cellXfs") {
            in_cell_xfs = true;
        } else if (n.local == "xf" && in_cell_xfs) {
            const char* id = a.find("numFmtId");
            const int format = id ? std::atoi(id) : 0;
            const auto custom = codes.find(format);
            styles.push_back(custom != codes.end() ? format_code_shows(custom->second) : builtin_format_shows(format));
        }
    }
    void end(const XmlName& n) override {
        if (n.local == "cellXfs") in_cell_xfs = false;
    }
};

struct SheetEvents : XmlEvents {
    SheetCells* sheet;
    const std::vector<std::string>* shared;
    const std::vector<DateShow>* styles;
    bool date1904 = false;
    std::size_t* kept;
    std::size_t row = 0, column = 0;
    std::string type, value, inline_text;
    std::size_t style = 0;
    bool has_formula = false, has_value = false, in_v = false, in_inline_t = false;
    int in_inline = 0, in_phonetic = 0;

    void start(const XmlName& n, const XmlAttributes& a) override {
        if (n.local == "row") {
            const char* r = a.find("r");
            row = r ? std::strtoul(r, nullptr, 10) : row + 1;
            column = 0;
        } else if (n.local == "c") {
            const char* r = a.find("r");
            std::size_t cr = 0, cc = 0;
            if (r && parse_cell_name(r, &cr, &cc)) { row = cr; column = cc; }
            else ++column;
            if (row == 0) row = 1;
            const char* t = a.find("t");
            const char* s = a.find("s");
            type = t ? t : "n";
            style = s ? std::strtoul(s, nullptr, 10) : 0;
            value.clear();
            inline_text.clear();
            has_formula = has_value = false;
        } else if (n.local == "v") {
            in_v = has_value = true;
        } else if (n.local == "f") {
            has_formula = true;
        } else if (n.local == "is") {
            ++in_inline;
        } else if (n.local == "rPh") {
            ++in_phonetic;
        } else if (n.local == "t" && in_inline > 0) {
            in_inline_t = in_phonetic == 0;
        } else if (n.local == "mergeCell") {
            CellRange range;
            const char* ref = a.find("ref");
            if (ref && parse_cell_range(ref, &range).ok) sheet->merged.push_back(range);
        }
    }
    void end(const XmlName& n) override {
        if (n.local == "v") in_v = false;
        else if (n.local == "is") --in_inline;
        else if (n.local == "rPh") --in_phonetic;
        else if (n.local == "t") in_inline_t = false;
        else if (n.local == "c") finish_cell();
    }
    void text(std::string_view s) override {
        if (in_v) value.append(s);
        else if (in_inline_t) inline_text.append(s);
    }
    std::string cell_text();
    void finish_cell() {
        if (has_formula && value.empty() && type != "str" && type != "inlineStr") {
            if (row <= workbook_max_rows && column <= workbook_max_columns) sheet->formulas_without_value.push_back(SheetCell{row, column, {}});
            return;
        }
        Status s = keep_cell(sheet, row, column, cell_text(), kept);
        if (!s.ok) { stop = true; stop_status = s; }
    }
};

// 18.18.11 ST_CellType: s shared string, str formula string, inlineStr, b boolean, e error, n
// number, d ISO 8601 date.
std::string SheetEvents::cell_text() {
    if (type == "inlineStr") return unescape_xstring(inline_text);
    if (type == "s") {
        const std::size_t i = std::strtoul(value.c_str(), nullptr, 10);
        return i < shared->size() && !value.empty() ? (*shared)[i] : std::string();
    }
    if (type == "str" || type == "e") return unescape_xstring(value);
    if (type == "b") return value.empty() ? std::string() : value == "1" || value == "true" ? "TRUE" : "FALSE";
    if (type == "d") {
        std::string d = value;
        if (!d.empty() && d.back() == 'Z') d.pop_back();
        if (d.size() >= 11 && d[10] == 'T') d[10] = ' ';
        for (const char* midnight : {" 00:00:00.000", " 00:00:00"})
            if (d.size() > 10 && d.substr(10) == midnight) d.resize(10);
        return d;
    }
    if (value.empty()) return value;
    char* end = nullptr;
    const double x = std::strtod(value.c_str(), &end);
    if (end == value.c_str() || *end != '\0') return value;
    const DateShow show = style < styles->size() ? (*styles)[style] : DateShow::none;
    if (show != DateShow::none) {
        std::string date = serial_date_text(x, date1904, show);
        if (!date.empty()) return date;
    }
    return number_text(x);
}

// A relationship's target as a part name: relative to the source part's folder, or absolute from "/".
std::string resolve_target(const std::string& source, const std::string& target) {
    std::string path = target.size() > 0 && target[0] == '/' ? target.substr(1) : source.substr(0, source.rfind('/') + 1) + target;
    std::vector<std::string> parts;
    std::size_t at = 0;
    while (at <= path.size()) {
        const std::size_t slash = std::min(path.find('/', at), path.size());
        const std::string part = path.substr(at, slash - at);
        if (part == "..") { if (!parts.empty()) parts.pop_back(); }
        else if (!part.empty() && part != ".") parts.push_back(part);
        at = slash + 1;
    }
    std::string out;
    for (const auto& p : parts) out += (out.empty() ? "" : "/") + p;
    return out;
}

std::string rels_name(const std::string& part) {
    const std::size_t slash = part.rfind('/');
    const std::string folder = slash == std::string::npos ? "" : part.substr(0, slash + 1);
    return folder + "_rels/" + part.substr(slash == std::string::npos ? 0 : slash + 1) + ".rels";
}

bool ends_with(const std::string& s, std::string_view tail) { return s.size() >= tail.size() && s.compare(s.size() - tail.size(), tail.size(), tail) == 0; }

// Reads one part into `events`; a missing part is an empty one when `optional`.
Status read_part(std::string_view bytes, ZipArchive* zip, const ZipBudget& budget, const std::string& name, bool optional, XmlEvents* events) {
    const ZipEntry* e = find_zip_entry(*zip, name);
    if (e == nullptr)
        return optional ? Status::success()
                        : Status::failure("The workbook has no part " + name + ": it is damaged or not an .xlsx workbook. Open it in the "
                                          "spreadsheet program and save it again, or copy the cells.");
    std::string xml;
    if (Status s = read_zip_entry(bytes, *e, budget, zip, &xml); !s.ok) return s;
    return read_xml(xml, name, events);
}

}  // namespace

WorkbookCells read_xlsx_cells(std::string_view bytes, ZipArchive* zip, const ZipBudget& budget) {
    WorkbookCells out;
    RelsEvents package;
    std::string workbook_part = "xl/workbook.xml";
    if ((out.status = read_part(bytes, zip, budget, "_rels/.rels", true, &package)), !out.status.ok) return out;
    for (const auto& [id, rel] : package.by_id)
        if (ends_with(rel.type, "/officeDocument")) workbook_part = resolve_target("", rel.target);
    WorkbookEvents workbook;
    RelsEvents rels;
    if ((out.status = read_part(bytes, zip, budget, workbook_part, false, &workbook)), !out.status.ok) return out;
    if ((out.status = read_part(bytes, zip, budget, rels_name(workbook_part), true, &rels)), !out.status.ok) return out;
    std::string strings_part, styles_part;
    for (const auto& [id, rel] : rels.by_id) {
        if (ends_with(rel.type, "/sharedStrings")) strings_part = resolve_target(workbook_part, rel.target);
        else if (ends_with(rel.type, "/styles")) styles_part = resolve_target(workbook_part, rel.target);
    }
    SharedStringsEvents strings;
    StylesEvents styles;
    if (!strings_part.empty() && (out.status = read_part(bytes, zip, budget, strings_part, true, &strings), !out.status.ok)) return out;
    if (!styles_part.empty() && (out.status = read_part(bytes, zip, budget, styles_part, true, &styles), !out.status.ok)) return out;
    std::size_t kept = 0;
    for (const auto& s : workbook.sheets) {
        SheetCells sheet;
        sheet.name = s.name;
        sheet.hidden = s.hidden;
        const auto rel = rels.by_id.find(s.id);
        if (rel != rels.by_id.end()) {
            SheetEvents events;
            events.sheet = &sheet;
            events.shared = &strings.strings;
            events.styles = &styles.styles;
            events.date1904 = workbook.date1904;
            events.kept = &kept;
            if ((out.status = read_part(bytes, zip, budget, resolve_target(workbook_part, rel->second.target), true, &events)), !out.status.ok)
                return out;
        }
        out.sheets.push_back(std::move(sheet));
    }
    bool macros = false, links = false;
    for (const auto& e : zip->entries) {
        macros = macros || ends_with(e.name, "vbaProject.bin");
        links = links || e.name.rfind("xl/externalLinks/", 0) == 0;
    }
    if (macros) out.notes.push_back("The workbook's macros were ignored (never run).");
    if (links) out.notes.push_back("The workbook's external links were ignored: cells that refer to other workbooks show the values last saved.");
    return out;
}

}  // namespace tallyproof
