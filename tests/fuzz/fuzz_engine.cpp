// libFuzzer target for the analysis engine: an Analysis built from the fuzzed bytes (k categories,
// counts, model kind, lambda, merge rule, alpha, p-value method) goes through analyse() and, for
// small N, the exact or Monte Carlo p-value job at a low work budget. Any broken invariant aborts.
// Build and run: tests/fuzz/run_quality_fuzzers.sh engine 600
// The invariant checks are shared with fuzz_analysis_document.cpp, which includes this file with
// TALLYPROOF_FUZZ_INVARIANTS_ONLY defined.
#include <algorithm>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <string>
#include <vector>

#include "analysis.hpp"
#include "analysis_document.hpp"
#include "goodness_of_fit.hpp"
#include "pvalue_job.hpp"

namespace tallyproof_fuzz {
using namespace tallyproof;

[[noreturn]] inline void violated(const char* what, double a = NAN, double b = NAN) {
    std::fprintf(stderr, "invariant violated: %s (%.17g, %.17g)\n", what, a, b);
    std::abort();
}

inline bool is_probability(double p) { return p >= 0 && p <= 1; }  // false for NaN

inline void check_tail(const TailProbability& t, const char* what) {
    if (!is_probability(t.p)) violated(what, t.p, t.log10_p);
    if (std::isnan(t.log10_p) || t.log10_p > 1e-12) violated(what, t.p, t.log10_p);
    // Where the double holds the value, log10_p must agree with it.
    if (t.p > 1e-300 && std::fabs(std::log10(t.p) - t.log10_p) > 1e-6 * std::max(1.0, std::fabs(t.log10_p)))
        violated(what, t.p, t.log10_p);
}

inline bool close_rel(double a, double b, double rel) {
    return std::fabs(a - b) <= rel * std::max({std::fabs(a), std::fabs(b), 1e-300});
}

// Every documented invariant of a Result for the Analysis it came from; `after_job`: the exact or
// Monte Carlo job has been folded in (before that, a requested p-value is neither computed nor refused).
inline void check_result(const Analysis& a, const Result& r, bool after_job = false) {
    if (!r.status.ok) {
        if (r.status.message.empty()) violated("a refusal without a message");
        return;
    }
    const std::size_t k = a.observed.size();
    // With a survey design the counts tested are the weighted shares times n (Result::observed),
    // which total the same n as the respondents per category that the analysis holds.
    const std::vector<double>& counts = r.design ? r.observed : a.observed;
    if (r.observed.size() != k || r.categories.size() != k) violated("as-read sizes");
    if (r.expected_shares.size() != k || r.expected_counts.size() != k) violated("expected sizes");
    double n = 0, share_sum = 0;
    for (std::size_t i = 0; i < k; ++i) {
        n += a.observed[i];
        if (!is_probability(r.expected_shares[i])) violated("expected share in [0,1]", r.expected_shares[i]);
        if (!(r.expected_counts[i] >= 0) || !std::isfinite(r.expected_counts[i])) violated("expected count", r.expected_counts[i]);
        share_sum += r.expected_shares[i];
    }
    if (n != r.n) violated("n is the total of the counts", n, r.n);
    if (!close_rel(share_sum, 1.0, 1e-9)) violated("expected shares sum to 1", share_sum);

    // Tested cells, merge map: every category with a positive expected count appears exactly once.
    const std::size_t t = r.tested_categories.size();
    if (t < 2 || r.tested_observed.size() != t || r.tested_expected.size() != t || r.contributions.size() != t ||
        r.merge_map.size() != t)
        violated("tested sizes", static_cast<double>(t), static_cast<double>(r.contributions.size()));
    std::vector<int> seen(k, 0);
    for (std::size_t g = 0; g < t; ++g) {
        if (r.merge_map[g].empty()) violated("empty merge group");
        double o = 0;
        for (std::size_t i : r.merge_map[g]) {
            if (i >= k) violated("merge index out of range", static_cast<double>(i));
            ++seen[i];
            o += counts[i];
        }
        if (o != r.tested_observed[g]) violated("merged observed equals the sum of its categories", o, r.tested_observed[g]);
        if (!(r.tested_expected[g] > 0) || !std::isfinite(r.tested_expected[g])) violated("tested expected > 0", r.tested_expected[g]);
    }
    for (std::size_t i = 0; i < k; ++i) {
        const bool dropped = !(r.expected_counts[i] > 0);
        if (seen[i] != (dropped ? 0 : 1)) violated("merge map covers every kept index once", static_cast<double>(i), seen[i]);
        if (dropped && counts[i] > 0) violated("an observed category with zero expected was dropped");
    }
    double to = 0, te = 0, cs = 0, cabs = 0;
    for (std::size_t g = 0; g < t; ++g) {
        to += r.tested_observed[g];
        te += r.tested_expected[g];
        const double c = r.contributions[g];
        if (std::isnan(c) || c < -1e-9 * std::max(1.0, r.statistic)) violated("contribution is a non-negative number", c);
        cs += c;
        cabs += std::fabs(c);
    }
    // Weighted counts of survey data (n p̂) total n up to rounding; whole counts exactly.
    if (n < 9007199254740992.0 && (r.design ? !close_rel(to, n, 1e-12) : to != n)) violated("merged observed total equals N", to, n);
    if (!close_rel(te, n, 1e-9)) violated("merged expected total equals N", te, n);

    // Statistic and p-values
    if (std::isnan(r.statistic) || r.statistic < 0) violated("statistic is a non-negative number", r.statistic);
    if (std::isfinite(r.statistic) && std::fabs(cs - r.statistic) > 1e-9 * std::max({cabs, r.statistic, 1e-300}))
        violated("contributions sum to the statistic", cs, r.statistic);
    if (!(r.df >= 1) || r.df != std::floor(r.df)) violated("df is a whole number >= 1", r.df);
    check_tail(r.upper, "upper tail");
    check_tail(r.lower, "lower tail");
    check_tail(r.p, "reported p");
    if (std::isfinite(r.statistic) && r.upper.p + r.lower.p < 1 - 1e-9 && r.upper.p > 1e-300 && r.lower.p > 1e-300)
        violated("upper + lower tail >= 1", r.upper.p, r.lower.p);
    if (!(r.critical_value > 0) || !std::isfinite(r.critical_value)) violated("critical value", r.critical_value);
    if (r.reject != (r.p.p <= r.alpha)) violated("reject is p <= alpha", r.p.p, r.alpha);
    if (r.df_range.shown) {
        check_tail(r.df_range.p_at_lower_df, "df range lower");
        check_tail(r.df_range.p_at_upper_df, "df range upper");
    }
    if (r.exact.computed) {
        check_tail(r.exact.p, "exact p");
        if (!(r.exact.error_bound >= 0)) violated("exact error bound", r.exact.error_bound);
    }
    if (after_job && r.exact.requested && !r.exact.computed && r.exact.refusal.empty())
        violated("exact neither computed nor refused");
    if (r.monte_carlo.computed) {
        const auto& m = r.monte_carlo;
        if (!(m.p > 0 && m.p <= 1) || m.hits > m.replicates) violated("Monte Carlo p in (0,1]", m.p);
        const double expect = (static_cast<double>(m.hits) + 1) / (static_cast<double>(m.replicates) + 1);
        if (!close_rel(m.p, expect, 1e-12)) violated("Monte Carlo p = (b+1)/(B+1)", m.p, expect);
        if (!(m.standard_error >= 0)) violated("Monte Carlo se", m.standard_error);
    }
    if (after_job && r.monte_carlo.requested && !r.monte_carlo.computed && r.monte_carlo.refusal.empty())
        violated("Monte Carlo neither computed nor refused");

    // Diagnostics (when computed), effect sizes
    for (const auto& d : r.diagnostics.categories) {
        check_tail(d.binomial, "binomial p");
        check_tail(d.adjusted, "adjusted p");
        if (d.adjusted.p + 1e-12 < d.binomial.p) violated("adjusted p >= raw p", d.adjusted.p, d.binomial.p);
        if (!is_probability(d.observed_share) || !is_probability(d.expected_share)) violated("diagnostic shares");
        if (std::isnan(d.pearson_residual) || std::isnan(d.adjusted_residual)) violated("residual NaN");
    }
    if (std::isnan(r.effect.w) || r.effect.w < 0) violated("Cohen's w", r.effect.w);
    if (r.effect.fei_defined && std::isnan(r.effect.fei)) violated("Fei NaN");
    if (r.plan.requested && r.plan.status.ok && !is_probability(r.plan.power)) violated("power in [0,1]", r.plan.power);
    if (r.digits.computed && (std::isnan(r.digits.mad) || r.digits.mad < 0)) violated("MAD", r.digits.mad);
}

// Runs the p-value job at a low budget (cancelling when it is not done within max_steps slices),
// then checks the folded result.
inline void run_job_and_check(const Analysis& a, const Result& r0, std::uint64_t budget, int max_steps) {
    Result r = r0;
    PValueJob job;
    start_pvalue_job(a, r, &job);
    int steps = 0;
    while (!job.progress.done && !job.progress.cancelled) {
        if (++steps > max_steps) { cancel_pvalue_job(&job); break; }
        const WorkProgress p = step_pvalue_job(&job, budget);
        if (!(p.fraction >= 0 && p.fraction <= 1)) violated("progress fraction in [0,1]", p.fraction);
    }
    finish_pvalue_job(job, &r);
    check_result(a, r, true);
}

}  // namespace tallyproof_fuzz

#ifndef TALLYPROOF_FUZZ_INVARIANTS_ONLY

namespace {
using namespace tallyproof;

struct Bytes {
    const std::uint8_t* p;
    std::size_t n;
    std::uint8_t u8() {
        if (n == 0) return 0;
        --n;
        return *p++;
    }
    std::uint32_t u32() { return u8() | (u8() << 8) | (u8() << 16) | (static_cast<std::uint32_t>(u8()) << 24); }
    double f64() {
        std::uint64_t v = 0;
        for (int i = 0; i < 8; ++i) v |= static_cast<std::uint64_t>(u8()) << (8 * i);
        double d;
        std::memcpy(&d, &v, sizeof d);
        return d;
    }
};

const ModelKind kKinds[] = {
    ModelKind::equal, ModelKind::shares, ModelKind::ratio, ModelKind::counts, ModelKind::poisson,
    ModelKind::binomial, ModelKind::geometric, ModelKind::negative_binomial, ModelKind::uniform,
    ModelKind::normal, ModelKind::lognormal, ModelKind::exponential, ModelKind::benford_first,
    ModelKind::benford_second, ModelKind::benford_first_two, ModelKind::last_digit, ModelKind::last_digit_even};
const double kLambdas[] = {1, 0, 2.0 / 3.0, -0.5, -1, -2, 0.5, 3, -0.999, 1e-9};
const double kAlphas[] = {0.05, 0.01, 0.1, 0.5, 1e-300, 0.999999, 0, 1, -0.05, NAN};

// A count from one byte of choice: small, large, huge or hostile.
double count_of(Bytes& b) {
    const std::uint8_t c = b.u8();
    switch (c >> 5) {
        case 0: case 1: case 2: return c & 31;
        case 3: return (c & 31) * 37.0 + b.u8();
        // Up to 1e6, or (issue 15) a count from 2^40 (about 1e12) to just below 2^53: every
        // computation must stay bounded in time whatever N is.
        case 4:
            if (c & 16) return std::floor(std::ldexp(1.0 + b.u32() / 4294967296.0, 40 + (c & 12)));
            return static_cast<double>(b.u32() % 1000000);
        case 5: return std::ldexp(1.0, 54 + (c & 7));  // 2^54 .. 2^61: beyond 2^53, must be refused
        case 6: return 0;
        default: {
            // (2^53 itself is accepted by analyse() although documented as refused: docs/robustness.md)
            const double special[] = {NAN, INFINITY, -1, 0.5, 1e300, -INFINITY, 9007199254740994.0, -0.0};
            return special[c & 7];
        }
    }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
    Bytes b{data, size};
    Analysis a;
    const std::uint8_t head = b.u8();
    std::size_t k = 2 + b.u8() % 30;
    if (head & 0x80) k = b.u8() % 100;  // including 0 and 1 categories, which must be refused
    if ((head & 0xC0) == 0x40 && (head & 0x30) == 0x30) k = 1000 + (b.u8() | (b.u8() << 8)) % 9001;  // up to 10,000 (issue 15)
    a.model.kind = kKinds[b.u8() % (sizeof kKinds / sizeof kKinds[0])];
    const bool digit_labels = model_is_digit_law(a.model.kind) || model_is_fitted(a.model.kind);
    if (digit_labels && (head & 1)) {
        // Labels the digit laws and fitted models accept: the digits in order, or 0, 1, 2, ...
        std::size_t first = 0;
        switch (a.model.kind) {
            case ModelKind::benford_first: k = 9; first = 1; break;
            case ModelKind::benford_second: case ModelKind::last_digit: k = 10; break;
            case ModelKind::benford_first_two: k = 90; first = 10; break;
            case ModelKind::last_digit_even: k = 5; break;
            default: first = b.u8() % 4; break;
        }
        for (std::size_t i = 0; i < k; ++i)
            a.categories.push_back(std::to_string(a.model.kind == ModelKind::last_digit_even ? 2 * i : first + i));
    } else {
        for (std::size_t i = 0; i < k; ++i) a.categories.push_back("c" + std::to_string(i));
        if (head & 2 && k > 1) a.categories[1] = a.categories[0];  // duplicate labels
    }
    for (std::size_t i = 0; i < k; ++i) a.observed.push_back(count_of(b));
    if (head & 4 && k > 0) a.observed.pop_back();  // mismatched labels and counts
    a.ordered = head & 8;
    const std::uint8_t v = b.u8();
    for (std::size_t i = 0; i < k && (a.model.kind == ModelKind::shares || a.model.kind == ModelKind::ratio ||
                                      a.model.kind == ModelKind::counts || (v & 1));
         ++i) {
        const std::uint8_t c = b.u8();
        a.model.values.push_back(c < 200 ? c : (c < 250 ? c * 1e3 : (c == 250 ? NAN : (c == 251 ? -1 : 0))));
    }
    if (a.model.kind == ModelKind::counts && (v & 2)) {
        // Expected counts that total N (after rescaling), as the documented "counts" kind expects.
        double n = 0, tot = 0;
        for (double o : a.observed) n += std::isfinite(o) ? o : 0;
        for (double e : a.model.values) tot += e;
        if (tot > 0)
            for (double& e : a.model.values) e = e * n / tot;
    }
    if (a.model.kind == ModelKind::normal || a.model.kind == ModelKind::lognormal ||
        a.model.kind == ModelKind::exponential || (v & 4)) {
        double e = (v & 8) ? -10 : 0.5;
        for (std::size_t i = 0; i <= k; ++i) {
            a.model.edges.push_back(e);
            e += 0.25 + b.u8() / 16.0;
        }
        if (v & 16 && !a.model.edges.empty()) a.model.edges.back() = NAN;
    }
    const std::uint8_t pm = b.u8();
    if (pm & 1) a.model.parameters.push_back({"mean", (pm & 2) ? b.u8() / 8.0 : NAN});
    if (pm & 4) a.model.parameters.push_back({"p", b.u8() / 255.0});
    if (pm & 8) a.model.parameters.push_back({"trials", static_cast<double>(b.u8() % 40)});
    if (pm & 16) a.model.parameters.push_back({"size", b.u8() / 4.0});
    if (pm & 32) a.model.parameters.push_back({"sd", b.u8() / 8.0});
    if (pm & 64) a.model.parameters.push_back({"rate", b.u8() / 16.0});
    const std::uint8_t st = b.u8();
    a.statistic.lambda = (st & 0x80) ? b.f64() : kLambdas[st % 10];
    if (!std::isfinite(a.statistic.lambda) || std::fabs(a.statistic.lambda) > 50) a.statistic.lambda = kLambdas[st % 10];
    a.statistic.williams = (st & 0x40) && ((st & 0x20) || a.statistic.lambda == 0);
    const std::uint8_t al = b.u8();
    a.alpha = (al & 0x80) ? kAlphas[al % 10] : 0.001 + (al % 100) / 101.0;
    const std::uint8_t mg = b.u8();
    const MergeRule rules[] = {MergeRule::none, MergeRule::all_at_least_5, MergeRule::cochran, MergeRule::custom_minimum};
    a.merge.rule = rules[mg & 3];
    a.merge.minimum = (mg & 4) ? ((mg & 8) ? 0 : NAN) : 0.5 + (mg >> 4);
    if (mg & 4 && mg & 64) a.merge.minimum = 1e9;
    a.extra_estimated_parameters = (mg & 0x80) ? b.u8() % 4 : 0;
    const std::uint8_t pv = b.u8();
    a.pvalue.method = static_cast<PValueMethod>(pv % 3);
    a.pvalue.ordering = (pv & 4) ? ExactOrdering::probability : ExactOrdering::statistic;
    a.pvalue.replicates = (pv & 8) ? 0 : 1 + b.u8() * 8;
    a.pvalue.seed = b.u32();
    if (pv & 16) {
        a.plan.requested = true;
        if (pv & 32) a.plan.w = b.u8() / 64.0;
        if (pv & 64) a.plan.target_power = b.u8() / 255.0;
    }

    // TALLYPROOF_FUZZ_PRINT=1 when replaying a finding: the analysis as a document, first.
    if (std::getenv("TALLYPROOF_FUZZ_PRINT")) std::fprintf(stderr, "%s\n", write_analysis_document(a).c_str());
    const Result r = analyse(a);
    tallyproof_fuzz::check_result(a, r);
    if (!r.status.ok || a.pvalue.method == PValueMethod::asymptotic) return 0;
    // Exact and Monte Carlo at low budgets: tiny problems through analyse_completely(), the rest
    // as a sliced job that is cancelled when it is not done in a few slices.
    if (r.n <= 40 && r.tested_observed.size() <= 5) {
        const Result full = analyse_completely(a);
        tallyproof_fuzz::check_result(a, full, true);
    } else if (r.n <= 2000) {
        tallyproof_fuzz::run_job_and_check(a, r, 4096, 16);
    }
    return 0;
}

#endif  // TALLYPROOF_FUZZ_INVARIANTS_ONLY
