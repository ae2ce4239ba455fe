// Homogeneity of the current counts with a previous sample's (2 x k table, Pearson 1900;
// Haberman 1973 residuals; Holm 1979 for the per-category 2 x 2 tests). Merging is decided on
// the expected counts of the smaller sample's row, which are the smaller in every column
// (E_ij = r_i c_j / N), so a rule that holds there holds for both rows.
#include "reference_sample_analysis.hpp"

#include <cmath>
#include <string>

#include "effect_size.hpp"
#include "exact_homogeneity.hpp"
#include "homogeneity_table.hpp"
#include "merge_categories.hpp"
#include "multiplicity.hpp"
#include "number_format.hpp"
#include "pvalue_job.hpp"

namespace tallyproof {
namespace {

void refuse(Result* r, std::string message) {
    *r = Result{};
    r->status = Status::failure(std::move(message));
}

std::vector<double> flat(const std::vector<double>& a, const std::vector<double>& b) {
    std::vector<double> v = a;
    v.insert(v.end(), b.begin(), b.end());
    return v;
}

// Why the previous sample cannot be compared ("" when it can), and its total.
std::string previous_sample_problem(const Analysis& a, double* n_ref) {
    const std::vector<double>& ref = a.model.values;
    for (std::size_t i = 0; i < ref.size(); ++i) {
        const double v = ref[i];
        if (!std::isfinite(v) || v < 0 || v != std::floor(v) || v >= 9007199254740992.0)
            return "The previous sample's count for \"" + a.categories[i] + "\" (" + format_plain(v) +
                   ") must be a non-negative whole number: give its counts, not shares or percentages.";
        *n_ref += v;
    }
    if (!(*n_ref > 0)) return "All counts of the previous sample are zero: there is nothing to compare with.";
    if (a.statistic.williams) return "Williams' correction is for one sample against a stated mix; compare with a previous sample without it.";
    if (a.extra_estimated_parameters > 0)
        return "A comparison with a previous sample estimates the shares from both samples (df = k − 1); "
               "extra estimated parameters do not apply.";
    return "";
}

// The exact or Monte Carlo conditional p-value when asked for (ordered by the statistic or by
// the tables' probability), else the asymptotic one stays.
void add_conditional_pvalue(const Analysis& a, const HomogeneityTable& table, Result* r, ReferenceSampleOutcome* out) {
    r->exact.requested = a.pvalue.method == PValueMethod::exact;
    r->monte_carlo.requested = a.pvalue.method == PValueMethod::monte_carlo;
    const bool by_probability = a.pvalue.ordering == ExactOrdering::probability;
    if (r->exact.requested) {
        HomogeneityExactResult er;
        const Status s = homogeneity_exact_p(table, a.statistic.lambda, kMaxExactHomogeneityTables, &er, by_probability);
        r->exact.method = "table-enumeration";  // every table with the margins; exact.ordering says how they are ranked
        if (s.ok) {
            r->exact.computed = true;
            r->exact.p = er.p;
            r->exact.p_lower = r->exact.p_upper = er.p.p;  // every table enumerated: a point, the decision exact
            r->exact.decides_at_alpha = true;
            r->exact.work_units = er.tables;
            out->exact_tables = er.tables;
            r->method = PValueMethod::exact;
            r->p = er.p;
        } else {
            r->exact.refusal = s.message;
            r->warnings.push_back("Exact p-value not available: " + s.message + " The asymptotic p-value is shown.");
        }
    } else if (r->monte_carlo.requested) {
        MonteCarloResult mr;
        const Status s = homogeneity_monte_carlo_p(table, a.statistic.lambda, a.pvalue.replicates, a.pvalue.seed,
                                      kMaxMonteCarloHomogeneityDraws, &mr, by_probability);
        if (s.ok) {
            r->monte_carlo.computed = true;
            record_monte_carlo(mr, r);
        } else {
            r->monte_carlo.refusal = s.message;
            r->warnings.push_back("Monte Carlo p-value not available: " + s.message + " The asymptotic p-value is shown.");
        }
    }
}

// Per category: the 2 x 2 table of this category against the rest (X² = adjusted residual², df 1),
// Holm-adjusted; a category drives the result when that p is below alpha (the one rule).
void add_category_tests(const Analysis& a, const HomogeneityTable& table, const std::vector<std::string>& labels, Result* r,
                        ReferenceSampleOutcome* out_ptr) {
    ReferenceSampleOutcome& out = *out_ptr;
    const std::size_t cells = labels.size();
    std::vector<double> p_values(cells);
    for (std::size_t j = 0; j < cells; ++j) {
        const double z = table.adjusted_residuals[j];
        out.category_p.push_back(chi_square_upper_tail(z * z, 1));
        p_values[j] = out.category_p.back().p;
    }
    if (!adjust_p_values(p_values, MultiplicityMethod::holm, &out.category_p_adjusted).ok)
        out.category_p_adjusted.assign(cells, NAN);
    CategoryDiagnostics& d = r->diagnostics;
    d.alpha = a.alpha;
    d.statistic = r->statistic;
    std::string drivers;
    for (std::size_t j = 0; j < cells; ++j) {
        CategoryDiagnostic c;
        c.label = labels[j];
        c.observed = table.current[j];
        c.expected = table.expected_current[j];
        c.difference = c.observed - c.expected;
        c.observed_share = c.observed / table.n_current;
        c.expected_share = table.pooled_shares[j];
        c.contribution = table.contributions[j];
        c.contribution_share = r->statistic > 0 ? c.contribution / r->statistic : 0.0;
        c.pearson_residual = table.pearson_residuals[j];
        c.adjusted_residual = table.adjusted_residuals[j];
        // The one-sample binomial test and share intervals do not apply; `adjusted` is the 2 x 2 test's Holm p.
        c.binomial = TailProbability{NAN, NAN};
        c.adjusted = TailProbability{out.category_p_adjusted[j], std::log10(out.category_p_adjusted[j])};
        c.goodman = c.sison_glaz = ProportionInterval{NAN, NAN};
        c.drives_result = out.category_p_adjusted[j] < a.alpha;
        c.direction = c.difference > 0 ? "more than in the previous sample" : c.difference < 0 ? "fewer than in the previous sample" : "as in the previous sample";
        c.description = c.label + ": " + c.direction + " (" + format_count(c.observed) + " observed vs " +
                        format_significant(c.expected, 3) + " expected from both samples; Holm-adjusted p = " +
                        format_significant(out.category_p_adjusted[j], 2) + ")";
        if (c.drives_result) {
            d.drivers.push_back(j);
            drivers += (drivers.empty() ? "" : "; ") + c.description;
        }
        d.categories.push_back(c);
    }
    const std::string test = "Holm-adjusted p below " + format_plain(a.alpha) + " for the category against the rest";
    d.rule = test + " (2 × 2 table)";
    d.summary = drivers_summary(d.drivers.size(), cells, test, drivers, "differs clearly from the previous sample's share");

}

}  // namespace

void analyse_reference_sample(const Analysis& a, Result* r) {
    const std::size_t k = a.observed.size();
    const std::vector<double>& ref = a.model.values;
    if (ref.size() != k)
        return refuse(r, "The previous sample has " + std::to_string(ref.size()) + " counts but there are " + std::to_string(k) +
                             " categories; give one count of the previous sample per category, in the same order.");
    double n_ref = 0;
    if (const std::string why = previous_sample_problem(a, &n_ref); !why.empty()) return refuse(r, why);

    ReferenceSampleOutcome out;
    out.reference = ref;
    out.n_reference = n_ref;
    out.n_total = r->n + n_ref;

    // Categories empty in both samples carry no information and are left out.
    std::vector<std::string> labels;
    std::vector<double> cur, prev;
    std::vector<std::size_t> kept;
    for (std::size_t i = 0; i < k; ++i) {
        if (a.observed[i] + ref[i] == 0) {
            r->warnings.push_back("Category \"" + a.categories[i] + "\" is empty in both samples; it is left out of the test.");
            continue;
        }
        labels.push_back(a.categories[i]);
        cur.push_back(a.observed[i]);
        prev.push_back(ref[i]);
        kept.push_back(i);
    }
    if (labels.size() < 2) return refuse(r, "Fewer than two categories are observed in either sample.");

    HomogeneityTable table;
    Status s = homogeneity_table(cur, prev, a.statistic.lambda, &table);
    if (!s.ok) return refuse(r, s.message);
    r->expected_shares.assign(k, 0.0);
    r->expected_counts.assign(k, 0.0);
    for (std::size_t j = 0; j < kept.size(); ++j) {
        r->expected_shares[kept[j]] = table.pooled_shares[j];
        r->expected_counts[kept[j]] = table.expected_current[j];
    }
    r->model_description = "the previous sample (N = " + format_count(n_ref) + "), pooled with this one under homogeneity";
    s = check_validity(flat(table.expected_current, table.expected_reference), &r->validity_before_merge);
    if (!s.ok) return refuse(r, s.message);

    // Merging of thin categories, both rows together
    if (a.merge.rule != MergeRule::none) {
        MergeOptions mo;
        mo.rule = a.merge.rule;
        mo.minimum = a.merge.minimum;
        mo.ordered = a.ordered;
        const bool current_small = table.n_current <= table.n_reference;
        MergeResult mr;
        s = merge_categories(labels, current_small ? cur : prev,
                             current_small ? table.expected_current : table.expected_reference, mo, &mr);
        if (!s.ok) return refuse(r, s.message);
        r->merged = mr.merged;
        r->merge_note = mr.merged ? mr.note + " The same categories are merged in the previous sample." : mr.note;
        std::vector<double> mc, mp;
        for (const auto& g : mr.groups) {
            std::vector<std::size_t> orig;
            double c = 0, p = 0;
            for (std::size_t j : g) { orig.push_back(kept[j]); c += cur[j]; p += prev[j]; }
            r->merge_map.push_back(orig);
            mc.push_back(c);
            mp.push_back(p);
        }
        labels = mr.labels;
        s = homogeneity_table(mc, mp, a.statistic.lambda, &table);
        if (!s.ok) return refuse(r, s.message);
    } else {
        for (std::size_t j : kept) r->merge_map.push_back({j});
    }
    r->tested_categories = labels;
    r->tested_observed = table.current;
    r->tested_expected = table.expected_current;
    r->contributions = table.contributions;
    out.tested_reference = table.reference;
    out.expected_reference = table.expected_reference;
    out.pooled_shares = table.pooled_shares;
    out.adjusted_residuals = table.adjusted_residuals;
    s = check_validity(flat(table.expected_current, table.expected_reference), &r->validity);
    if (s.ok) s = check_validity(table.expected_current, &out.validity_current);
    if (s.ok) s = check_validity(table.expected_reference, &out.validity_reference);
    if (!s.ok) return refuse(r, s.message);

    // Statistic and p-values
    r->lambda = a.statistic.lambda;
    r->statistic = table.statistic;
    r->df = table.df;
    r->upper = chi_square_upper_tail(r->statistic, r->df);
    r->lower = chi_square_lower_tail(r->statistic, r->df);
    r->critical_value = chi_square_critical_value(a.alpha, r->df);
    r->method = PValueMethod::asymptotic;
    r->p = r->upper;
    add_conditional_pvalue(a, table, r, &out);
    r->reject = r->p.p <= a.alpha;

    add_category_tests(a, table, labels, r, &out);

    // Effect size over both samples (w = Cramér's V for a 2 x k table), set as the one-sample
    // path sets it (goodness_of_fit.cpp): w, its chance-corrected estimate, labels and interval.
    r->effect = effect_outcome(r->statistic, out.n_total, r->df, NAN);
    if (r->reject && r->effect.estimate < 0.1)
        r->warnings.push_back("The change is statistically significant but very small (w = " + format_fixed(r->effect.estimate, 3) +
                              "): with " + format_count(out.n_total) + " observations in the two samples, even a negligible change is detected.");
    if (!out.validity_reference.all_at_least_5 && out.validity_current.all_at_least_5)
        r->warnings.push_back("The previous sample's row has small expected counts (smallest " +
                              format_fixed(out.validity_reference.min_expected, 2) + "): the validity check covers both rows.");

    r->cautions.push_back("The previous sample is itself a sample: this test treats both as independent random samples "
                          "of their periods or batches, counted the same way.");
    r->reference = std::move(out);
}

}  // namespace tallyproof
