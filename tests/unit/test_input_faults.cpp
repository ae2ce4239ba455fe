// Faults in what is read (issue 17): numbers that cannot be used are refused where they stand,
// duplicate keys in a document, text encodings and binary files. Every input is written here
// by hand; what it must give is common practice (RFC 8259 objects with unique names, the
// Unicode byte-order marks of UTF-8 and UTF-16, the published file signatures of PNG, PDF, zip).
#include <doctest/doctest.h>

#include "json_reader.hpp"
#include "number_reading.hpp"
#include "paste_parser.hpp"
#include "text_decoding.hpp"

using namespace tallyproof;

TEST_CASE("a number out of range is refused wherever it stands, never taken for a header") {
    ParsedInput p = parse_input("A\t1e400\nB\t5\n");
    REQUIRE_FALSE(p.status.ok);
    CHECK(p.status.line == 1);
    CHECK(p.status.column == 2);
    CHECK(p.status.message == "Line 1, column 2: \"1e400\" is too large; expected a count below 2^53.");
    p = parse_input("A\t5\nB\t1e400\n");
    CHECK(p.status.line == 2);
    p = parse_input("A\tNaN\nB\t5\nC\t6\n");  // was a header row
    CHECK(p.status.line == 1);
    p = parse_input("A\t-inf\nB\t5\nC\t6\n");
    CHECK(p.status.line == 1);
    p = parse_input("A\t#N/A\nB\t5\nC\t6\n");
    CHECK(p.status.line == 1);
    p = parse_input("Fruit\tCount\nA\t5\nB\t6\n");  // a real header row is still one
    REQUIRE(p.status.ok);
    CHECK(p.categories == std::vector<std::string>{"A", "B"});
    p = parse_input("1e400\n5\n6\n");  // a column of counts: the first cell is not a header
    CHECK_FALSE(p.status.ok);
    CHECK(p.status.line == 1);
}

TEST_CASE("unusable numbers are recognised with either decimal mark") {
    for (const char* cell : {"1e400", "-1E+999", "1,5e400", "1e-400", "NaN", "-Inf", "+infinity", "\xE2\x88\x9E", "#DIV/0!", "#n/a"})
        CHECK_MESSAGE(is_unusable_number(cell), cell);
    for (const char* cell : {"12", "1e300", "Total", "Infinite", "n/a", "", "1e-300"})
        CHECK_FALSE_MESSAGE(is_unusable_number(cell), cell);
    const NumberReading r = read_number("1e400", DecimalMark::point);
    CHECK_FALSE(r.ok);
    CHECK(r.out_of_range);
}

TEST_CASE("a document with a duplicate key is refused, naming the key and where it stands") {
    JsonValue v;
    Status s = parse_json("{\"observed\":[3,5,2],\"alpha\":0.05,\"alpha\":0.9}", &v);
    REQUIRE_FALSE(s.ok);
    CHECK(s.message == "Not a valid document: the key \"alpha\" appears twice (line 1, column 34; first at line 1, "
                       "column 21); keep one of them.");
    s = parse_json("{\"model\":{\"kind\":\"shares\",\n\"kind\":\"equal\"}}", &v);
    REQUIRE_FALSE(s.ok);
    CHECK(s.message.find("\"kind\" appears twice (line 2, column 1; first at line 1, column 11)") != std::string::npos);
    std::string big = "{";  // past the linear scan: the index finds it too
    for (int i = 0; i < 40; ++i) big += "\"k" + std::to_string(i) + "\":" + std::to_string(i) + ",";
    s = parse_json(big + "\"k7\":1}", &v);
    REQUIRE_FALSE(s.ok);
    CHECK(s.message.find("\"k7\" appears twice") != std::string::npos);
    CHECK(parse_json(big + "\"k40\":1}", &v).ok);
    CHECK(parse_json("{\"a\":{\"x\":1},\"b\":{\"x\":2}}", &v).ok);  // the same name in two objects is fine
}

TEST_CASE("text decoding: UTF-8, UTF-16 with and without a mark, Windows-1252, binary refused") {
    std::string b = "\xEF\xBB\xBF" "A\t3\n";
    TextDecoding d = decode_text(&b);
    CHECK(d.status.ok);
    CHECK(d.encoding == TextEncoding::utf8_with_mark);
    CHECK(b == "A\t3\n");
    // "é😀\n" in UTF-16 LE with a mark: U+00E9, the pair D83D DE00, U+000A (Unicode 15 §3.9).
    b = std::string("\xFF\xFE\xE9\x00\x3D\xD8\x00\xDE\x0A\x00", 10);
    d = decode_text(&b);
    CHECK(d.encoding == TextEncoding::utf16le);
    CHECK(b == "\xC3\xA9\xF0\x9F\x98\x80\n");
    b = std::string("\x00" "A\x00\t\x00" "3\x00\n", 8);  // big-endian, no mark: zeros on the even bytes
    d = decode_text(&b);
    CHECK(d.encoding == TextEncoding::utf16be);
    CHECK(b == "A\t3\n");
    CHECK(d.notice == "The text was read as UTF-16 big-endian (it has no byte-order mark).");
    b = std::string("\xFF\xFE\x00\xD8" "A\x00", 6);  // an unpaired high surrogate
    d = decode_text(&b);
    CHECK(b == "\xEF\xBF\xBD" "A");
    CHECK(d.notice.find("1 unpaired surrogate") != std::string::npos);
    b = "caf\xE9 \x80\n";  // Windows-1252: é and the euro sign at 0x80 (WHATWG Encoding Standard)
    d = decode_text(&b);
    CHECK(d.encoding == TextEncoding::windows1252);
    CHECK(b == "caf\xC3\xA9 \xE2\x82\xAC\n");
    b = "{\"categories\":[\"caf\xE9\"]}";  // a JSON document must be UTF-8: left for its reader
    d = decode_text(&b);
    CHECK(d.encoding == TextEncoding::utf8);
    CHECK(b == "{\"categories\":[\"caf\xE9\"]}");
    b = "na\xC3\xAFve caf\xC3\xA9 \xFF\n";  // mostly UTF-8: the stray byte is left for the readers
    d = decode_text(&b);
    CHECK(d.encoding == TextEncoding::utf8);
    CHECK(d.notice == "The text is UTF-8 but 1 byte is not; they are shown as \xEF\xBF\xBD.");
    b = std::string("A\t3\nB\x00\t5\n", 9);
    d = decode_text(&b);
    REQUIRE_FALSE(d.status.ok);
    CHECK(d.status.message.find("NUL byte (byte 6)") != std::string::npos);
    b = "\x89PNG\r\n\x1A\n";
    CHECK(decode_text(&b).status.message.rfind("This is not text: it looks like a PNG image.", 0) == 0);
    b = "%PDF-1.7\n";
    CHECK(decode_text(&b).status.message.find("a PDF document") != std::string::npos);
    b = std::string("\xFF\xFE\x00\x00", 4);
    CHECK(decode_text(&b).status.message.find("UTF-32") != std::string::npos);
    b = "";
    CHECK(decode_text(&b).status.ok);
}
