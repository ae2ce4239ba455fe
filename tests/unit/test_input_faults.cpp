// Faults in what is read (issue 17): numbers that cannot be used are refused where they stand,
// duplicate keys in a document, text encodings and binary files. Every input is written here
// by hand; what it must give is common practice (RFC 8259 objects with unique names, the
// Unicode byte-order marks of UTF-8 and UTF-16, the published file signatures of PNG, PDF, zip).
#include <doctest/doctest.h>

#include "json_reader.hpp"
#include "number_reading.hpp"
#include "paste_parser.hpp"

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
