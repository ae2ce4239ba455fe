// Number reading: cells written in the common locales. Every expected value is the number as
// a person reads the cell (common practice, CLDR-style grouping; no external source needed),
// written here as a C++ literal, which the compiler rounds correctly.
#include <doctest/doctest.h>

#include <cmath>

#include "number_reading.hpp"

using namespace tallyproof;

namespace {
double point(const char* s) { NumberReading r = read_number(s, DecimalMark::point); return r.ok ? r.value : NAN; }
double comma(const char* s) { NumberReading r = read_number(s, DecimalMark::comma); return r.ok ? r.value : NAN; }
}  // namespace

TEST_CASE("decimal point and comma, thousands separators of every kind") {
    CHECK(point("1234.5") == 1234.5);
    CHECK(point("1,234.5") == 1234.5);
    CHECK(point("1,234,567") == 1234567);
    CHECK(point("1 234") == 1234);
    CHECK(point("1'234.25") == 1234.25);
    CHECK(point("1\xC2\xA0" "234") == 1234);          // U+00A0 no-break space
    CHECK(point("1\xE2\x80\xAF" "234") == 1234);      // U+202F narrow no-break space
    CHECK(comma("1.234,5") == 1234.5);
    CHECK(comma("12,5") == 12.5);
    CHECK(comma("1 234,75") == 1234.75);
    CHECK(point("0.1") == 0.1);                        // correctly rounded, as the literal
    CHECK(point("123456789012345678901234") == 123456789012345678901234.0);  // strtod path
    CHECK(point("1.5e3") == 1500);
    CHECK(point("2E-2") == 0.02);
    CHECK(point(".5") == 0.5);
    CHECK(point("7.") == 7);
}

TEST_CASE("signs: currency, percent, accounting parentheses, Unicode minus") {
    CHECK(point("$1,234.50") == 1234.5);
    CHECK(comma("12,50 \xE2\x82\xAC") == 12.5);       // 12,50 €
    CHECK(point("\xC2\xA3" "7.20") == 7.2);           // £7.20
    CHECK(point("\xC2\xA5" "300") == 300);            // ¥300
    CHECK(point("-$5") == -5);
    CHECK(point("$-5") == -5);
    CHECK(point("(312.00)") == -312);
    CHECK(point("\xE2\x88\x92" "45") == -45);         // U+2212 minus
    const NumberReading pct = read_number("12.5%", DecimalMark::point);
    CHECK(pct.ok);
    CHECK(pct.percent);
    CHECK(pct.value == 12.5);                          // as written, not divided by 100
}

TEST_CASE("not numbers") {
    for (const char* s : {"", "abc", "1,23,456", "12,5", "1.2.3", "--5", "(5", "1e", "$", "%", "12 %$", "0,123", "1,2345",
                          "1 234,567.8", "inf", "nan", "1e999"})
        CHECK_MESSAGE(std::isnan(point(s)), s);
    CHECK(std::isnan(comma("1,234.5")));
}

TEST_CASE("canonical digits for digit tallies keep what was written") {
    std::string c;
    CHECK(read_number("$1,234.50", DecimalMark::point, &c).ok);
    CHECK(c == "1234.50");
    CHECK(read_number("(0,0340)", DecimalMark::comma, &c).ok);
    CHECK(c == "-0.0340");
    CHECK(read_number("1.234.567,8", DecimalMark::comma, &c).ok);
    CHECK(c == "1234567.8");
    CHECK(read_number("6.02e23", DecimalMark::point, &c).ok);
    CHECK(c == "6.02e23");
}

TEST_CASE("what one cell says about the decimal mark") {
    CHECK(decimal_mark_evidence("1,234") == MarkEvidence::ambiguous);
    CHECK(decimal_mark_evidence("1.234") == MarkEvidence::ambiguous);
    CHECK(decimal_mark_evidence("12,5") == MarkEvidence::comma);
    CHECK(decimal_mark_evidence("1,234,567") == MarkEvidence::point);
    CHECK(decimal_mark_evidence("1.234,5") == MarkEvidence::comma);
    CHECK(decimal_mark_evidence("0.123") == MarkEvidence::point);  // a group cannot start with 0
    CHECK(decimal_mark_evidence("42") == MarkEvidence::neutral);
    CHECK(decimal_mark_evidence("n/a") == MarkEvidence::not_a_number);
}

// read_typed_number: one reader for every typed number (fields of the page, options of the
// tool). Expected values are the numbers as written (decimal notation, common practice); the
// rules for ambiguous and unit-bearing text are ours, documented in number_reading.hpp.
TEST_CASE("typed numbers: either decimal mark, exponents, signs; the comma-only ambiguous form refused") {
    double v = -1;
    CHECK(read_typed_number("0.05", &v));
    CHECK(v == 0.05);
    v = -1;
    CHECK(read_typed_number("0,05", &v));  // typed as α where a paste would read it
    CHECK(v == 0.05);
    CHECK(read_typed_number(" .05 ", &v));
    CHECK(v == 0.05);
    CHECK(read_typed_number("+0.05", &v));
    CHECK(v == 0.05);
    CHECK(read_typed_number("1e-3", &v));
    CHECK(v == 0.001);
    CHECK(read_typed_number("2,5e-3", &v));
    CHECK(v == 0.0025);
    CHECK(read_typed_number("−0.5", &v));  // U+2212 minus
    CHECK(v == -0.5);
    CHECK(read_typed_number("1.234", &v));  // either mark reads it: the point, as typed numbers always were
    CHECK(v == 1.234);
    CHECK(read_typed_number("1,234.5", &v));
    CHECK(v == 1234.5);
    CHECK(read_typed_number("1.234,5", &v));
    CHECK(v == 1234.5);
    CHECK(read_typed_number("100 000", &v));
    CHECK(v == 100000);
    v = 7;
    CHECK_FALSE(read_typed_number("1,234", &v));  // 1.234 or 1234: refused, not guessed
    CHECK_FALSE(read_typed_number("5 %", &v));     // a field says its unit
    CHECK_FALSE(read_typed_number("5%", &v));
    CHECK_FALSE(read_typed_number("$5", &v));
    CHECK_FALSE(read_typed_number("", &v));
    CHECK_FALSE(read_typed_number("  ", &v));
    CHECK_FALSE(read_typed_number("0.05x", &v));
    CHECK_FALSE(read_typed_number("0x10", &v));
    CHECK_FALSE(read_typed_number("five", &v));
    CHECK(v == 7);  // left as it was
}

TEST_CASE("typed numbers: words for infinities and NaN, and numbers beyond the double range, for the caller's check") {
    double v = 0;
    for (const char* t : {"inf", "+inf", "Inf", "INFINITY", "∞"}) {
        CAPTURE(t);
        v = 0;
        CHECK(read_typed_number(t, &v));
        CHECK(v == HUGE_VAL);
    }
    for (const char* t : {"-inf", "-Inf", "−inf", "-∞"}) {
        CAPTURE(t);
        v = 0;
        CHECK(read_typed_number(t, &v));
        CHECK(v == -HUGE_VAL);
    }
    CHECK(read_typed_number("nan", &v));
    CHECK(std::isnan(v));
    CHECK(read_typed_number("1e400", &v));
    CHECK(v == HUGE_VAL);
    CHECK(read_typed_number("1e-400", &v));
    CHECK(v == 0);
}
