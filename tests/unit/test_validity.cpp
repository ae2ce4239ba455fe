// Validity rules from expected counts: the all-5 rule and Cochran's rule (Cochran 1954,
// Biometrics 10:417-451: none below 1, at most 20% below 5). Cases worked by hand below.
#include <doctest/doctest.h>

#include <cmath>
#include <limits>

#include "validity.hpp"

using namespace tallyproof;

TEST_CASE("every expected count at least 5") {
    ValidityReport r;
    REQUIRE(check_validity({10, 10, 10, 10, 10}, &r).ok);
    // By hand: min 10, nothing below 5 or 1.
    CHECK(r.categories == 5);
    CHECK(r.min_expected == 10);
    CHECK(r.below_5 == 0);
    CHECK(r.below_1 == 0);
    CHECK(r.all_at_least_5);
    CHECK(r.cochran_holds);
    CHECK(r.summary.find("at least 5") != std::string::npos);
}

TEST_CASE("exactly 5 and exactly 1 are not below their limits") {
    ValidityReport r;
    REQUIRE(check_validity({5, 5, 1, 20, 20}, &r).ok);
    // By hand: 1 < 5 once (20% of 5 cells, allowed), nothing below 1.
    CHECK(r.below_5 == 1);
    CHECK(r.below_1 == 0);
    CHECK(r.min_expected == 1);
    CHECK_FALSE(r.all_at_least_5);
    CHECK(r.cochran_holds);
    CHECK(r.summary.find("Cochran's rule holds") != std::string::npos);
}

TEST_CASE("Cochran's 20% boundary is inclusive") {
    ValidityReport r;
    // By hand: k = 10, two cells below 5 is 20% -> holds; three is 30% -> fails.
    REQUIRE(check_validity({4, 3, 10, 10, 10, 10, 10, 10, 10, 10}, &r).ok);
    CHECK(r.below_5 == 2);
    CHECK(r.share_below_5 == doctest::Approx(0.2));
    CHECK(r.cochran_holds);
    REQUIRE(check_validity({4, 3, 2, 10, 10, 10, 10, 10, 10, 10}, &r).ok);
    CHECK(r.below_5 == 3);
    CHECK_FALSE(r.cochran_holds);
    CHECK(r.summary.find("30%") != std::string::npos);
    CHECK(r.summary.find("more than the 20% allowed") != std::string::npos);
    // integer test: 5 * below_5 <= k, no rounding of 0.2
    CHECK(cochran_rule_holds(5, 1, 0));
    CHECK_FALSE(cochran_rule_holds(4, 1, 0));
    CHECK_FALSE(cochran_rule_holds(0, 0, 0));
}

TEST_CASE("a cell below 1 fails Cochran's rule even when few are below 5") {
    ValidityReport r;
    REQUIRE(check_validity({0.9, 10, 10, 10, 10, 10, 10, 10, 10, 10}, &r).ok);
    // By hand: one of 10 below 5 (10%) but it is below 1.
    CHECK(r.below_1 == 1);
    CHECK(r.below_5 == 1);
    CHECK(r.min_expected == doctest::Approx(0.9));
    CHECK_FALSE(r.cochran_holds);
    CHECK(r.summary.find("Cochran's rule fails") != std::string::npos);
    CHECK(r.summary.find("below 1") != std::string::npos);
    CHECK(r.summary.find("merge thin categories") != std::string::npos);
    CHECK(r.summary.find("exact or Monte Carlo") != std::string::npos);
    CHECK(r.summary.find("20% allowed") == std::string::npos);  // that part of the rule holds
}

TEST_CASE("both parts of Cochran's rule failing are both named") {
    ValidityReport r;
    REQUIRE(check_validity({0.5, 2, 8}, &r).ok);
    // By hand: below 1: 1 (0.5); below 5: 2 of 3 (67%).
    CHECK(r.below_1 == 1);
    CHECK(r.below_5 == 2);
    CHECK(r.summary.find("below 1") != std::string::npos);
    CHECK(r.summary.find("67%") != std::string::npos);
}

TEST_CASE("a zero expected count is below 1") {
    ValidityReport r;
    REQUIRE(check_validity({0, 50, 50, 50, 50}, &r).ok);
    CHECK(r.min_expected == 0);
    CHECK(r.below_1 == 1);
    CHECK_FALSE(r.cochran_holds);
}

TEST_CASE("bad expected counts are refused, naming the category") {
    ValidityReport r;
    CHECK_FALSE(check_validity({}, &r).ok);
    Status s = check_validity({5, -1, 5}, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("category 2") != std::string::npos);
    CHECK_FALSE(check_validity({5, std::numeric_limits<double>::quiet_NaN()}, &r).ok);
    CHECK_FALSE(check_validity({5, std::numeric_limits<double>::infinity()}, &r).ok);
    CHECK(r.categories == 0);  // nothing half-filled after a refusal
}
