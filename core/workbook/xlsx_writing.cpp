// The parts of a minimal SpreadsheetML package (ECMA-376 Part 1, 5th ed.: 12.2 package structure,
// 18.2.27 workbook, 18.3.1.99 worksheet, 18.4.9 sst, 18.8.39 styleSheet; Part 2 (Open Packaging
// Conventions) 9.3 relationships and 10.1.2.2 [Content_Types].xml) zipped by zip_writer. Numbers
// are written as the shortest decimal text that reads back to the same double (18.3.1.96 v is
// xsd:double), text only through the shared-string table (t="s", 18.3.1.4), so no cell is a formula.
#include "xlsx_writing.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <map>
#include <new>

#include "cell_reference.hpp"
#include "sheet_name_rules.hpp"
#include "xml_text_writing.hpp"
#include "zip_writer.hpp"

namespace tallyproof {
namespace {

constexpr const char* kXmlHead = "<?xml version=\"1.0\" encoding=\"UTF-8\" standalone=\"yes\"?>\n";
constexpr const char* kMain = "http://schemas.openxmlformats.org/spreadsheetml/2006/main";
constexpr const char* kRel = "http://schemas.openxmlformats.org/officeDocument/2006/relationships";
constexpr const char* kPkgRel = "http://schemas.openxmlformats.org/package/2006/relationships";

// Cell formats (styles.xml cellXfs, by index): 0 general, 1 bold header, 2 p-value "0.000E+00".
constexpr int kHeaderStyle = 1, kScientificStyle = 2;

// Shortest "%.{p}g" text that strtod reads back to x: the fewest significant digits that keep the
// double (at most 17, which always do; IEEE 754-2019 5.12.2).
std::string number_text(double x) {
    if (x == 0) return "0";  // also -0
    char buf[40];
    for (int digits = 1; digits <= 17; ++digits) {
        std::snprintf(buf, sizeof buf, "%.*g", digits, x);
        if (std::strtod(buf, nullptr) == x) break;
    }
    return buf;
}

std::size_t display_width(const std::string& s) {  // characters, for the column width
    std::size_t n = 0;
    for (unsigned char c : s) n += (c & 0xC0) != 0x80;
    return n;
}

struct SharedStrings {
    std::map<std::string, std::size_t> index;
    std::vector<const std::string*> in_order;
    std::size_t uses = 0;
    std::size_t of(const std::string& s) {
        ++uses;
        auto [it, added] = index.emplace(s, in_order.size());
        if (added) in_order.push_back(&it->first);
        return it->second;
    }
};

std::string cell_xml(const WorkbookCell& cell, std::size_t row, std::size_t column, bool header, SharedStrings* strings) {
    const std::string ref = cell_name(row, column);
    if (cell.kind == WorkbookCell::Kind::text)
        return "<c r=\"" + ref + "\" t=\"s\"" + (header ? " s=\"1\"" : "") + "><v>" + std::to_string(strings->of(cell.text)) + "</v></c>";
    if (cell.kind != WorkbookCell::Kind::number || !std::isfinite(cell.number)) return {};
    const int style = header ? kHeaderStyle : cell.format == WorkbookCell::Format::scientific ? kScientificStyle : 0;
    return "<c r=\"" + ref + "\"" + (style ? " s=\"" + std::to_string(style) + "\"" : "") + "><v>" + number_text(cell.number) + "</v></c>";
}

// Column widths from the longest entry (in characters, 8 to 60), 18.3.1.13 col.
std::string columns_xml(const WorkbookSheet& sheet, std::size_t columns) {
    if (columns == 0) return {};
    std::vector<std::size_t> widest(columns, 6);
    for (const auto& row : sheet.rows)
        for (std::size_t c = 0; c < row.size() && c < columns; ++c)
            widest[c] = std::max(widest[c], row[c].kind == WorkbookCell::Kind::text ? display_width(row[c].text)
                                            : row[c].kind == WorkbookCell::Kind::number ? std::size_t{10} : std::size_t{0});
    std::string s = "<cols>";
    for (std::size_t c = 0; c < columns; ++c) {
        const std::size_t w = std::min<std::size_t>(std::max<std::size_t>(widest[c] + 2, 8), 60);
        s += "<col min=\"" + std::to_string(c + 1) + "\" max=\"" + std::to_string(c + 1) + "\" width=\"" + std::to_string(w) +
             "\" customWidth=\"1\"/>";
    }
    return s + "</cols>";
}

// One worksheet part (18.3.1.99): dimension, the header frozen in view (18.3.1.66 pane), column
// widths, then the cells row by row; empty cells are left out.
std::string worksheet_xml(const WorkbookSheet& sheet, bool first, SharedStrings* strings) {
    const std::size_t rows = std::min(sheet.rows.size(), workbook_max_rows);
    std::size_t columns = 0;
    for (std::size_t r = 0; r < rows; ++r) columns = std::max(columns, std::min(sheet.rows[r].size(), workbook_max_columns));
    std::string s = std::string(kXmlHead) + "<worksheet xmlns=\"" + kMain + "\" xmlns:r=\"" + kRel + "\">";
    s += "<dimension ref=\"" + (rows && columns ? "A1:" + cell_name(rows, columns) : std::string("A1")) + "\"/>";
    s += std::string("<sheetViews><sheetView") + (first ? " tabSelected=\"1\"" : "") + " workbookViewId=\"0\">";
    if (rows > 1) s += "<pane ySplit=\"1\" topLeftCell=\"A2\" activePane=\"bottomLeft\" state=\"frozen\"/>";
    s += "</sheetView></sheetViews><sheetFormatPr defaultRowHeight=\"15\"/>" + columns_xml(sheet, columns) + "<sheetData>";
    for (std::size_t r = 0; r < rows; ++r) {
        std::string cells;
        const auto& row = sheet.rows[r];
        for (std::size_t c = 0; c < row.size() && c < workbook_max_columns; ++c) cells += cell_xml(row[c], r + 1, c + 1, r == 0, strings);
        if (!cells.empty()) s += "<row r=\"" + std::to_string(r + 1) + "\">" + cells + "</row>";
    }
    return s + "</sheetData></worksheet>";
}

std::string shared_strings_xml(const SharedStrings& strings) {
    std::string s = std::string(kXmlHead) + "<sst xmlns=\"" + kMain + "\" count=\"" + std::to_string(strings.uses) +
                    "\" uniqueCount=\"" + std::to_string(strings.in_order.size()) + "\">";
    for (const std::string* t : strings.in_order) s += "<si><t xml:space=\"preserve\">" + xml_escaped_xstring(*t) + "</t></si>";
    return s + "</sst>";
}

// 18.8.39 styleSheet: two fonts (regular, bold), the two fills every workbook must begin with
// (none, gray125; 18.8.21), one border, and the three cell formats used; numFmtId 164 is the
// first id free for custom formats (ids below are built in, 18.8.30).
std::string styles_xml() {
    return std::string(kXmlHead) + "<styleSheet xmlns=\"" + kMain + "\">"
           "<numFmts count=\"1\"><numFmt numFmtId=\"164\" formatCode=\"0.000E+00\"/></numFmts>"
           "<fonts count=\"2\"><font><sz val=\"11\"/><name val=\"Calibri\"/><family val=\"2\"/></font>"
           "<font><b/><sz val=\"11\"/><name val=\"Calibri\"/><family val=\"2\"/></font></fonts>"
           "<fills count=\"2\"><fill><patternFill patternType=\"none\"/></fill><fill><patternFill patternType=\"gray125\"/></fill></fills>"
           "<borders count=\"1\"><border><left/><right/><top/><bottom/><diagonal/></border></borders>"
           "<cellStyleXfs count=\"1\"><xf numFmtId=\"0\" fontId=\"0\" fillId=\"0\" borderId=\"0\"/></cellStyleXfs>"
           "<cellXfs count=\"3\"><xf numFmtId=\"0\" fontId=\"0\" fillId=\"0\" borderId=\"0\" xfId=\"0\"/>"
           "<xf numFmtId=\"0\" fontId=\"1\" fillId=\"0\" borderId=\"0\" xfId=\"0\" applyFont=\"1\"/>"
           "<xf numFmtId=\"164\" fontId=\"0\" fillId=\"0\" borderId=\"0\" xfId=\"0\" applyNumberFormat=\"1\"/></cellXfs>"
           "<cellStyles count=\"1\"><cellStyle name=\"Normal\" xfId=\"0\" builtinId=\"0\"/></cellStyles>"
           "</styleSheet>";
}

std::string content_types_xml(std::size_t sheets) {
    std::string s = std::string(kXmlHead) + "<Types xmlns=\"http://schemas.openxmlformats.org/package/2006/content-types\">"
                    "<Default Extension=\"rels\" ContentType=\"application/vnd.openxmlformats-package.relationships+xml\"/>"
                    "<Default Extension=\"xml\" ContentType=\"application/xml\"/>"
                    "<Override PartName=\"/xl/workbook.xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml\"/>";
    for (std::size_t i = 1; i <= sheets; ++i)
        s += "<Override PartName=\"/xl/worksheets/sheet" + std::to_string(i) +
             ".xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml\"/>";
    return s + "<Override PartName=\"/xl/sharedStrings.xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml\"/>"
               "<Override PartName=\"/xl/styles.xml\" ContentType=\"application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml\"/>"
               "</Types>";
}

std::string relationship(const std::string& id, const std::string& type, const std::string& target) {
    return "<Relationship Id=\"" + id + "\" Type=\"" + kRel + "/" + type + "\" Target=\"" + target + "\"/>";
}

std::string package(const std::vector<WorkbookSheet>& given) {
    std::vector<WorkbookSheet> empty_book;
    if (given.empty()) empty_book.push_back(WorkbookSheet{"Sheet1", {}});
    const std::vector<WorkbookSheet>& sheets = given.empty() ? empty_book : given;
    std::vector<std::string> wanted;
    for (const auto& sh : sheets) wanted.push_back(sh.name);
    const std::vector<std::string> names = valid_sheet_names(wanted);
    SharedStrings strings;
    std::vector<ZipPart> parts;
    parts.push_back({"[Content_Types].xml", content_types_xml(sheets.size())});
    parts.push_back({"_rels/.rels", std::string(kXmlHead) + "<Relationships xmlns=\"" + kPkgRel + "\">" +
                                        relationship("rId1", "officeDocument", "xl/workbook.xml") + "</Relationships>"});
    std::string workbook = std::string(kXmlHead) + "<workbook xmlns=\"" + kMain + "\" xmlns:r=\"" + kRel +
                           "\"><bookViews><workbookView activeTab=\"0\"/></bookViews><sheets>";
    std::string rels = std::string(kXmlHead) + "<Relationships xmlns=\"" + kPkgRel + "\">";
    for (std::size_t i = 0; i < sheets.size(); ++i) {
        const std::string n = std::to_string(i + 1);
        workbook += "<sheet name=\"" + xml_escaped_xstring(names[i]) + "\" sheetId=\"" + n + "\" r:id=\"rId" + n + "\"/>";
        rels += relationship("rId" + n, "worksheet", "worksheets/sheet" + n + ".xml");
    }
    const std::string next = std::to_string(sheets.size() + 1), after = std::to_string(sheets.size() + 2);
    rels += relationship("rId" + next, "sharedStrings", "sharedStrings.xml") + relationship("rId" + after, "styles", "styles.xml");
    parts.push_back({"xl/workbook.xml", workbook + "</sheets></workbook>"});
    parts.push_back({"xl/_rels/workbook.xml.rels", rels + "</Relationships>"});
    for (std::size_t i = 0; i < sheets.size(); ++i)
        parts.push_back({"xl/worksheets/sheet" + std::to_string(i + 1) + ".xml", worksheet_xml(sheets[i], i == 0, &strings)});
    parts.push_back({"xl/sharedStrings.xml", shared_strings_xml(strings)});
    parts.push_back({"xl/styles.xml", styles_xml()});
    return zip_archive(parts);
}

}  // namespace

WorkbookCell workbook_text(std::string text) {
    WorkbookCell c;
    c.kind = WorkbookCell::Kind::text;
    c.text = std::move(text);
    return c;
}

WorkbookCell workbook_number(double x) {
    WorkbookCell c;
    if (!std::isfinite(x)) return c;
    c.kind = WorkbookCell::Kind::number;
    c.number = x == 0 ? 0.0 : x;  // no -0
    return c;
}

WorkbookCell workbook_scientific(double x) {
    WorkbookCell c = workbook_number(x);
    c.format = WorkbookCell::Format::scientific;
    return c;
}

std::string write_xlsx(const std::vector<WorkbookSheet>& sheets) {
    try {
        return package(sheets);
    } catch (const std::bad_alloc&) {
        return {};
    }
}

}  // namespace tallyproof
