// Writing .xlsx: the ZIP container read back by a central-directory reader written here after
// PKWARE's APPNOTE.TXT 6.3.x (4.3.7, 4.3.12, 4.3.16), each entry inflated by zlib and its CRC-32
// recomputed; every XML part parsed by expat (well-formed XML 1.0); the XML 1.0 character rules
// (W3C XML 1.0 5th ed., production [2]); Excel's sheet-name rules; text cells always shared strings
// (ECMA-376 Part 1, 18.3.1.4), so a label that looks like a formula stays text.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <map>
#include <string>
#include <vector>

#include <expat.h>
#include <zlib.h>

#include "result_workbook.hpp"
#include "sheet_name_rules.hpp"
#include "xlsx_writing.hpp"
#include "xml_text_writing.hpp"
#include "zip_writer.hpp"

using namespace tallyproof;

namespace {

std::uint32_t le16(const std::string& s, std::size_t at) {
    return static_cast<unsigned char>(s[at]) | (static_cast<std::uint32_t>(static_cast<unsigned char>(s[at + 1])) << 8);
}
std::uint32_t le32(const std::string& s, std::size_t at) { return le16(s, at) | (le16(s, at + 2) << 16); }

std::uint32_t crc_of(const std::string& s) {
    return static_cast<std::uint32_t>(crc32(crc32(0L, Z_NULL, 0), reinterpret_cast<const Bytef*>(s.data()), static_cast<uInt>(s.size())));
}

std::string raw_inflate(const std::string& packed, std::size_t size) {
    std::string out(size, '\0');
    z_stream z{};
    REQUIRE(inflateInit2(&z, -15) == Z_OK);
    z.next_in = reinterpret_cast<Bytef*>(const_cast<char*>(packed.data()));
    z.avail_in = static_cast<uInt>(packed.size());
    z.next_out = reinterpret_cast<Bytef*>(out.data());
    z.avail_out = static_cast<uInt>(out.size());
    const int rc = inflate(&z, Z_FINISH);
    inflateEnd(&z);
    CHECK(rc == Z_STREAM_END);
    CHECK(z.total_out == size);
    return out;
}

// The archive read back through its central directory (APPNOTE 4.3.16 then 4.3.12), each entry's
// local header (4.3.7) checked against it, the data inflated and its CRC-32 compared.
std::map<std::string, std::string> read_zip(const std::string& zip) {
    std::map<std::string, std::string> entries;
    REQUIRE(zip.size() >= 22);
    const std::size_t end = zip.size() - 22;  // we write no archive comment
    REQUIRE(le32(zip, end) == 0x06054b50u);
    const std::size_t count = le16(zip, end + 10), dir_size = le32(zip, end + 12), dir_at = le32(zip, end + 16);
    CHECK(le16(zip, end + 8) == count);
    CHECK(dir_at + dir_size == end);
    std::size_t at = dir_at;
    for (std::size_t i = 0; i < count; ++i) {
        REQUIRE(le32(zip, at) == 0x02014b50u);
        const std::uint32_t method = le16(zip, at + 10), crc = le32(zip, at + 16), packed = le32(zip, at + 20),
                            size = le32(zip, at + 24), name_len = le16(zip, at + 28), extra = le16(zip, at + 30),
                            comment = le16(zip, at + 32), local = le32(zip, at + 42);
        CHECK(le16(zip, at + 14) == 0x0021);  // DOS date 1980-01-01 (APPNOTE 4.4.6)
        const std::string name = zip.substr(at + 46, name_len);
        REQUIRE(le32(zip, local) == 0x04034b50u);
        CHECK(le16(zip, local + 8) == method);
        CHECK(le32(zip, local + 14) == crc);
        CHECK(le32(zip, local + 18) == packed);
        CHECK(le32(zip, local + 22) == size);
        CHECK(zip.substr(local + 30, le16(zip, local + 26)) == name);
        const std::string body = zip.substr(local + 30 + le16(zip, local + 26) + le16(zip, local + 28), packed);
        REQUIRE((method == 0 || method == 8));
        const std::string data = method == 8 ? raw_inflate(body, size) : body;
        CHECK(crc_of(data) == crc);
        entries[name] = data;
        at += 46 + name_len + extra + comment;
    }
    CHECK(at == end);
    return entries;
}

bool well_formed(const std::string& xml) {
    XML_Parser p = XML_ParserCreate(nullptr);
    const bool ok = XML_Parse(p, xml.data(), static_cast<int>(xml.size()), 1) == XML_STATUS_OK;
    XML_ParserFree(p);
    return ok;
}

std::size_t occurrences(const std::string& s, const std::string& what) {
    std::size_t n = 0;
    for (std::size_t at = s.find(what); at != std::string::npos; at = s.find(what, at + 1)) ++n;
    return n;
}

}  // namespace

TEST_CASE("zlib's crc32 is ZIP's CRC-32: the check value of \"123456789\"") {
    // 0xCBF43926: the standard check value of CRC-32 (ISO-HDLC), as in Ross Williams' "A Painless
    // Guide to CRC Error Detection Algorithms" and the reveng CRC catalogue.
    CHECK(crc_of("123456789") == 0xCBF43926u);
}

TEST_CASE("a ZIP archive reads back entry by entry, deflated or stored, byte for byte the same") {
    std::string noise;  // does not shrink under deflate: stored (method 0)
    std::uint32_t x = 2463534242u;  // xorshift32 (Marsaglia 2003), our own test bytes
    for (int i = 0; i < 3000; ++i) {
        x ^= x << 13; x ^= x >> 17; x ^= x << 5;
        noise.push_back(static_cast<char>(x & 0xFF));
    }
    const std::vector<ZipPart> in = {{"a.txt", std::string(5000, 'a') + "end"}, {"dir/noise.bin", noise}, {"empty", ""},
                                      {"123456789", "123456789"}};
    const std::string zip = zip_archive(in);
    const auto out = read_zip(zip);
    REQUIRE(out.size() == in.size());
    for (const auto& e : in) CHECK(out.at(e.name) == e.data);
    CHECK(zip.size() < 5000);                 // the run of 'a' was deflated
    CHECK(zip_archive(in) == zip);            // a fixed timestamp: the same bytes every time
    CHECK(read_zip(zip_archive({})).empty()); // an empty archive is only the end record
    CHECK(zip_archive({}).size() == 22);
}

TEST_CASE("XML text: the five specials escaped, characters XML 1.0 refuses and broken UTF-8 replaced") {
    CHECK(xml_escaped("a&b<c>\"d'") == "a&amp;b&lt;c&gt;&quot;d'");
    CHECK(xml_escaped("tab\tline\nret\r") == "tab\tline\nret&#13;");
    const std::string fffd = "\xEF\xBF\xBD";
    CHECK(xml_escaped(std::string("a\x01" "b\x1F" "c\x7F", 6)) == "a" + fffd + "b" + fffd + "c\x7F");  // U+007F is allowed by [2]
    CHECK(xml_escaped(std::string("nul\0", 4)) == "nul" + fffd);
    CHECK(xml_escaped("\xEF\xBF\xBE") == fffd);                      // U+FFFE is not a Char
    CHECK(xml_escaped("\xC3\x28") == fffd + "(");                     // a lead byte without its continuation
    CHECK(xml_escaped("\xC0\xAF") == fffd + fffd);                    // overlong '/', RFC 3629 section 10
    CHECK(xml_escaped("\xED\xA0\x80") == fffd + fffd + fffd);         // a UTF-16 surrogate
    CHECK(xml_escaped("\xF4\x90\x80\x80") == fffd + fffd + fffd + fffd);  // above U+10FFFF
    const std::string kept = "χ² é ü 中文 \xF0\x9F\x98\x80";               // chi, accents, CJK, an emoji (U+1F600)
    CHECK(xml_escaped(kept) == kept);
    // ST_Xstring (ECMA-376 Part 1, 22.9.2.19): a literal _x0041_ must not read back as "A".
    CHECK(xml_escaped_xstring("_x0041_ and _x12_") == "_x005F_x0041_ and _x12_");
    CHECK(xml_escaped("_x0041_") == "_x0041_");
    CHECK(well_formed("<t>" + xml_escaped(std::string("\x01<&>\"\xFF\xC3\xA9\r", 9)) + "</t>"));
}

TEST_CASE("sheet names: forbidden characters, length, apostrophes, reserved and repeated names") {
    const auto n = valid_sheet_names({"a:b/c?d*e[f]g\\h", std::string(40, 'x'), "'quoted'", "", "Data", "DATA", "History",
                                      std::string(30, 'y') + "\xF0\x9F\x98\x80", std::string(31, 'x'), "tab\there"});
    REQUIRE(n.size() == 10);
    CHECK(n[0] == "a_b_c_d_e_f_g_h");
    CHECK(n[1] == std::string(31, 'x'));
    CHECK(n[2] == "quoted");
    CHECK(n[3] == "Sheet 4");
    CHECK(n[4] == "Data");
    CHECK(n[5] == "DATA (2)");                 // names compare without case
    CHECK(n[6] == "History sheet");            // reserved by Excel
    CHECK(n[7] == std::string(30, 'y'));       // the emoji is 2 UTF-16 units: 32 > 31, so it goes whole
    CHECK(n[8] == std::string(27, 'x') + " (2)");  // repeats n[1]: cut so the number fits in 31
    CHECK(n[9] == "tabhere");
}

TEST_CASE("a workbook: the package parts, well-formed, labels as shared strings, numbers in full precision") {
    WorkbookSheet s{"Data: 1/2", {{workbook_text("Label"), workbook_text("Value"), workbook_text("p")},
                                  {workbook_text("=SUM(A1)"), workbook_number(0.1), workbook_scientific(1.234e-250)},
                                  {workbook_text("+1"), workbook_number(1.0 / 3), workbook_scientific(0.05)},
                                  {workbook_text("@x"), workbook_number(-0.0), workbook_number(NAN)},
                                  {workbook_text("χ² é 中文 _x0041_"), workbook_number(12345678901234567.0), WorkbookCell{}}}};
    const std::string bytes = write_xlsx({s, WorkbookSheet{"Data: 1/2", {}}});
    const auto parts = read_zip(bytes);
    for (const char* name : {"[Content_Types].xml", "_rels/.rels", "xl/workbook.xml", "xl/_rels/workbook.xml.rels",
                             "xl/worksheets/sheet1.xml", "xl/worksheets/sheet2.xml", "xl/sharedStrings.xml", "xl/styles.xml"}) {
        INFO(name);
        REQUIRE(parts.count(name) == 1);
        CHECK(well_formed(parts.at(name)));
    }
    const std::string& sheet = parts.at("xl/worksheets/sheet1.xml");
    const std::string& sst = parts.at("xl/sharedStrings.xml");
    CHECK(sheet.find("<f>") == std::string::npos);           // no formula anywhere
    CHECK(sheet.find("t=\"str\"") == std::string::npos);     // nor a formula's string result
    CHECK(sheet.find("inlineStr") == std::string::npos);
    CHECK(occurrences(sheet, "t=\"s\"") == 7);               // 3 header + 4 labels
    CHECK(sst.find(">=SUM(A1)<") != std::string::npos);
    CHECK(sst.find(">+1<") != std::string::npos);
    CHECK(sst.find(">@x<") != std::string::npos);
    CHECK(sst.find(">χ² é 中文 _x005F_x0041_<") != std::string::npos);
    // Shortest round-trip text (IEEE 754 doubles, 17 significant digits at most).
    CHECK(sheet.find("<c r=\"B2\"><v>0.1</v></c>") != std::string::npos);
    CHECK(sheet.find("<c r=\"B3\"><v>0.3333333333333333</v></c>") != std::string::npos);
    CHECK(std::strtod("0.3333333333333333", nullptr) == 1.0 / 3);
    CHECK(sheet.find("<c r=\"B4\"><v>0</v></c>") != std::string::npos);  // -0 written as 0
    CHECK(sheet.find("<c r=\"B5\"><v>12345678901234568</v></c>") != std::string::npos);  // the double nearest 12345678901234567
    CHECK(sheet.find("<c r=\"C2\" s=\"2\"><v>1.234e-250</v></c>") != std::string::npos);  // p-value style
    CHECK(sheet.find("r=\"C4\"") == std::string::npos);     // NaN: no cell
    CHECK(sheet.find("<c r=\"A1\" t=\"s\" s=\"1\">") != std::string::npos);  // bold header
    CHECK(parts.at("xl/styles.xml").find("formatCode=\"0.000E+00\"") != std::string::npos);
    const std::string& book = parts.at("xl/workbook.xml");
    CHECK(book.find("name=\"Data_ 1_2\"") != std::string::npos);
    CHECK(book.find("name=\"Data_ 1_2 (2)\"") != std::string::npos);
    CHECK(write_xlsx({s}) == write_xlsx({s}));  // reproducible
    CHECK(read_zip(write_xlsx({})).count("xl/worksheets/sheet1.xml") == 1);  // an empty workbook still has a sheet
}

TEST_CASE("table rows to a sheet: numbers keep the Result's double, a p-value below the double range is text with a note") {
    const std::vector<std::vector<TableCell>> rows = {
        {text_cell("Category"), text_cell("Observed"), text_cell("p")},
        {text_cell("=1+1"), count_cell(30), probability_cell({0.0832684569401, std::log10(0.0832684569401)})},
        {text_cell("B"), number_cell(2.309401077), probability_cell({0.0, -400.5})}};
    const WorkbookSheet s = table_sheet("T", rows);
    REQUIRE(s.rows.size() == 5);  // header, two rows, a blank row and the note
    CHECK(s.rows[1][0].kind == WorkbookCell::Kind::text);
    CHECK(s.rows[1][1].number == 30);
    CHECK(s.rows[1][2].number == 0.0832684569401);  // not the 4 digits of the CSV
    CHECK(s.rows[1][2].format == WorkbookCell::Format::scientific);
    CHECK(s.rows[2][1].number == 2.309401077);
    CHECK(s.rows[2][2].kind == WorkbookCell::Kind::text);
    CHECK(s.rows[2][2].text == "3.16e-401");  // 10^-400.5 = 3.162e-401
    CHECK(s.rows[4][0].text.find("1E-308") != std::string::npos);
    CHECK(table_sheet("T", {rows[0], rows[1]}).rows.size() == 2);  // no note without such a p-value
}
