// Conformity (equivalence) test against SciPy 1.10 (tests/reference/conformity.csv): the p-value
// ncx2.cdf, the critical value ncx2.ppf, the smallest margin against a brentq root, the planning
// N against a scan of the same power formula and a 20000-sample multinomial simulation at that N.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "analysis_document.hpp"
#include "conformity.hpp"
#include "goodness_of_fit.hpp"
#include "noncentral_chi_square.hpp"
#include "noncentral_chi_square_quantile.hpp"
#include "reference_csv.hpp"
#include "report.hpp"

using namespace tallyproof;
using tallyproof_test::reference_rows;

TEST_CASE("conformity.csv: p, critical value, smallest margin and planning N (SciPy 1.10, simulation)") {
    int rows = 0;
    for (const auto& f : reference_rows("conformity.csv")) {
        REQUIRE(f.size() == 12);
        CAPTURE(f[0]);
        const double stat = std::stod(f[0]), n = std::stod(f[1]), df = std::stod(f[2]), alpha = std::stod(f[3]),
                     w0 = std::stod(f[4]);
        ConformityResult c;
        REQUIRE(conformity_test(stat, n, df, alpha, w0, &c).ok);
        CHECK(c.p_value.p == doctest::Approx(std::stod(f[5])).epsilon(1e-8));          // ncx2.cdf
        CHECK(c.critical_value == doctest::Approx(std::stod(f[6])).epsilon(1e-8));     // ncx2.ppf
        CHECK(c.smallest_margin_w == doctest::Approx(std::stod(f[7])).epsilon(1e-7));  // brentq root
        CHECK(c.conforms == (std::stod(f[5]) < alpha));
        // At the smallest margin the p-value is alpha.
        if (c.smallest_margin_w > 0)
            CHECK(noncentral_chi_square_lower_tail(stat, df, n * c.smallest_margin_w * c.smallest_margin_w) ==
                  doctest::Approx(alpha).epsilon(1e-6));
        double needed = 0;
        REQUIRE(conformity_sample_size(std::stod(f[8]), w0, std::stod(f[9]), alpha, df, &needed).ok);
        CHECK(needed == std::stod(f[10]));                                    // scan of the SciPy power
        CHECK(std::fabs(std::stod(f[11]) - std::stod(f[9])) < 0.015);         // simulated power at that N
        CHECK(conformity_power(std::stod(f[8]), w0, needed, alpha, df) >= std::stod(f[9]));
        CHECK(conformity_power(std::stod(f[8]), w0, needed - 1, alpha, df) < std::stod(f[9]));
        ++rows;
    }
    CHECK(rows >= 7);
}

TEST_CASE("noncentral quantile round trips through the lower tail") {
    for (double df : {1.0, 3.0, 10.0})
        for (double lambda : {0.0, 0.5, 12.0, 400.0})
            for (double p : {1e-6, 0.05, 0.5, 0.95}) {
                const double x = noncentral_chi_square_quantile(p, df, lambda);
                CHECK(noncentral_chi_square_lower_tail(x, df, lambda) == doctest::Approx(p).epsilon(1e-9));
            }
    CHECK(std::isnan(noncentral_chi_square_quantile(0, 2, 1)));
    CHECK(std::isnan(noncentral_chi_square_quantile(0.5, 0, 1)));
}

TEST_CASE("a p-value below double range keeps its logarithm") {
    ConformityResult c;
    REQUIRE(conformity_test(0.5, 1e5, 2, 0.05, 0.3, &c).ok);  // noncentrality 9000: lower tail ~ 1e-1950
    CHECK(c.p_value.log10_p < -300);
    CHECK(std::isfinite(c.p_value.log10_p));
    CHECK(c.conforms);
    // Continuity with the direct value where both exist (noncentrality 600).
    ConformityResult d;
    REQUIRE(conformity_test(0.5, 1e5, 2, 0.05, std::sqrt(600 / 1e5), &d).ok);
    CHECK(d.p_value.p > 0);
}

TEST_CASE("conformity through the analysis: verdicts for each goal, refusals, document round trip") {
    Analysis a;
    REQUIRE(read_analysis_document(R"({"categories":["A","B","C"],"observed":[330,352,338],)"
                                   R"("model":{"kind":"equal"},"conformity":{"margin_w":0.1}})", &a).ok);
    CHECK(a.conformity.requested);
    Result r = analyse(a);
    REQUIRE(r.conformity);
    REQUIRE(r.conformity->status.ok);
    CHECK(r.conformity->conforms);
    CHECK(conformity_verdict(r).find("conform to the stated mix within w < 0.10") != std::string::npos);
    CHECK(report_json(a, r).find("\"conformity\":{\"margin_w\":0.1,\"margin_points\":") != std::string::npos);
    Analysis back;
    REQUIRE(read_analysis_document(write_analysis_document(a), &back).ok);
    CHECK(back.conformity.margin_w == 0.1);

    a.observed = {30, 52, 38};  // N = 120: not shown
    r = analyse(a);
    REQUIRE(r.conformity);
    CHECK_FALSE(r.conformity->conforms);
    CHECK(conformity_verdict(r).find("is not shown") != std::string::npos);
    CHECK(conformity_verdict(r).find("with N = 120 the data allow only w < ") != std::string::npos);

    // Fitted parameters: explained, the departure test still shown.
    Analysis f;
    f.categories = {"0", "1", "2", "3 or more"};
    f.observed = {40, 35, 17, 8};
    f.model.kind = ModelKind::poisson;
    f.conformity.requested = true;
    f.conformity.margin_w = 0.1;
    r = analyse(f);
    REQUIRE(r.status.ok);
    REQUIRE(r.conformity);
    CHECK_FALSE(r.conformity->status.ok);
    CHECK(r.conformity->status.message.find("fitted model") != std::string::npos);

    // A comparison with a previous sample: refused with the reason.
    Analysis c;
    c.categories = {"A", "B"};
    c.observed = {10, 20};
    c.model.kind = ModelKind::reference_sample;
    c.model.values = {12, 18};
    c.conformity.requested = true;
    c.conformity.margin_w = 0.1;
    r = analyse(c);
    REQUIRE(r.conformity);
    CHECK_FALSE(r.conformity->status.ok);

    // Margins outside (0, 1]
    Analysis bad;
    CHECK_FALSE(read_analysis_document(R"({"observed":[1,2],"conformity":{"margin_w":1.5}})", &bad).ok);
    CHECK_FALSE(read_analysis_document(R"({"observed":[1,2],"conformity":{"margin_w":0}})", &bad).ok);
    CHECK_FALSE(read_analysis_document(R"({"observed":[1,2],"conformity":{}})", &bad).ok);
    ConformityResult cr;
    CHECK_FALSE(conformity_test(1, 100, 2, 0.05, -0.1, &cr).ok);
    double n = 0;
    CHECK_FALSE(conformity_sample_size(0.2, 0.1, 0.8, 0.05, 2, &n).ok);  // true w beyond the margin
}

TEST_CASE("conformity at chi2 = 0, above noncentrality 1e5, and margins in percentage points") {
    ConformityResult c;
    // P(X <= 0) = 0 for the continuous noncentral chi-square: a perfect fit conforms (closed form).
    REQUIRE(conformity_test(0, 1000, 3, 0.05, 0.1, &c).ok);
    CHECK(c.p_value.p == 0);
    CHECK(c.conforms);
    // Noncentrality 100010 (N = 10001000, w0 = 0.1), the saddlepoint branch: SciPy 1.10
    // ncx2.cdf(x, 3, 100010) = 0.03894652640733179 at x = 98900, 0.20881572784212504 at 99500.
    const double n = 10001000;
    REQUIRE(conformity_test(98900, n, 3, 0.05, 0.1, &c).ok);
    CHECK(c.p_value.p == doctest::Approx(0.03894652640733179).epsilon(1e-4));
    CHECK(c.conforms);
    REQUIRE(conformity_test(99500, n, 3, 0.05, 0.1, &c).ok);
    CHECK(c.p_value.p == doctest::Approx(0.20881572784212504).epsilon(1e-4));
    CHECK(!c.conforms);
    // Margins in points: w0 = d sqrt(1/p1 + 1/p2) (closed form, docs/methods.md), both ways.
    const std::vector<double> equal4 = {0.25, 0.25, 0.25, 0.25};
    CHECK(margin_w_from_points(2, equal4) == doctest::Approx(0.02 * std::sqrt(8.0)));
    CHECK(margin_points_from_w(0.02 * std::sqrt(8.0), equal4) == doctest::Approx(2));
    CHECK(std::isnan(margin_w_from_points(0, equal4)));
    double w = 0, points = 0;
    CHECK(read_conformity_margin("2 pp", &w, &points));
    CHECK((std::isnan(w) && points == 2));
    CHECK(read_conformity_margin(" 1.5 percentage points", &w, &points));
    CHECK(points == 1.5);
    CHECK(read_conformity_margin("0.1", &w, &points));
    CHECK((w == 0.1 && std::isnan(points)));
    CHECK(!read_conformity_margin("small", &w, &points));
    // Typed with a decimal comma, as α and every typed number may be (the one typed-number reader).
    CHECK(read_conformity_margin("0,1", &w, &points));
    CHECK((w == 0.1 && std::isnan(points)));
    CHECK(read_conformity_margin("2,5 pp", &w, &points));
    CHECK(points == 2.5);
}
