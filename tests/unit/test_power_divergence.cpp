// Power-divergence statistics against SciPy 1.10, mpmath, closed forms and bad inputs.
#include <doctest/doctest.h>

#include "reference_csv.hpp"

#include <cmath>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "power_divergence.hpp"

using namespace tallyproof;
using tallyproof_test::split_numbers;

namespace {

PowerDivergence run(const std::vector<double>& o, const std::vector<double>& e, double lambda, bool williams = false) {
    PowerDivergence r;
    PowerDivergenceOptions opt;
    opt.lambda = lambda;
    opt.williams_correction = williams;
    const Status s = power_divergence(o, e, opt, &r);
    REQUIRE_MESSAGE(s.ok, s.message);
    return r;
}

}  // namespace

TEST_CASE("SciPy documentation examples of power_divergence") {
    // Source: SciPy 1.10 docs of scipy.stats.power_divergence, re-run here with SciPy 1.10.1:
    // power_divergence([16, 18, 16, 14, 12, 12], lambda_='log-likelihood') -> 2.006573162632538
    // and with f_exp=[16, 16, 16, 16, 16, 8] -> 3.3281031458963746.
    const std::vector<double> obs{16, 18, 16, 14, 12, 12};
    const std::vector<double> equal(6, 88.0 / 6);
    CHECK(run(obs, equal, power_lambda::log_likelihood).statistic == doctest::Approx(2.006573162632538).epsilon(1e-13));
    CHECK(run(obs, {16, 16, 16, 16, 16, 8}, 0).statistic == doctest::Approx(3.3281031458963746).epsilon(1e-13));
    // SciPy 1.10.1 run here: lambda_='cressie-read' -> 2.000849125939149, lambda_=-1 -> 2.0252977047283807.
    CHECK(run(obs, equal, power_lambda::cressie_read).statistic == doctest::Approx(2.000849125939149).epsilon(1e-13));
    CHECK(run(obs, equal, power_lambda::mod_log_likelihood).statistic ==
          doctest::Approx(2.0252977047283807).epsilon(1e-13));
    // Pearson: sum (O-E)^2/E = (1.333^2 + 3.333^2 + ... )/14.667 = 2 exactly (closed form).
    CHECK(run(obs, equal, power_lambda::pearson).statistic == doctest::Approx(2.0).epsilon(1e-14));
}

TEST_CASE("reference set: SciPy 1.10 and 50-digit mpmath") {
    std::ifstream in(TALLYPROOF_REFERENCE_DIR "/power_divergence.csv");
    REQUIRE(in.good());
    std::string line;
    int rows = 0;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        std::stringstream ss(line);
        std::string lam, o, e, sp, mp;
        std::getline(ss, lam, ',');
        std::getline(ss, o, ',');
        std::getline(ss, e, ',');
        std::getline(ss, sp, ',');
        std::getline(ss, mp, ',');
        const double lambda = std::stod(lam);
        CAPTURE(line);
        const PowerDivergence r = run(split_numbers(o), split_numbers(e), lambda);
        // mpmath evaluates the defining formula at 50 digits: our centred form must agree to
        // 1e-10 (the inputs' totals differ by ~1e-14, which the two forms weigh by 2/(l+1)).
        CHECK(r.statistic == doctest::Approx(std::stod(mp)).epsilon(1e-10));
        // SciPy's uncentred formula loses digits as lambda nears 0 or -1 (5e-7 relative seen at
        // lambda = 1e-6), so SciPy is compared only away from those, to 1e-11.
        const bool scipy_sound = std::fabs(lambda) > 1e-3 && std::fabs(lambda + 1) > 1e-2;
        if (sp != "nan" && scipy_sound) CHECK(r.statistic == doctest::Approx(std::stod(sp)).epsilon(1e-11));
        ++rows;
    }
    CHECK(rows >= 80);
}

TEST_CASE("contributions are non-negative and sum to the statistic") {
    const std::vector<double> obs{1, 0, 3, 9, 2}, exp(5, 3.0);
    for (double lambda : {1.0, 0.0, 2.0 / 3, -0.5, -0.75, 2.5}) {
        CAPTURE(lambda);
        const PowerDivergence r = run(obs, exp, lambda);
        double s = 0;
        for (double c : r.contributions) {
            CHECK(c >= 0);
            s += c;
        }
        CHECK(s == r.statistic);  // by definition: statistic is their left-to-right sum
    }
    // Pearson terms are (O-E)^2/E (closed form): category 4 gives 36/3 = 12; an empty one gives E = 3.
    const PowerDivergence p = run(obs, exp, 1);
    CHECK(p.contributions[3] == doctest::Approx(12.0).epsilon(1e-15));
    CHECK(p.contributions[1] == doctest::Approx(3.0).epsilon(1e-15));
    // G^2 term of an empty category: limit 2[0 log 0 - (0 - E)] = 2E (closed form, 0 log 0 = 0).
    CHECK(run(obs, exp, 0).contributions[1] == doctest::Approx(6.0).epsilon(1e-15));
    // Freeman-Tukey term 4 (sqrt O - sqrt E)^2 (Cressie & Read 1984, lambda = -1/2): O = 9, E = 3.
    CHECK(run(obs, exp, -0.5).contributions[3] == doctest::Approx(4 * std::pow(3 - std::sqrt(3.0), 2)).epsilon(1e-13));
}

TEST_CASE("closed forms of named members") {
    const std::vector<double> obs{43, 52, 25, 80}, exp{50, 50, 25, 75};
    double neyman = 0, ft = 0, g2 = 0, kl = 0;
    for (int i = 0; i < 4; ++i) {
        neyman += (obs[i] - exp[i]) * (obs[i] - exp[i]) / obs[i];        // Neyman: sum (O-E)^2/O
        ft += 4 * std::pow(std::sqrt(obs[i]) - std::sqrt(exp[i]), 2);    // Freeman-Tukey
        g2 += 2 * obs[i] * std::log(obs[i] / exp[i]);                    // G^2
        kl += 2 * exp[i] * std::log(exp[i] / obs[i]);                    // Kullback
    }
    CHECK(run(obs, exp, power_lambda::neyman).statistic == doctest::Approx(neyman).epsilon(1e-13));
    CHECK(run(obs, exp, power_lambda::freeman_tukey).statistic == doctest::Approx(ft).epsilon(1e-12));
    CHECK(run(obs, exp, 0).statistic == doctest::Approx(g2).epsilon(1e-13));
    CHECK(run(obs, exp, -1).statistic == doctest::Approx(kl).epsilon(1e-13));
    // Continuity at the limits lambda -> 0 and -1 (Cressie & Read 1984, section 2): within ~|lambda| * stat.
    CHECK(run(obs, exp, 1e-12).statistic == doctest::Approx(g2).epsilon(1e-10));
    CHECK(run(obs, exp, -1 + 1e-12).statistic == doctest::Approx(kl).epsilon(1e-10));
    CHECK(std::string(power_lambda_name(2.0 / 3)) == "Cressie-Read CR");
    CHECK(std::string(power_lambda_name(-1)) == "modified likelihood ratio GM²");
    CHECK(lambda_value_text(-0.5) == "−1/2");
    CHECK(lambda_value_text(2.0 / 3) == "2/3");
    CHECK(lambda_value_text(-2) == "−2");
    CHECK(lambda_value_text(0.3) == "0.3");
    CHECK(std::string(power_lambda_name(0.3)).empty());
}

TEST_CASE("empty categories") {
    // SciPy 1.10 gives nan for lambda in (-1, 0) with an observed 0; the limit O^(l+1) -> 0 is
    // finite, and the mpmath rows of the reference set check it. Here: lambda <= -1 is refused.
    PowerDivergence r;
    PowerDivergenceOptions opt;
    opt.lambda = -1;
    Status s = power_divergence({5, 0, 7}, {4, 4, 4}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("Category 2") != std::string::npos);
    CHECK(s.message.find("log(E/O)") != std::string::npos);
    opt.lambda = -2;
    s = power_divergence({5, 0, 7}, {4, 4, 4}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("Neyman") != std::string::npos);
    // Structural zero (E = 0 and O = 0) contributes nothing (common practice); E = 0 with O > 0 is refused.
    opt.lambda = 1;
    s = power_divergence({6, 0, 6}, {6, 0, 6}, opt, &r);
    CHECK(s.ok);
    CHECK(r.statistic == 0.0);
    s = power_divergence({6, 1, 5}, {6, 0, 6}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("Category 2") != std::string::npos);
}

TEST_CASE("Williams' correction of G^2") {
    // q = 1 + (k + 1)/(6N) for goodness of fit (Williams 1976; Sokal & Rohlf, Biometry, recalled
    // from memory): k = 4, N = 200 gives q = 1 + 5/1200.
    const std::vector<double> obs{43, 52, 25, 80}, exp{50, 50, 25, 75};
    const PowerDivergence plain = run(obs, exp, 0);
    const PowerDivergence corr = run(obs, exp, 0, true);
    CHECK(corr.williams_q == doctest::Approx(1 + 5.0 / 1200).epsilon(1e-15));
    CHECK(corr.statistic == doctest::Approx(plain.statistic / corr.williams_q).epsilon(1e-14));
    double s = 0;
    for (double c : corr.contributions) s += c;
    CHECK(s == corr.statistic);
    PowerDivergence r;
    PowerDivergenceOptions opt;
    opt.lambda = 1;
    opt.williams_correction = true;
    CHECK_FALSE(power_divergence(obs, exp, opt, &r).ok);  // only for G^2
}

TEST_CASE("bad arguments are refused with a message naming the input") {
    PowerDivergence r;
    PowerDivergenceOptions opt;
    CHECK_FALSE(power_divergence({}, {}, opt, &r).ok);
    CHECK_FALSE(power_divergence({1, 2}, {1.5}, opt, &r).ok);
    Status s = power_divergence({1, -2, 3}, {1, 1, 2}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("category 2") != std::string::npos);
    CHECK_FALSE(power_divergence({1, NAN, 3}, {1, 1, 2}, opt, &r).ok);
    CHECK_FALSE(power_divergence({1, 2, 3}, {1, -1, 6}, opt, &r).ok);
    s = power_divergence({10, 10}, {5, 5}, opt, &r);  // totals disagree
    CHECK_FALSE(s.ok);
    CHECK(s.message.find("total") != std::string::npos);
    opt.lambda = INFINITY;
    CHECK_FALSE(power_divergence({5, 5}, {5, 5}, opt, &r).ok);
    opt.lambda = 2000;  // (O/E)^2000 = 2^2000 overflows a double
    s = power_divergence({1000, 1}, {500.5, 500.5}, opt, &r);
    CHECK_FALSE(s.ok);
    CHECK(r.contributions.empty());
    CHECK(std::isnan(power_divergence_term(1, 0, 1)));
    CHECK(std::isnan(power_divergence_term(-1, 2, 1)));
    CHECK(std::isinf(power_divergence_term(0, 2, -1)));
}
