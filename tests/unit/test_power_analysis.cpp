// Power and sample size of the chi-square goodness-of-fit test against statsmodels 0.13, R 4.2
// (tests/reference/power.csv) and Cohen's (1988) tables; noncentral tails against closed forms.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <sstream>
#include <string>
#include <vector>

#include "noncentral_chi_square.hpp"
#include "power_analysis.hpp"

using namespace tallyproof;

TEST_CASE("every case of power.csv: power and smallest N") {
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/power.csv");
    std::string line;
    int rows = 0;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'w') continue;
        std::stringstream ss(line);
        std::vector<double> v;
        std::string cell;
        while (std::getline(ss, cell, ',')) v.push_back(std::strtod(cell.c_str(), nullptr));
        REQUIRE(v.size() == 8);
        const double w = v[0], n = v[1], alpha = v[2], df = v[3];
        CAPTURE(line);
        CHECK(gof_power(w, n, alpha, df) == doctest::Approx(v[4]).epsilon(1e-10));  // statsmodels 0.13
        CHECK(gof_power(w, n, alpha, df) == doctest::Approx(v[5]).epsilon(1e-10));  // R 4.2 pchisq(ncp=)
        double needed = 0;
        REQUIRE(gof_sample_size(w, v[6], alpha, df, &needed).ok);
        CHECK(needed == v[7]);  // ceil(statsmodels solve_power), confirmed with R at N and N-1
        ++rows;
    }
    CHECK(rows >= 30);
}

TEST_CASE("Cohen's sample-size table") {
    // Cohen 1988, Table 7.4.6 (alpha .05, df 1, power .80): N = 785 for w = .1, 88 for .3, 32 for
    // .5 — recalled from memory, and the same as ceil(statsmodels solve_power) in power.csv.
    double n = 0;
    REQUIRE(gof_sample_size(0.1, 0.8, 0.05, 1, &n).ok);
    CHECK(n == 785);
    REQUIRE(gof_sample_size(0.3, 0.8, 0.05, 1, &n).ok);
    CHECK(n == 88);
    REQUIRE(gof_sample_size(0.5, 0.8, 0.05, 1, &n).ok);
    CHECK(n == 32);
}

TEST_CASE("power for a stated alternative distribution") {
    // Closed form: p0 = (1/4,1/4,1/4,1/4), p1 = (.4,.2,.2,.2): w^2 = (.15^2 + 3 * .05^2) / .25 = 0.12.
    double w = 0;
    REQUIRE(cohens_w_of_alternative({.25, .25, .25, .25}, {.4, .2, .2, .2}, &w).ok);
    CHECK(w == doctest::Approx(std::sqrt(0.12)).epsilon(1e-14));
    double power = 0;
    REQUIRE(gof_power_for_alternative({.25, .25, .25, .25}, {.4, .2, .2, .2}, 100, 0.05, 3, &power).ok);
    CHECK(power == doctest::Approx(gof_power(std::sqrt(0.12), 100, 0.05, 3)).epsilon(1e-14));
    // statsmodels 0.13: GofChisquarePower().power(effect_size=sqrt(0.12), nobs=100, alpha=0.05, n_bins=4)
    CHECK(power == doctest::Approx(0.8402270751703965).epsilon(1e-9));
}

TEST_CASE("noncentral tails: limits and closed forms") {
    // lambda = 0 is the central chi-square; closed form df 2: Q = exp(-x/2).
    CHECK(noncentral_chi_square_upper_tail(3, 2, 0) == doctest::Approx(std::exp(-1.5)).epsilon(1e-14));
    // Upper + lower = 1 (common practice).
    CHECK(noncentral_chi_square_upper_tail(5, 3, 4) + noncentral_chi_square_lower_tail(5, 3, 4) == doctest::Approx(1).epsilon(1e-14));
    // Power at w = 0 is alpha (the test's size).
    CHECK(gof_power(0, 100, 0.05, 4) == doctest::Approx(0.05).epsilon(1e-12));
}

TEST_CASE("bad arguments: NaN or a Status naming the input") {
    CHECK(std::isnan(gof_power(-0.1, 100, 0.05, 1)));
    CHECK(std::isnan(gof_power(0.3, -1, 0.05, 1)));
    CHECK(std::isnan(gof_power(0.3, 100, 0, 1)));
    CHECK(std::isnan(gof_power(0.3, 100, 1, 1)));
    CHECK(std::isnan(gof_power(0.3, 100, 0.05, 0)));
    CHECK(std::isnan(gof_power(std::nan(""), 100, 0.05, 1)));
    CHECK(std::isnan(noncentral_chi_square_upper_tail(1, 2, -1)));
    CHECK(std::isnan(noncentral_chi_square_lower_tail(1, 0, 1)));
    double n = -1;
    Status s = gof_sample_size(0, 0.8, 0.05, 1, &n);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("w = 0") != std::string::npos);
    CHECK(n == -1);  // untouched on failure
    CHECK_FALSE(gof_sample_size(0.3, 1.0, 0.05, 1, &n).ok);
    CHECK_FALSE(gof_sample_size(0.3, 0.8, 1.5, 1, &n).ok);
    // Beyond df = 1e9 the tail sums are not trusted (they are checked to df = 1e6): refused.
    s = gof_sample_size(0.3, 0.8, 0.05, 1e12, &n);
    CHECK(s.message == "The degrees of freedom df = 1e+12 are too many; at most 1e9.");
    CHECK(std::isnan(gof_power(0.3, 100, 0.05, 1e12)));
    double w = 0;
    s = cohens_w_of_alternative({.5, .5}, {.5, .3}, &w);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("sum to 0.8") != std::string::npos);
    CHECK_FALSE(cohens_w_of_alternative({.5, .5}, {.2, .3, .5}, &w).ok);
    CHECK_FALSE(cohens_w_of_alternative({1.0, 0.0}, {.5, .5}, &w).ok);
    CHECK_FALSE(cohens_w_of_alternative({1.0}, {1.0}, &w).ok);
    double power = 0;
    CHECK_FALSE(gof_power_for_alternative({.5, .5}, {.4, .6}, 0, 0.05, 1, &power).ok);
}
