// Digit laws, digit extraction from text and the mean absolute deviation with Nigrini's bands,
// against mpmath, published Benford tables, closed forms and the documented extraction rules.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <fstream>
#include <map>
#include <sstream>
#include <string>

#include "digit_extraction.hpp"
#include "digit_laws.hpp"
#include "mean_absolute_deviation.hpp"

using namespace tallyproof;

namespace {

bool contains(const std::string& s, const char* part) { return s.find(part) != std::string::npos; }

// tests/reference/digit_laws.csv as "test|digit" -> probability.
std::map<std::string, double> load_digit_laws() {
    std::map<std::string, double> m;
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/digit_laws.csv");
    std::string line;
    bool header = true;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        if (header) { header = false; continue; }
        std::stringstream ss(line);
        std::string t, d, p;
        std::getline(ss, t, ',');
        std::getline(ss, d, ',');
        std::getline(ss, p, ',');
        m[t + "|" + d] = std::stod(p);
    }
    return m;
}

int slot(const DigitTally& t, int digit) {
    for (std::size_t i = 0; i < t.digits.size(); ++i)
        if (t.digits[i] == digit) return static_cast<int>(i);
    return -1;
}

double count_of(const DigitTally& t, int digit) {
    const int i = slot(t, digit);
    return i < 0 ? -1 : t.counts[i];
}

}  // namespace

TEST_CASE("Benford probabilities against mpmath") {
    // mpmath 1.2 at 40 digits (tests/reference/digit_laws.csv); log1p keeps ~1 ulp, 2e-15 allowed.
    const auto ref = load_digit_laws();
    REQUIRE(ref.size() == 9 + 10 + 90);
    for (const auto& [key, p] : ref) {
        CAPTURE(key);
        const std::string test = key.substr(0, key.find('|'));
        const int d = std::stoi(key.substr(key.find('|') + 1));
        const double got = test == "first" ? benford_first_digit(d)
                         : test == "second" ? benford_second_digit(d) : benford_first_two_digits(d);
        CHECK(got == doctest::Approx(p).epsilon(2e-15));
    }
}

TEST_CASE("Benford probabilities against Nigrini (2012), Table 5.1") {
    // Nigrini (2012), "Benford's Law", Wiley, Table 5.1, five decimals; recalled from memory and
    // confirmed by the mpmath values above.
    const double first[] = {.30103, .17609, .12494, .09691, .07918, .06695, .05799, .05115, .04576};
    const double second[] = {.11968, .11389, .10882, .10433, .10031, .09668, .09337, .09035, .08757, .08500};
    for (int d = 1; d <= 9; ++d) CHECK(std::fabs(benford_first_digit(d) - first[d - 1]) <= 0.5e-5);
    for (int d = 0; d <= 9; ++d) CHECK(std::fabs(benford_second_digit(d) - second[d]) <= 0.5e-5);
}

TEST_CASE("digit laws: closed forms, categories and bad digits") {
    // Closed forms: the first-two shares of a first digit add up to its first-digit share
    // (log10 telescopes); every law sums to 1; last digits are 1/10 and 1/5.
    for (int d = 1; d <= 9; ++d) {
        double s = 0;
        for (int e = 0; e <= 9; ++e) s += benford_first_two_digits(10 * d + e);
        CHECK(s == doctest::Approx(benford_first_digit(d)).epsilon(1e-14));
        CHECK(benford_first_digit(d) == doctest::Approx(std::log10(1.0 + 1.0 / d)).epsilon(1e-15));
    }
    for (int e = 0; e <= 9; ++e) {
        double s = 0;
        for (int d = 1; d <= 9; ++d) s += benford_first_two_digits(10 * d + e);
        CHECK(s == doctest::Approx(benford_second_digit(e)).epsilon(1e-14));
    }
    for (DigitTest t : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last, DigitTest::last_even}) {
        CAPTURE(digit_test_name(t));
        const auto v = digit_values(t);
        const auto p = digit_probabilities(t);
        REQUIRE(v.size() == p.size());
        double s = 0;
        for (double x : p) s += x;
        CHECK(s == doctest::Approx(1.0).epsilon(1e-15));
    }
    CHECK(digit_values(DigitTest::first).size() == 9);
    CHECK(digit_values(DigitTest::first).front() == 1);
    CHECK(digit_values(DigitTest::second).size() == 10);
    CHECK(digit_values(DigitTest::first_two).size() == 90);
    CHECK(digit_values(DigitTest::first_two).back() == 99);
    CHECK(digit_values(DigitTest::last_even) == std::vector<int>{0, 2, 4, 6, 8});
    for (double p : digit_probabilities(DigitTest::last)) CHECK(p == 0.1);
    for (double p : digit_probabilities(DigitTest::last_even)) CHECK(p == 0.2);
    CHECK(std::isnan(benford_first_digit(0)));
    CHECK(std::isnan(benford_first_digit(10)));
    CHECK(std::isnan(benford_second_digit(-1)));
    CHECK(std::isnan(benford_second_digit(10)));
    CHECK(std::isnan(benford_first_two_digits(9)));
    CHECK(std::isnan(benford_first_two_digits(100)));
}

TEST_CASE("reading number tokens as written") {
    // The documented rules (digit_extraction.hpp): sign ignored, leading zeros skipped, digits
    // kept as written, commas only as thousands separators.
    NumberToken t = read_number_token("0.0347");
    CHECK(t.is_number);
    CHECK(t.significant == "347");
    CHECK(t.last_digit == '7');
    t = read_number_token(" 12.50 ");
    CHECK(t.significant == "1250");
    CHECK(t.last_digit == '0');
    CHECK(t.magnitude == 12.5);
    t = read_number_token("-1,234.5");
    CHECK(t.is_number);
    CHECK(t.significant == "12345");
    CHECK(t.magnitude == 1234.5);
    t = read_number_token("+3.");
    CHECK(t.is_number);
    CHECK(t.last_digit == '3');
    t = read_number_token(".5");
    CHECK(t.significant == "5");
    t = read_number_token("1.2E+05");
    CHECK(t.is_number);
    CHECK(t.has_exponent);
    CHECK(t.significant == "12");
    CHECK(t.magnitude == 120000);
    CHECK(read_number_token("-0.000").is_zero);
    CHECK(read_number_token("0").is_zero);
    for (const char* bad : {"", "   ", "-", ".", "abc", "12,5", "1,23", ",123", "1,2345", "$12", "12a", "1e", "1e+",
                            "1..2", "--3", "1 2", "1.2.3"}) {
        CAPTURE(bad);
        CHECK_FALSE(read_number_token(bad).is_number);
    }
    CHECK(read_number_token("12,345,678").is_number);
}

TEST_CASE("first and second digits: leading zeros skipped, short values excluded") {
    const std::vector<std::string> v = {"0.0347", "-7", "7.0", "123", "12.50", "abc", "0", "", "9e3", "0.5"};
    const DigitTally f = tally_digits(v, DigitTest::first);
    REQUIRE(f.status.ok);
    CHECK(f.values == 10);
    CHECK(f.used == 7);
    CHECK(count_of(f, 3) == 1);
    CHECK(count_of(f, 7) == 2);
    CHECK(count_of(f, 1) == 2);
    CHECK(count_of(f, 9) == 1);
    CHECK(count_of(f, 5) == 1);
    CHECK(f.excluded_for(DigitExclusion::not_a_number) == 2);
    CHECK(f.excluded_for(DigitExclusion::zero) == 1);
    CHECK(f.first_excluded[static_cast<int>(DigitExclusion::not_a_number)] == 6);
    CHECK(f.notes.size() == 2);

    const DigitTally s = tally_digits(v, DigitTest::second);
    REQUIRE(s.status.ok);
    CHECK(count_of(s, 4) == 1);  // "0.0347"
    CHECK(count_of(s, 0) == 1);  // "7.0": the written 0 counts
    CHECK(count_of(s, 2) == 2);  // "123", "12.50"
    CHECK(s.used == 4);
    CHECK(s.excluded_for(DigitExclusion::too_few_digits) == 3);  // "-7", "9e3", "0.5"
    CHECK(s.first_excluded[static_cast<int>(DigitExclusion::too_few_digits)] == 2);
    CHECK(contains(s.notes.back(), "too few significant digits"));
}

TEST_CASE("first-two digits: Nigrini's floor of 10 by default") {
    const std::vector<std::string> v = {"7.5", "0.0347", "10", "99.1", "1000", "45,000", "3"};
    const DigitTally t = tally_digits(v, DigitTest::first_two);
    REQUIRE(t.status.ok);
    CHECK(t.used == 4);
    CHECK(count_of(t, 10) == 2);
    CHECK(count_of(t, 99) == 1);
    CHECK(count_of(t, 45) == 1);
    CHECK(t.excluded_for(DigitExclusion::below_minimum) == 3);
    DigitExtractionOptions o;
    o.minimum_absolute_value = 0.0;
    const DigitTally u = tally_digits(v, DigitTest::first_two, o);
    CHECK(u.used == 6);
    CHECK(count_of(u, 75) == 1);
    CHECK(count_of(u, 34) == 1);
    CHECK(u.excluded_for(DigitExclusion::too_few_digits) == 1);  // "3"
}

TEST_CASE("last digit: the last written digit, decimals included") {
    const std::vector<std::string> v = {"12.50", "13", "7", "1.2e5", "0.25", "1,000"};
    const DigitTally t = tally_digits(v, DigitTest::last);
    REQUIRE(t.status.ok);
    CHECK(count_of(t, 0) == 2);
    CHECK(count_of(t, 3) == 1);
    CHECK(count_of(t, 7) == 1);
    CHECK(count_of(t, 5) == 1);
    CHECK(t.excluded_for(DigitExclusion::exponent_notation) == 1);
    DigitExtractionOptions o;
    o.minimum_significant_digits = 3;
    const DigitTally u = tally_digits(v, DigitTest::last, o);
    CHECK(u.used == 2);  // "12.50", "1,000"
    CHECK(u.excluded_for(DigitExclusion::too_few_digits) == 4);  // "13", "7", "1.2e5", "0.25"

    const DigitTally e = tally_digits({"12", "14", "13", "20", "8", "7.6"}, DigitTest::last_even);
    REQUIRE(e.status.ok);
    CHECK(e.digits == std::vector<int>{0, 2, 4, 6, 8});
    CHECK(e.counts == std::vector<double>{1, 1, 1, 1, 1});
    CHECK(e.excluded_for(DigitExclusion::odd_last_digit) == 1);
    CHECK(contains(e.notes.back(), "contradicts"));
}

TEST_CASE("cell digits agree with reading the canonical form, in every written form") {
    // The reference is the two-step reading the one-pass cell_digits replaces: read_number's
    // canonical "-1234.50e3" form (number_reading.hpp), then read_number_token on it.
    std::vector<std::string> cells = {
        "1234.50", "0.0347", "-0.000", "0", "7", "5.", ".5", "-.5", "12,5", "1,234.5", "1.234,5", "1 234,75",
        "$1,234.50", "\xE2\x82\xAC 250", "(312.00)", "\xE2\x88\x92" "45", "9e3", "1.2E+05", "1e400", "1e-400", "n/a", "",
        " 12.50 ", "-", ".", "-.", "1.2.3", "12%", "+3", "1\xC2\xA0" "234", "7'500.25", "\xC2\xA3" "6.10", "00012.30",
        "0.000", "10", "99.1", "3", "45,000", "123456789012345678901234", "0.00000000000000000000000012345",
        std::string(200, '9'), std::string(201, '9'), "-" + std::string(199, '1'), "1,23", "12a", "--3"};
    std::uint64_t state = 42;  // plain amounts of 1 to 9 digits, some with decimals (Knuth's MMIX LCG)
    for (int i = 0; i < 2000; ++i) {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        std::string c = std::to_string((state >> 20) % 1000000000ULL >> ((state >> 8) % 28));
        if (state & 1) c.insert(c.size() - std::min<std::size_t>(c.size(), (state >> 4) % 4), ".");
        if (state & 2) c.insert(0, "-");
        cells.push_back(c);
    }
    for (const auto& cell : cells)
        for (DecimalMark mark : {DecimalMark::point, DecimalMark::comma}) {
            CAPTURE(cell);
            CAPTURE(mark == DecimalMark::point);
            std::string canonical;
            const NumberReading n = read_number(cell, mark, &canonical);
            const NumberToken t = read_number_token(n.ok ? canonical : "x");
            for (bool with_magnitude : {false, true}) {
                const WrittenDigits w = cell_digits(cell, mark, with_magnitude);
                REQUIRE(w.is_number == t.is_number);
                if (!w.is_number) continue;
                CHECK(w.is_zero == t.is_zero);
                CHECK(w.has_exponent == t.has_exponent);
                CHECK(w.significant == static_cast<int>(t.significant.size()));
                CHECK(w.first == (t.significant.size() > 0 ? t.significant[0] : 0));
                CHECK(w.second == (t.significant.size() > 1 ? t.significant[1] : 0));
                CHECK(w.last == t.last_digit);
                if (with_magnitude) CHECK(w.magnitude == t.magnitude);
            }
        }
}

TEST_CASE("the streamed digit counter gives tally_digits' counts and first exclusions") {
    const std::vector<std::string> v = {"0.0347", "-7", "7.0", "123", "12.50", "abc", "0", "", "9e3", "0.5",
                                        "1,234", "13", "8", "1.2e5", "45,000"};
    for (DigitTest test : {DigitTest::first, DigitTest::second, DigitTest::first_two, DigitTest::last, DigitTest::last_even}) {
        CAPTURE(static_cast<int>(test));
        const DigitTally whole = tally_digits(v, test);
        DigitCounter counter(test);
        for (const auto& cell : v) counter.add_cell(cell, DecimalMark::point);
        const DigitTally& streamed = counter.tally();
        CHECK(streamed.counts == whole.counts);
        CHECK(streamed.excluded == whole.excluded);
        CHECK(streamed.first_excluded == whole.first_excluded);
        CHECK(streamed.values == whole.values);
        CHECK(streamed.used == whole.used);
    }
}

TEST_CASE("no usable value is a refusal, with the tally still filled") {
    const DigitTally t = tally_digits({"x", "0", "7"}, DigitTest::second);
    CHECK_FALSE(t.status.ok);
    CHECK(contains(t.status.message, "None of the 3 values"));
    CHECK(t.counts.size() == 10);
    CHECK(t.used == 0);
    CHECK_FALSE(tally_digits({}, DigitTest::first).status.ok);
}

TEST_CASE("mean absolute deviation and Nigrini's conformity bands") {
    // Cut-offs from Nigrini (2012), Table 7.1 (from memory). Observed shares are built as the
    // law plus known shifts, so the MAD is known in closed form.
    SUBCASE("exact Benford shares have MAD 0") {
        std::vector<double> c;
        for (double p : digit_probabilities(DigitTest::first)) c.push_back(1e6 * p);
        const MeanAbsoluteDeviation m = mean_absolute_deviation(c, DigitTest::first);
        REQUIRE(m.status.ok);
        CHECK(m.mad < 1e-16);
        CHECK(m.band == Conformity::close);
        CHECK(std::string(m.label) == "Close conformity");
    }
    SUBCASE("first digit: moving delta from digit 2 to digit 1 gives MAD 2 delta / 9") {
        const std::pair<double, Conformity> cases[] = {{0.005, Conformity::close}, {0.010, Conformity::acceptable},
                                                       {0.014, Conformity::marginal}, {0.020, Conformity::nonconformity}};
        for (const auto& [mad, band] : cases) {
            CAPTURE(mad);
            auto p = digit_probabilities(DigitTest::first);
            p[0] += 4.5 * mad;
            p[1] -= 4.5 * mad;
            for (double& x : p) x *= 5000;
            const MeanAbsoluteDeviation m = mean_absolute_deviation(p, DigitTest::first);
            REQUIRE(m.status.ok);
            CHECK(m.mad == doctest::Approx(mad).epsilon(1e-12));
            CHECK(m.band == band);
        }
    }
    SUBCASE("second and first-two digits: alternating shifts of delta give MAD delta") {
        const std::pair<double, Conformity> second[] = {{0.007, Conformity::close}, {0.009, Conformity::acceptable},
                                                        {0.011, Conformity::marginal}, {0.013, Conformity::nonconformity}};
        for (const auto& [mad, band] : second) {
            auto p = digit_probabilities(DigitTest::second);
            for (std::size_t i = 0; i < p.size(); ++i) p[i] += (i % 2 ? -mad : mad);
            const MeanAbsoluteDeviation m = mean_absolute_deviation(p, DigitTest::second);
            CHECK(m.mad == doctest::Approx(mad).epsilon(1e-12));
            CHECK(m.band == band);
        }
        const std::pair<double, Conformity> two[] = {{0.0011, Conformity::close}, {0.0015, Conformity::acceptable},
                                                     {0.0020, Conformity::marginal}, {0.0030, Conformity::nonconformity}};
        for (const auto& [mad, band] : two) {
            auto p = digit_probabilities(DigitTest::first_two);
            for (std::size_t i = 0; i < p.size(); ++i) p[i] += (i % 2 ? -mad : mad);
            const MeanAbsoluteDeviation m = mean_absolute_deviation(p, DigitTest::first_two);
            CHECK(m.mad == doctest::Approx(mad).epsilon(1e-12));
            CHECK(m.band == band);
            CHECK(std::string(m.label) == conformity_label(band));
        }
    }
    SUBCASE("uniform first digits, closed form") {
        // mean over d of |1/9 - log10(1 + 1/d)|
        double expect = 0;
        for (int d = 1; d <= 9; ++d) expect += std::fabs(1.0 / 9 - std::log10(1.0 + 1.0 / d)) / 9;
        const MeanAbsoluteDeviation m = mean_absolute_deviation(std::vector<double>(9, 100.0), DigitTest::first);
        CHECK(m.mad == doctest::Approx(expect).epsilon(1e-14));
        CHECK(m.band == Conformity::nonconformity);
    }
    SUBCASE("last digits have no bands") {
        const MeanAbsoluteDeviation m = mean_absolute_deviation({12, 8, 10, 10, 10, 10, 10, 10, 10, 10}, DigitTest::last);
        REQUIRE(m.status.ok);
        CHECK(m.mad == doctest::Approx(0.04 / 10).epsilon(1e-12));  // (|0.12-0.1| + |0.08-0.1|) / 10
        CHECK(m.band == Conformity::not_applicable);
        double c[3];
        CHECK_FALSE(conformity_cutoffs(DigitTest::last, c));
        REQUIRE(conformity_cutoffs(DigitTest::second, c));
        CHECK(c[0] == 0.008);
        CHECK(c[2] == 0.012);
    }
    SUBCASE("bad input is refused") {
        CHECK(contains(mean_absolute_deviation({1, 2, 3}, DigitTest::first).status.message, "3 observed counts but 9"));
        CHECK_FALSE(mean_absolute_deviation(std::vector<double>(9, 0.0), DigitTest::first).status.ok);
        std::vector<double> neg(9, 1.0);
        neg[4] = -1;
        CHECK(contains(mean_absolute_deviation(neg, DigitTest::first).status.message, "digit 5"));
        neg[4] = std::nan("");
        CHECK_FALSE(mean_absolute_deviation(neg, DigitTest::first).status.ok);
        CHECK(contains(mean_absolute_deviation({1, 2}, {0.5, 0.6}).status.message, "sum to"));
        CHECK(mean_absolute_deviation({1, 3}, {0.5, 0.5}).mad == doctest::Approx(0.25).epsilon(1e-15));
        CHECK_FALSE(mean_absolute_deviation({}, {}).status.ok);
    }
}
