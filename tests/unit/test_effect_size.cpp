// Cohen's w, Fei and their noncentrality confidence intervals against closed forms and an
// independent SciPy 1.10 ncx2 + brentq inversion (tests/reference/effect_size_ci.csv).
#include <doctest/doctest.h>

#include <cmath>
#include <limits>
#include <cstdlib>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "effect_size.hpp"

using namespace tallyproof;

TEST_CASE("point estimates: closed forms") {
    // Closed form: w = sqrt(X2 / N); Fei = sqrt(X2 / (N (1/p_min - 1))) (Ben-Shachar et al. 2023).
    CHECK(cohens_w(9, 100) == doctest::Approx(0.3).epsilon(1e-15));
    CHECK(fei(9, 100, 0.25) == doctest::Approx(std::sqrt(9.0 / 300)).epsilon(1e-15));
    // Closed form: with p_min = 1/2, 1/p_min - 1 = 1, so Fei = w.
    CHECK(fei(4, 100, 0.5) == doctest::Approx(cohens_w(4, 100)).epsilon(1e-15));
    // The largest X2 for N = 100, p_min = 0.1 is N (1/p_min - 1) = 900 (all counts in the rarest
    // category); Fei is 1 there and capped at 1 beyond.
    CHECK(fei(900, 100, 0.1) == doctest::Approx(1.0).epsilon(1e-15));
    CHECK(fei(1000, 100, 0.1) == 1.0);
}

TEST_CASE("Cohen's labels") {
    // Cohen 1988, ch. 7: small .1, medium .3, large .5.
    CHECK(std::string(cohens_w_label(0.05)) == "very small");
    CHECK(std::string(cohens_w_label(0.1)) == "small");
    CHECK(std::string(cohens_w_label(0.299)) == "small");
    CHECK(std::string(cohens_w_label(0.3)) == "medium");
    CHECK(std::string(cohens_w_label(0.5)) == "large");
    CHECK(std::string(cohens_w_label(std::nan(""))) == "undefined");
}

TEST_CASE("intervals: every case of effect_size_ci.csv") {
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/effect_size_ci.csv");
    std::string line;
    int rows = 0;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#' || line[0] == 'c') continue;
        std::stringstream ss(line);
        std::vector<double> v;
        std::string cell;
        while (std::getline(ss, cell, ',')) v.push_back(std::strtod(cell.c_str(), nullptr));
        REQUIRE(v.size() == 13);
        CAPTURE(line);
        const double x = v[0], n = v[1], df = v[2], pmin = v[3], level = v[4];
        double lo = -1, hi = -1;
        REQUIRE(noncentrality_interval(x, df, level, &lo, &hi).ok);
        // SciPy brentq roots (xtol 1e-14) of Boost-based ncx2; 1e-9 relative leaves room for both.
        CHECK(lo == doctest::Approx(v[5]).epsilon(1e-9));
        CHECK(hi == doctest::Approx(v[6]).epsilon(1e-9));
        EffectSizeInterval w, f;
        REQUIRE(cohens_w_interval(x, n, df, level, &w).ok);
        REQUIRE(fei_interval(x, n, df, pmin, level, &f).ok);
        CHECK(w.estimate == doctest::Approx(v[7]).epsilon(1e-14));
        CHECK(w.lower == doctest::Approx(v[8]).epsilon(1e-9));
        CHECK(w.upper == doctest::Approx(v[9]).epsilon(1e-9));
        CHECK(f.estimate == doctest::Approx(v[10]).epsilon(1e-14));
        CHECK(f.lower == doctest::Approx(v[11]).epsilon(1e-9));
        CHECK(f.upper == doctest::Approx(v[12]).epsilon(1e-9));
        if (v[5] == 0) CHECK(lo == 0.0);  // lower bound exactly 0 for a small statistic
        CHECK(w.level == level);
        ++rows;
    }
    CHECK(rows >= 15);
}

TEST_CASE("bad arguments: NaN or a Status naming the input") {
    CHECK(std::isnan(cohens_w(-1, 100)));
    CHECK(std::isnan(cohens_w(4, 0)));
    CHECK(std::isnan(fei(4, 100, 0)));
    CHECK(std::isnan(fei(4, 100, 1)));
    CHECK(std::isnan(fei(std::nan(""), 100, 0.2)));
    EffectSizeInterval out;
    Status s = cohens_w_interval(4, 100, 3, 1.0, &out);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("confidence level 1") != std::string::npos);
    CHECK_FALSE(cohens_w_interval(4, 100, 0, 0.95, &out).ok);
    CHECK_FALSE(cohens_w_interval(-4, 100, 3, 0.95, &out).ok);
    s = fei_interval(4, 100, 3, 1.5, 0.95, &out);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("p_min = 1.5") != std::string::npos);
    double lo, hi;
    CHECK_FALSE(noncentrality_interval(std::numeric_limits<double>::infinity(), 3, 0.95, &lo, &hi).ok);
}
