// Multiplicity adjustment against R 4.2's p.adjust (tests/reference/multiplicity.csv, made by
// tests/reference/generate_multiplicity.py), plus hand-worked cases and bad arguments.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <limits>
#include <map>
#include <sstream>

#include "multiplicity.hpp"

using namespace tallyproof;

namespace {

struct AdjustRow {
    std::string set, method;
    std::size_t index;
    double p, adjusted;
};

std::vector<AdjustRow> read_multiplicity_csv() {
    std::vector<AdjustRow> rows;
    for (const auto& f : tallyproof_test::reference_rows("multiplicity.csv")) {
        if (f.size() < 5) continue;
        rows.push_back({f[0], f[1], std::stoul(f[2]), std::strtod(f[3].c_str(), nullptr), std::strtod(f[4].c_str(), nullptr)});
    }
    return rows;
}

}  // namespace

TEST_CASE("p.adjust reference set (R 4.2)") {
    const auto rows = read_multiplicity_csv();
    REQUIRE(rows.size() > 100);
    // group rows by (set, method), keeping the index order
    std::map<std::pair<std::string, std::string>, std::vector<AdjustRow>> groups;
    for (const auto& r : rows) groups[{r.set, r.method}].push_back(r);
    for (const auto& [key, g] : groups) {
        CAPTURE(key.first);
        CAPTURE(key.second);
        MultiplicityMethod m;
        REQUIRE(multiplicity_method_from_name(key.second, &m));
        std::vector<double> p, lp, adj, ladj;
        for (const auto& r : g) {
            p.push_back(r.p);
            lp.push_back(r.p > 0 ? std::log10(r.p) : -INFINITY);
        }
        REQUIRE(adjust_p_values(p, m, &adj).ok);
        REQUIRE(adjust_log10_p_values(lp, m, &ladj).ok);
        for (std::size_t i = 0; i < g.size(); ++i) {
            CAPTURE(i);
            // same IEEE arithmetic in the same order as p.adjust: equal to the last bit
            CHECK(adj[i] == g[i].adjusted);
            if (g[i].adjusted > 0) CHECK(std::pow(10.0, ladj[i]) == doctest::Approx(g[i].adjusted).epsilon(1e-12));
            else CHECK(ladj[i] == -INFINITY);
        }
    }
}

TEST_CASE("hand-worked Holm, Bonferroni and BH") {
    // By hand, p = 0.01 0.04 0.03 (m = 3):
    //  Holm: sorted 0.01 0.03 0.04 times 3 2 1 = 0.03 0.06 0.04, running max 0.03 0.06 0.06.
    //  Bonferroni: 0.03 0.12 0.09.
    //  BH: ranks 1 2 3 -> 0.03, 0.045, 0.04; running min from the top: 0.04 0.04 0.03.
    std::vector<double> a;
    REQUIRE(adjust_p_values({0.01, 0.04, 0.03}, MultiplicityMethod::holm, &a).ok);
    CHECK(a[0] == doctest::Approx(0.03));
    CHECK(a[1] == doctest::Approx(0.06));
    CHECK(a[2] == doctest::Approx(0.06));
    REQUIRE(adjust_p_values({0.01, 0.04, 0.03}, MultiplicityMethod::bonferroni, &a).ok);
    CHECK(a[1] == doctest::Approx(0.12));
    CHECK(a[2] == doctest::Approx(0.09));
    REQUIRE(adjust_p_values({0.01, 0.04, 0.03}, MultiplicityMethod::benjamini_hochberg, &a).ok);
    CHECK(a[0] == doctest::Approx(0.03));
    CHECK(a[1] == doctest::Approx(0.04));
    CHECK(a[2] == doctest::Approx(0.04));
    REQUIRE(adjust_p_values({0.01, 0.04, 0.03}, MultiplicityMethod::none, &a).ok);
    CHECK(a[1] == 0.04);
    // capped at 1 (closed form: 3 * 0.6 > 1)
    REQUIRE(adjust_p_values({0.6, 0.7, 0.9}, MultiplicityMethod::bonferroni, &a).ok);
    CHECK(a[0] == 1.0);
    REQUIRE(adjust_p_values({}, MultiplicityMethod::holm, &a).ok);
    CHECK(a.empty());
}

TEST_CASE("log10 adjustment keeps p-values below the double range") {
    // By hand: Bonferroni with m = 2 adds log10 2 = 0.30103 to each log10 p.
    std::vector<double> a;
    REQUIRE(adjust_log10_p_values({-500, -0.1}, MultiplicityMethod::bonferroni, &a).ok);
    CHECK(a[0] == doctest::Approx(-500 + std::log10(2.0)).epsilon(1e-15));
    CHECK(a[1] == 0.0);  // 2 * 10^-0.1 > 1
    // Holm, m = 2: smallest times 2, next times 1 with the running max.
    REQUIRE(adjust_log10_p_values({-400, -600}, MultiplicityMethod::holm, &a).ok);
    CHECK(a[1] == doctest::Approx(-600 + std::log10(2.0)).epsilon(1e-15));
    CHECK(a[0] == doctest::Approx(-400).epsilon(1e-15));
}

TEST_CASE("bad p-values are refused") {
    std::vector<double> a;
    const double nan = std::numeric_limits<double>::quiet_NaN();
    Status s = adjust_p_values({0.1, 1.5}, MultiplicityMethod::holm, &a);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("number 2") != std::string::npos);
    CHECK_FALSE(adjust_p_values({-0.1}, MultiplicityMethod::bonferroni, &a).ok);
    CHECK_FALSE(adjust_p_values({nan}, MultiplicityMethod::benjamini_hochberg, &a).ok);
    CHECK_FALSE(adjust_log10_p_values({0.5}, MultiplicityMethod::holm, &a).ok);
    CHECK_FALSE(adjust_log10_p_values({nan}, MultiplicityMethod::holm, &a).ok);
    CHECK(a.empty());
    CHECK(adjust_log10_p_values({-INFINITY, -1}, MultiplicityMethod::holm, &a).ok);  // p = 0 is allowed
    CHECK(a[0] == -INFINITY);
}

TEST_CASE("method names round-trip") {
    for (MultiplicityMethod m : {MultiplicityMethod::holm, MultiplicityMethod::bonferroni,
                                 MultiplicityMethod::benjamini_hochberg, MultiplicityMethod::none}) {
        MultiplicityMethod back = MultiplicityMethod::none;
        CHECK(multiplicity_method_from_name(multiplicity_method_name(m), &back));
        CHECK(back == m);
    }
    MultiplicityMethod m;
    CHECK(multiplicity_method_from_name("fdr", &m));  // R's alias
    CHECK(m == MultiplicityMethod::benjamini_hochberg);
    CHECK_FALSE(multiplicity_method_from_name("hochberg", &m));  // not offered
}
