// Reading .xlsx and .ods workbooks from their bytes. The workbooks here are built in the test from
// parts written by hand after the standards (ECMA-376 Part 1 for SpreadsheetML, OpenDocument 1.3
// Part 3 for content.xml, PKWARE APPNOTE 6.3.10 for the ZIP records, deflated by zlib), with data of
// our own invention; the hostile ones are crafted to the same records (declared sizes of a bomb, a
// cut-short file, the encryption flag, an OLE2 header after [MS-CFB] with an "EncryptedPackage"
// name after [MS-OFFCRYPTO]). Serial-date check values: Python's datetime (days since 1899-12-30,
// and since 1904-01-01); Excel's fictitious 1900-02-29 is ECMA-376 Part 1, 18.17.4.1.
#include <doctest/doctest.h>

#include <cstdint>
#include <string>
#include <vector>

#include <zlib.h>

#include "cell_values.hpp"
#include "input_text.hpp"
#include "ods_sheets.hpp"
#include "workbook_reading.hpp"

using namespace tallyproof;

namespace {

struct Part {
    std::string name, data;
    int method = 8;
    std::uint16_t flags = 0;
    long declared_inflated = -1, declared_stored = -1;  // lies, for the hostile tests
};

void put16(std::string* s, std::uint32_t v) { s->push_back(static_cast<char>(v & 0xFF)); s->push_back(static_cast<char>(v >> 8 & 0xFF)); }
void put32(std::string* s, std::uint32_t v) { put16(s, v & 0xFFFF); put16(s, v >> 16); }

std::string raw_deflate(const std::string& in) {
    z_stream z{};
    deflateInit2(&z, 9, Z_DEFLATED, -MAX_WBITS, 8, Z_DEFAULT_STRATEGY);
    std::string out(deflateBound(&z, static_cast<uLong>(in.size())) + 16, '\0');
    z.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(in.data()));
    z.avail_in = static_cast<uInt>(in.size());
    z.next_out = reinterpret_cast<Bytef*>(out.data());
    z.avail_out = static_cast<uInt>(out.size());
    deflate(&z, Z_FINISH);
    out.resize(z.total_out);
    deflateEnd(&z);
    return out;
}

// A ZIP archive of `parts` (APPNOTE 4.3.7 local headers, 4.3.12 central directory, 4.3.16 end record).
std::string make_zip(const std::vector<Part>& parts) {
    std::string out, central;
    for (const auto& p : parts) {
        const std::string stored = p.method == 8 ? raw_deflate(p.data) : p.data;
        const auto crc = static_cast<std::uint32_t>(crc32(0, reinterpret_cast<const Bytef*>(p.data.data()), static_cast<uInt>(p.data.size())));
        const auto csize = static_cast<std::uint32_t>(p.declared_stored >= 0 ? p.declared_stored : static_cast<long>(stored.size()));
        const auto usize = static_cast<std::uint32_t>(p.declared_inflated >= 0 ? p.declared_inflated : static_cast<long>(p.data.size()));
        const auto offset = static_cast<std::uint32_t>(out.size());
        put32(&out, 0x04034b50); put16(&out, 20); put16(&out, p.flags); put16(&out, static_cast<std::uint32_t>(p.method));
        put16(&out, 0); put16(&out, 0x21); put32(&out, crc); put32(&out, csize); put32(&out, usize);
        put16(&out, static_cast<std::uint32_t>(p.name.size())); put16(&out, 0);
        out += p.name + stored;
        put32(&central, 0x02014b50); put16(&central, 20); put16(&central, 20); put16(&central, p.flags);
        put16(&central, static_cast<std::uint32_t>(p.method)); put16(&central, 0); put16(&central, 0x21); put32(&central, crc);
        put32(&central, csize); put32(&central, usize); put16(&central, static_cast<std::uint32_t>(p.name.size()));
        put16(&central, 0); put16(&central, 0); put16(&central, 0); put16(&central, 0); put32(&central, 0); put32(&central, offset);
        central += p.name;
    }
    const auto at = static_cast<std::uint32_t>(out.size());
    out += central;
    put32(&out, 0x06054b50); put16(&out, 0); put16(&out, 0);
    put16(&out, static_cast<std::uint32_t>(parts.size())); put16(&out, static_cast<std::uint32_t>(parts.size()));
    put32(&out, static_cast<std::uint32_t>(central.size())); put32(&out, at); put16(&out, 0);
    return out;
}

const char* kRels = R"(<?xml version="1.0" encoding="UTF-8"?>
<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">
<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/>
</Relationships>)";

const char* kWorkbookRels = R"(<?xml version="1.0" encoding="UTF-8"?>
<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">
<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/>
<Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="/xl/worksheets/sheet2.xml"/>
<Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet3.xml"/>
<Relationship Id="rId4" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/>
<Relationship Id="rId5" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles" Target="styles.xml"/>
</Relationships>)";

std::string workbook_xml(bool date1904) {
    return std::string(R"(<?xml version="1.0" encoding="UTF-8"?>
<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships">)") +
           (date1904 ? "<workbookPr date1904=\"1\"/>" : "<workbookPr/>") + R"(<sheets>
<sheet name="Notes" sheetId="1" state="hidden" r:id="rId1"/><sheet name="Counts" sheetId="2" r:id="rId2"/><sheet name="Empty" sheetId="3" r:id="rId3"/>
</sheets></workbook>)";
}

// Rich text runs (18.4.4) joined; the phonetic run (18.4.6) left out; _x0009_ a tab (22.4.2.4).
const char* kSharedStrings = R"(<?xml version="1.0" encoding="UTF-8"?>
<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="4" uniqueCount="4">
<si><t>Grade</t></si><si><r><rPr><b/></rPr><t>Cou</t></r><r><t>nt</t></r><rPh sb="0" eb="1"><t>KANA</t></rPh></si>
<si><t xml:space="preserve">A_x0009_plus </t></si><si><t>0042</t></si></sst>)";

// cellXfs: 0 general, 1 built-in 14 (a date), 2 custom 164 (date and time), 3 custom 165 (a number
// format with "E+" and quoted text: not a date), 4 built-in 20 (h:mm).
const char* kStyles = R"(<?xml version="1.0" encoding="UTF-8"?>
<styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main">
<numFmts count="2"><numFmt numFmtId="164" formatCode="yyyy\-mm\-dd hh:mm"/><numFmt numFmtId="165" formatCode="0.00E+00&quot; days&quot;"/></numFmts>
<cellStyleXfs count="1"><xf numFmtId="14"/></cellStyleXfs>
<cellXfs count="5"><xf numFmtId="0"/><xf numFmtId="14"/><xf numFmtId="164"/><xf numFmtId="165"/><xf numFmtId="20"/></cellXfs>
</styleSheet>)";

const char* kSheetNotes = R"(<?xml version="1.0" encoding="UTF-8"?>
<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>
<row r="1"><c r="A1" t="inlineStr"><is><t>hidden note</t></is></c></row></sheetData></worksheet>)";

// Counts in B3:D8 (the edges around them empty): strings, numbers, booleans, an error, dates and a
// formula with and without its saved value, a merged header.
const char* kSheetCounts = R"(<?xml version="1.0" encoding="UTF-8"?>
<x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData>
<x:row r="2"/>
<x:row r="3"><x:c r="B3" t="s"><x:v>0</x:v></x:c><x:c r="C3" t="s"><x:v>1</x:v></x:c></x:row>
<x:row r="4"><x:c r="B4" t="s"><x:v>2</x:v></x:c><x:c r="C4"><x:v>12</x:v></x:c><x:c r="D4"><x:v>0.1</x:v></x:c></x:row>
<x:row r="5"><x:c r="B5" t="str"><x:f>"B"</x:f><x:v>B</x:v></x:c><x:c r="C5"><x:f>C4*2</x:f></x:c><x:c r="D5" t="b"><x:v>1</x:v></x:c></x:row>
<x:row r="6"><x:c r="B6" t="s"><x:v>3</x:v></x:c><x:c r="C6" t="e"><x:v>#N/A</x:v></x:c><x:c r="D6" s="1"><x:v>45352</x:v></x:c></x:row>
<x:row r="7"><x:c r="B7" s="2"><x:v>45352.572916666664</x:v></x:c><x:c r="C7" s="3"><x:v>1234.5</x:v></x:c><x:c r="D7" s="4"><x:v>0.5</x:v></x:c></x:row>
<x:row r="8"><x:c r="B8" t="d"><x:v>2024-03-01T00:00:00Z</x:v></x:c><x:c><x:v>1E-3</x:v></x:c><x:c r="D8" t="b"><x:v>0</x:v></x:c></x:row>
</x:sheetData><x:mergeCells count="1"><x:mergeCell ref="C3:D3"/></x:mergeCells></x:worksheet>)";

const char* kSheetEmpty = R"(<?xml version="1.0" encoding="UTF-8"?>
<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData/></worksheet>)";

std::vector<Part> xlsx_parts(bool date1904 = false, const std::string& counts = kSheetCounts) {
    return {{"[Content_Types].xml", "<Types xmlns=\"http://schemas.openxmlformats.org/package/2006/content-types\"/>"},
            {"_rels/.rels", kRels},
            {"xl/workbook.xml", workbook_xml(date1904)},
            {"xl/_rels/workbook.xml.rels", kWorkbookRels},
            {"xl/sharedStrings.xml", kSharedStrings, 0},
            {"xl/styles.xml", kStyles},
            {"xl/worksheets/sheet1.xml", kSheetNotes},
            {"xl/worksheets/sheet2.xml", counts},
            {"xl/worksheets/sheet3.xml", kSheetEmpty}};
}

bool has_note(const std::vector<std::string>& notes, const std::string& part) {
    for (const auto& n : notes)
        if (n.find(part) != std::string::npos) return true;
    return false;
}

}  // namespace

TEST_CASE("xlsx: the first visible sheet with values, its used range, every kind of cell") {
    const std::string bytes = make_zip(xlsx_parts());
    CHECK(workbook_kind(bytes) == WorkbookKind::xlsx);
    const WorkbookReading r = read_workbook(bytes);
    REQUIRE(r.status.ok);
    REQUIRE(r.sheets.size() == 3);
    CHECK(r.sheets[0].name == "Notes");
    CHECK(r.sheets[0].hidden);
    CHECK_FALSE(r.sheets[1].hidden);
    CHECK(r.sheets[2].empty);
    CHECK(r.sheet_index == 1);  // Notes is hidden: Counts is read
    CHECK(range_name(r.range) == "B3:D8");
    CHECK(r.sheets[1].rows == 6);
    CHECK(r.sheets[1].columns == 3);
    CHECK(r.text ==
          "Grade\tCount\t\n"
          "A plus \t12\t0.1\n"
          "B\t\tTRUE\n"
          "0042\t#N/A\t2024-03-01\n"
          "2024-03-01 13:45:00\t1234.5\t12:00:00\n"
          "2024-03-01\t0.001\tFALSE\n");
    CHECK(has_note(r.notes, "C5 has a formula with no saved value"));
    CHECK(has_note(r.notes, "save it in the spreadsheet program first"));
    CHECK(has_note(r.notes, "Merged cells C3:D3"));
}

TEST_CASE("xlsx: a sheet by name or number, a range, and refusals of a sheet or range not there") {
    const std::string bytes = make_zip(xlsx_parts());
    WorkbookReading r = read_workbook(bytes, {"notes", ""});
    REQUIRE(r.status.ok);
    CHECK(r.sheet_index == 0);
    CHECK(r.text == "hidden note\n");
    r = read_workbook(bytes, {"2", "C:D"});
    REQUIRE(r.status.ok);
    CHECK(range_name(r.range) == "C3:D8");
    r = read_workbook(bytes, {"Counts", "A1:C4"});
    REQUIRE(r.status.ok);
    CHECK(r.text == "Grade\tCount\nA plus \t12\n");
    CHECK_FALSE(has_note(r.notes, "C5"));  // outside the range read
    r = read_workbook(bytes, {"Plan", ""});
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("no sheet \"Plan\"") != std::string::npos);
    CHECK(r.status.message.find("1 \"Notes\" (hidden), 2 \"Counts\", 3 \"Empty\" (empty)") != std::string::npos);
    CHECK(r.sheets.size() == 3);  // listed also when refused
    CHECK_FALSE(read_workbook(bytes, {"4", ""}).status.ok);
    CHECK_FALSE(read_workbook(bytes, {"Empty", ""}).status.ok);
    CHECK_FALSE(read_workbook(bytes, {"", "H1:J9"}).status.ok);  // no values there
    CHECK_FALSE(read_workbook(bytes, {"", "A1-B2"}).status.ok);  // not a range
}

TEST_CASE("xlsx: the 1904 date system") {
    const WorkbookReading r = read_workbook(make_zip(xlsx_parts(true)));
    REQUIRE(r.status.ok);
    // 45352 days after 1904-01-01 (Python: date(1904,1,1) + timedelta(45352)).
    CHECK(r.text.find("2028-03-02\n") != std::string::npos);
}

TEST_CASE("xlsx: a value beyond the last row is refused; macros and external links are noted") {
    const std::string far = R"(<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>
<row r="1048577"><c r="A1048577"><v>1</v></c></row></sheetData></worksheet>)";
    WorkbookReading r = read_workbook(make_zip(xlsx_parts(false, far)));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("beyond the largest sheet") != std::string::npos);
    auto parts = xlsx_parts();
    parts.push_back({"xl/vbaProject.bin", "not really VBA"});
    parts.push_back({"xl/externalLinks/externalLink1.xml", "<externalLink/>"});
    r = read_workbook(make_zip(parts));
    REQUIRE(r.status.ok);
    CHECK(has_note(r.notes, "macros were ignored"));
    CHECK(has_note(r.notes, "external links were ignored"));
}

namespace {

const char* kOdsContent = R"(<?xml version="1.0" encoding="UTF-8"?>
<office:document-content xmlns:office="urn:oasis:names:tc:opendocument:xmlns:office:1.0"
 xmlns:style="urn:oasis:names:tc:opendocument:xmlns:style:1.0" xmlns:text="urn:oasis:names:tc:opendocument:xmlns:text:1.0"
 xmlns:table="urn:oasis:names:tc:opendocument:xmlns:table:1.0" xmlns:calcext="urn:org:documentfoundation:names:experimental:calc:xmlns:calcext:1.0">
<office:automatic-styles>
<style:style style:name="ta1" style:family="table"><style:table-properties table:display="true"/></style:style>
<style:style style:name="ta2" style:family="table"><style:table-properties table:display="false"/></style:style>
</office:automatic-styles>
<office:body><office:spreadsheet>
<table:table table:name="Hidden" table:style-name="ta2"><table:table-row><table:table-cell office:value-type="float" office:value="7" calcext:value-type="float"><text:p>7</text:p></table:table-cell></table:table-row></table:table>
<table:table table:name="Counts" table:style-name="ta1">
<table:table-column table:number-columns-repeated="16384"/>
<table:table-row table:number-rows-repeated="2"><table:table-cell table:number-columns-repeated="16384"/></table:table-row>
<table:table-row><table:table-cell/><table:table-cell office:value-type="string"><text:p>Grade</text:p><text:p>letter</text:p></table:table-cell>
 <table:table-cell office:value-type="string" table:number-columns-spanned="2"><text:p>Co<text:s text:c="2"/>unt</text:p><office:annotation><text:p>a comment</text:p></office:annotation></table:table-cell>
 <table:covered-table-cell/><table:table-cell table:number-columns-repeated="16380"/></table:table-row>
<table:table-row><table:table-cell/><table:table-cell office:value-type="string"><text:p>A</text:p></table:table-cell>
 <table:table-cell office:value-type="float" office:value="12"><text:p>12</text:p></table:table-cell>
 <table:table-cell office:value-type="percentage" office:value="0.25"><text:p>25%</text:p></table:table-cell></table:table-row>
<table:table-row table:number-rows-repeated="2"><table:table-cell/><table:table-cell office:value-type="string"><text:p>B</text:p></table:table-cell>
 <table:table-cell office:value-type="boolean" office:boolean-value="true"><text:p>TRUE</text:p></table:table-cell>
 <table:table-cell office:value-type="date" office:date-value="2024-03-01T13:45:00"><text:p>x</text:p></table:table-cell></table:table-row>
<table:table-row><table:table-cell/><table:table-cell office:value-type="time" office:time-value="PT36H05M00S"/>
 <table:table-cell office:value-type="currency" office:value="1234.5" office:currency="EUR"/>
 <table:table-cell table:formula="of:=1/0"/><table:table-cell office:value-type="date" office:date-value="2024-03-01"/></table:table-row>
<table:table-row table:number-rows-repeated="1048569"><table:table-cell table:number-columns-repeated="16384"/></table:table-row>
</table:table>
</office:spreadsheet></office:body></office:document-content>)";

std::vector<Part> ods_parts(const std::string& content = kOdsContent) {
    return {{"mimetype", std::string(ods_mimetype), 0}, {"content.xml", content}, {"META-INF/manifest.xml", "<manifest/>"}};
}

}  // namespace

TEST_CASE("ods: hidden tables, repeated rows and cells, every value type") {
    const std::string bytes = make_zip(ods_parts());
    CHECK(workbook_kind(bytes) == WorkbookKind::ods);
    WorkbookReading r = read_workbook(bytes);
    REQUIRE(r.status.ok);
    REQUIRE(r.sheets.size() == 2);
    CHECK(r.sheets[0].hidden);
    CHECK_FALSE(r.sheets[1].hidden);
    CHECK(r.sheet_index == 1);
    CHECK(range_name(r.range) == "B3:E7");  // the empty repeats to the sheet's last row and column are not values
    CHECK(r.text ==
          "Grade letter\tCo  unt\t\t\n"
          "A\t12\t0.25\t\n"
          "B\tTRUE\t2024-03-01 13:45:00\t\n"
          "B\tTRUE\t2024-03-01 13:45:00\t\n"
          "36:05:00\t1234.5\t\t2024-03-01\n");
    CHECK(has_note(r.notes, "D7 has a formula with no saved value"));
    CHECK(has_note(r.notes, "Merged cells C3:D3"));
    r = read_workbook(bytes, {"Hidden", ""});
    REQUIRE(r.status.ok);
    CHECK(r.text == "7\n");
}

TEST_CASE("ods: a value repeated past the last column, or too many cells, is refused") {
    const std::string row_of = R"(<office:document-content xmlns:office="urn:oasis:names:tc:opendocument:xmlns:office:1.0"
 xmlns:table="urn:oasis:names:tc:opendocument:xmlns:table:1.0"><office:body><office:spreadsheet><table:table table:name="S">)";
    const std::string end = "</table:table></office:spreadsheet></office:body></office:document-content>";
    WorkbookReading r = read_workbook(make_zip(ods_parts(row_of + R"(<table:table-row><table:table-cell office:value-type="float" office:value="1" table:number-columns-repeated="16385"/></table:table-row>)" + end)));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("beyond the largest sheet") != std::string::npos);
    // 1,048,576 rows of 16,384 ones: 17 billion cells from a few hundred bytes.
    r = read_workbook(make_zip(ods_parts(row_of + R"(<table:table-row table:number-rows-repeated="1048576"><table:table-cell office:value-type="float" office:value="1" table:number-columns-repeated="16384"/></table:table-row>)" + end)));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("cells with values") != std::string::npos);
    r = read_workbook(make_zip(ods_parts(row_of + "<table:table-row><table:table-cell/></table:table-row>" + end)));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("no cells with values in any sheet") != std::string::npos);
}

TEST_CASE("refused: encrypted and legacy OLE2 files, .xlsb, damaged ZIPs") {
    // [MS-CFB] header signature; directory entry names are UTF-16LE.
    std::string ole("\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1", 8);
    ole.append(504, '\0');
    std::string encrypted = ole, legacy = ole;
    for (char c : std::string("EncryptedPackage")) { encrypted.push_back(c); encrypted.push_back('\0'); }
    for (char c : std::string("Workbook")) { legacy.push_back(c); legacy.push_back('\0'); }
    CHECK(workbook_kind(encrypted) == WorkbookKind::refused);
    WorkbookReading r = read_workbook(encrypted);
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("encrypted (password-protected)") != std::string::npos);
    CHECK(r.status.message.find("Remove the password") != std::string::npos);
    r = read_workbook(legacy);
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("older Excel workbook (.xls)") != std::string::npos);
    CHECK(r.status.message.find("Save it as .xlsx or .ods, or copy the cells") != std::string::npos);

    r = read_workbook(make_zip({{"[Content_Types].xml", "<Types/>"}, {"xl/workbook.bin", "binary"}}));
    CHECK(r.kind == WorkbookKind::refused);
    CHECK(r.status.message.find(".xlsb") != std::string::npos);

    const std::string whole = make_zip(xlsx_parts());
    for (std::size_t cut : {whole.size() / 2, whole.size() - 30}) {
        r = read_workbook(whole.substr(0, cut));
        CHECK(r.kind == WorkbookKind::xlsx);
        CHECK_FALSE(r.status.ok);
        CHECK(r.status.message.find("damaged or incomplete") != std::string::npos);
    }
    auto parts = xlsx_parts();
    parts[2].method = 0;  // xl/workbook.xml stored, so a flipped byte fails its CRC
    std::string stored = make_zip(parts);
    stored[stored.find("<sheets>") + 1] ^= 1;
    r = read_workbook(stored);
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("CRC-32") != std::string::npos);
}

TEST_CASE("refused before inflating: a decompression bomb, encrypted or ZIP64 entries") {
    auto parts = xlsx_parts();
    parts[7].declared_inflated = 600l << 20;  // the sheet claims 600 MB
    WorkbookReading r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("decompression bomb") != std::string::npos);

    // A part declaring 5 MB inflated from a few hundred stored bytes (over 1000:1).
    parts = xlsx_parts();
    parts[7].declared_inflated = 5l << 20;
    r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("more than 1000 times") != std::string::npos);

    parts = xlsx_parts();
    for (int i = 0; i < 10001; ++i) parts.push_back({"x/" + std::to_string(i), "", 0});
    r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("10010 parts") != std::string::npos);

    parts = xlsx_parts();
    parts[7].flags = 1;
    r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("encrypted") != std::string::npos);

    parts = xlsx_parts();
    parts[7].declared_inflated = 0xFFFFFFFFl;
    r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("ZIP64") != std::string::npos);

    // A size that lies: the sheet inflates past what it declares, and inflation stops there.
    parts = xlsx_parts();
    parts[7].declared_inflated = 100;
    r = read_workbook(make_zip(parts));
    CHECK_FALSE(r.status.ok);
    CHECK(r.status.message.find("more than the 100 bytes it declares") != std::string::npos);
}

TEST_CASE("numbers as the shortest text that reads back to the same double") {
    CHECK(number_text(12) == "12");
    CHECK(number_text(1e6) == "1000000");
    CHECK(number_text(-0.0) == "0");
    CHECK(number_text(0.1) == "0.1");
    CHECK(number_text(1.0 / 3) == "0.3333333333333333");  // 16 digits suffice (Python: repr(1/3))
    CHECK(number_text(0.1 + 0.2) == "0.30000000000000004");  // Python: repr(0.1 + 0.2)
    CHECK(number_text(1e20) == "1e+20");
    CHECK(number_text(2.5e-7) == "2.5e-07");
}

TEST_CASE("serial dates and which formats show them") {
    // Python: date(1899, 12, 30) + timedelta(days=serial) for serials from 61 on.
    CHECK(serial_date_text(45352, false, DateShow::date) == "2024-03-01");
    CHECK(serial_date_text(61, false, DateShow::date) == "1900-03-01");
    CHECK(serial_date_text(60, false, DateShow::date) == "1900-02-29");  // ECMA-376 Part 1, 18.17.4.1
    CHECK(serial_date_text(59, false, DateShow::date) == "1900-02-28");
    CHECK(serial_date_text(1, false, DateShow::date) == "1900-01-01");
    CHECK(serial_date_text(0, true, DateShow::date) == "1904-01-01");
    CHECK(serial_date_text(2958465, false, DateShow::date) == "9999-12-31");
    CHECK(serial_date_text(2958466, false, DateShow::date).empty());
    CHECK(serial_date_text(-1, false, DateShow::date).empty());
    CHECK(serial_date_text(0.75, false, DateShow::time) == "18:00:00");
    CHECK(serial_date_text(1.5, false, DateShow::elapsed) == "36:00:00");
    CHECK(builtin_format_shows(14) == DateShow::date);
    CHECK(builtin_format_shows(22) == DateShow::date_time);
    CHECK(builtin_format_shows(2) == DateShow::none);
    CHECK(format_code_shows("yyyy-mm-dd") == DateShow::date);
    CHECK(format_code_shows("mmm yyyy") == DateShow::date);
    CHECK(format_code_shows("h:mm AM/PM") == DateShow::time);
    CHECK(format_code_shows("mm:ss") == DateShow::time);
    CHECK(format_code_shows("[h]:mm:ss") == DateShow::elapsed);
    CHECK(format_code_shows("[$-409]d-mmm-yy;@") == DateShow::date);
    CHECK(format_code_shows("m/d/yy h:mm") == DateShow::date_time);
    CHECK(format_code_shows("General") == DateShow::none);
    CHECK(format_code_shows("#,##0.00") == DateShow::none);
    CHECK(format_code_shows("0.00E+00") == DateShow::none);
    CHECK(format_code_shows("0 \"days\"") == DateShow::none);
    CHECK(format_code_shows("[Red][<0]0;0") == DateShow::none);
}

TEST_CASE("input_text: workbooks by content, text decoded, other ZIPs refused by decode_text") {
    InputText t = input_text(make_zip(xlsx_parts()), "counts.xlsx");
    REQUIRE(t.status.ok);
    CHECK(t.from_workbook);
    CHECK(t.notice == "Read sheet \"Counts\" (B3:D8) of counts.xlsx; 3 sheets: Notes (hidden), Counts, Empty.");
    CHECK(t.text.rfind("Grade\tCount", 0) == 0);
    CHECK(t.sheet_index == 1);
    t = input_text(make_zip(xlsx_parts()), "", {"Nope", ""});
    CHECK_FALSE(t.status.ok);
    CHECK(t.from_workbook);
    CHECK(t.sheets.size() == 3);
    t = input_text("A\t10\nB\t12\n", "x.txt");
    REQUIRE(t.status.ok);
    CHECK_FALSE(t.from_workbook);
    CHECK(t.text == "A\t10\nB\t12\n");
    CHECK(t.notice.empty());
    t = input_text(std::string("\xFF\xFE" "A\0\t\0" "1\0\n\0", 10), "u16.txt");
    REQUIRE(t.status.ok);
    CHECK(t.text == "A\t1\n");
    CHECK_FALSE(t.notice.empty());  // the decoding is named
    t = input_text(make_zip({{"readme.txt", "hello"}}), "a.zip");
    CHECK_FALSE(t.status.ok);
    CHECK_FALSE(t.from_workbook);
    CHECK(t.status.message.find("zip archive") != std::string::npos);
}
