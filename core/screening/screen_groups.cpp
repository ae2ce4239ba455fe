// Screening of many groups. Against the model: each group is one analyse() (goodness_of_fit.cpp),
// so statistic, df (minus parameters fitted per group), p, w, MAD and drivers are exactly those
// of the single analysis. Against the rest: the group and the pooled other groups form a 2 x k
// table, expected counts row total x column total / N, Pearson's (or the chosen power-divergence)
// statistic on chi2(k' - 1) for the k' categories seen at all (Agresti 2013, Categorical Data
// Analysis, 3rd ed., sect. 3.2), w = sqrt(max(0, X2 - df) / N) over the table (Cohen 1988, ch. 7, corrected for chance) and
// drivers by adjusted residuals (Haberman 1973) beyond the Bonferroni critical z over k'.
// Multiplicity across groups: Benjamini and Hochberg (1995), Holm (1979), Bonferroni.
#include "screen_groups.hpp"

#include <boost/math/distributions/normal.hpp>
#include <algorithm>
#include <cmath>
#include <limits>

#include "effect_size.hpp"
#include "goodness_of_fit.hpp"
#include "homogeneity_table.hpp"
#include "math_policy.hpp"
#include "mean_absolute_deviation.hpp"
#include "null_model.hpp"
#include "number_format.hpp"
#include "power_divergence.hpp"
#include "monte_carlo.hpp"
#include "pvalue_job.hpp"
#include "validity.hpp"

namespace tallyproof {
namespace {

// One group against the model: the single analysis, with an exact (or Monte Carlo) p-value
// when the group is too thin for the asymptotic one.
// `draws_left` is what remains of the screen's one Monte Carlo budget (monte_carlo.hpp), spent here.
void test_against_model(const Analysis& base, const std::vector<std::string>& categories, const double* row, GroupRow* g,
                        double* draws_left) {
    Analysis a = base;
    a.categories = categories;
    a.observed.assign(row, row + categories.size());
    a.plan = PlanChoice{};
    Result r = analyse(a);
    if (!r.status.ok) { g->note = "not tested: " + r.status.message; return; }
    bool over_budget = false;
    const bool thin = !r.validity.cochran_holds && base.pvalue.method == PValueMethod::asymptotic;
    if (thin || base.pvalue.method != PValueMethod::asymptotic) {
        if (thin) a.pvalue.method = PValueMethod::exact;
        PValueJob job;
        job.draws_left = *draws_left;
        start_pvalue_job(a, r, &job);
        if (!job.status.ok && thin) {  // exact enumeration too costly: Monte Carlo
            a.pvalue.method = PValueMethod::monte_carlo;
            job = PValueJob{};
            job.draws_left = *draws_left;
            start_pvalue_job(a, r, &job);
        }
        while (job.status.ok && !job.progress.done && !job.progress.cancelled) step_pvalue_job(&job, 1u << 20);
        finish_pvalue_job(job, &r);
        if (a.pvalue.method == PValueMethod::monte_carlo && r.monte_carlo.computed)
            *draws_left -= static_cast<double>(r.monte_carlo.replicates) * static_cast<double>(r.tested_observed.size());
        else if (a.pvalue.method == PValueMethod::monte_carlo && r.monte_carlo.refusal.rfind("Monte Carlo would make", 0) == 0)
            over_budget = true;
    }
    g->tested = true;
    g->thin = thin;
    g->statistic = r.statistic;
    g->df = r.df;
    g->p = r.p;
    g->method = r.method;
    g->w = r.effect.estimate;
    g->cohen_w = r.effect.w;
    g->digits = r.digits.computed;
    g->mad = r.digits.mad;
    g->band = r.digits.band;
    if (thin)
        g->note = "thin: smallest expected count " + format_significant(r.validity.min_expected, 3) + "; " +
                  (r.method == PValueMethod::exact ? "exact" : r.method == PValueMethod::monte_carlo ? "Monte Carlo" : "asymptotic") +
                  " p-value" + (over_budget ? " (the screen's Monte Carlo budget was spent)" : "");
    else if (over_budget)
        g->note = "asymptotic p-value: " + r.monte_carlo.refusal;
    for (std::size_t i : r.diagnostics.drivers) {
        const CategoryDiagnostic& d = r.diagnostics.categories[i];
        g->drivers.push_back(GroupDriver{d.label, d.direction, d.observed, d.expected, d.adjusted_residual});
    }
}

// The shares a stated model gives every group alike (equal, shares, ratio, digit laws), when the
// settings let a group be tested without the whole single analysis: no merging, no fitted
// parameters, asymptotic p-values. Empty when each group needs analyse().
std::vector<double> shared_shares(const Analysis& base, const std::vector<std::string>& categories, const std::vector<double>& pooled,
                                  std::string* description) {
    const ModelKind kind = base.model.kind;
    if (model_is_fitted(kind) || kind == ModelKind::counts || base.merge.rule != MergeRule::none ||
        base.pvalue.method != PValueMethod::asymptotic)
        return {};
    Analysis a = base;
    a.categories = categories;
    a.observed = pooled;
    double n = 0;
    for (double c : pooled) n += c;
    NullModel model;
    if (!null_model(a, n, &model).ok) return {};
    *description = model.description;
    return model.shares;
}

// One group against stated shares, as analyse() computes it (same functions, same order), for
// speed with many groups. Returns false when the group needs the whole analysis instead: a thin
// group (exact p), a share of zero, a refused statistic.
bool quick_test_against_shares(const Analysis& base, const std::vector<double>& shares, const double* row, GroupRow* g) {
    const std::size_t k = shares.size();
    std::vector<double> obs(k), exp(k);
    std::size_t below_5 = 0, below_1 = 0;
    for (std::size_t i = 0; i < k; ++i) {
        if (!(shares[i] > 0)) return false;
        obs[i] = row[i];
        exp[i] = g->n * shares[i];
        below_5 += exp[i] < 5;
        below_1 += exp[i] < 1;
    }
    if (!cochran_rule_holds(k, below_5, below_1)) return false;
    PowerDivergenceOptions po;
    po.lambda = base.statistic.lambda;
    po.williams_correction = base.statistic.williams;
    PowerDivergence pd;
    if (!power_divergence(obs, exp, po, &pd).ok) return false;
    g->df = static_cast<double>(k) - 1 - base.extra_estimated_parameters;
    if (g->df < 1) return false;
    g->tested = true;
    g->statistic = pd.statistic;
    g->p = chi_square_upper_tail(pd.statistic, g->df);
    g->method = PValueMethod::asymptotic;
    g->w = noncentral_w(pd.statistic, g->n, g->df);
    g->cohen_w = cohens_w(pd.statistic, g->n);
    DigitTest test;
    if (digit_test_of(base.model.kind, &test)) {
        const MeanAbsoluteDeviation mad = mean_absolute_deviation(obs, test);
        if (mad.status.ok) {
            g->digits = true;
            g->mad = mad.mad;
            g->band = mad.band == Conformity::not_applicable ? "" : mad.label;
        }
    }
    return true;
}

// One group against the pooled other groups: homogeneity_table's 2 x k' table over the
// categories seen at all, the same test as a sample against a previous one.
void test_against_rest(const StatisticChoice& statistic, const std::vector<std::string>& categories, const double* row,
                       const std::vector<double>& pooled, double total, GroupRow* g) {
    const std::size_t k = categories.size();
    if (!(total - g->n > 0)) { g->note = "not tested: the other groups have no counts"; return; }
    std::vector<double> current, others;
    std::vector<std::size_t> used;
    for (std::size_t j = 0; j < k; ++j) {
        if (!(pooled[j] > 0)) continue;
        used.push_back(j);
        current.push_back(row[j]);
        others.push_back(pooled[j] - row[j]);
    }
    const std::size_t kk = used.size();
    if (kk < 2) { g->note = "not tested: fewer than two categories have counts"; return; }
    HomogeneityTable table;
    if (Status s = homogeneity_table(current, others, statistic.lambda, &table); !s.ok) { g->note = "not tested: " + s.message; return; }
    std::vector<double> expected = table.expected_current;
    expected.insert(expected.end(), table.expected_reference.begin(), table.expected_reference.end());
    ValidityReport validity;
    check_validity(expected, &validity);
    g->tested = true;
    g->statistic = table.statistic;
    g->df = table.df;
    g->p = chi_square_upper_tail(table.statistic, g->df);
    g->method = PValueMethod::asymptotic;
    g->w = noncentral_w(table.statistic, total, g->df);
    g->cohen_w = cohens_w(table.statistic, total);
    g->thin = !validity.cochran_holds;
    if (g->thin)
        g->note = "thin: smallest expected count " + format_significant(validity.min_expected, 3) +
                  "; asymptotic p-value, treat with care";
    // The group's adjusted residuals (Haberman 1973), flagged beyond a Bonferroni z over its k' cells.
    const boost::math::normal_distribution<double, quiet_policy> z;
    const double critical = boost::math::quantile(boost::math::complement(z, 0.05 / (2.0 * static_cast<double>(kk))));
    for (std::size_t i = 0; i < kk; ++i) {
        const double residual = table.adjusted_residuals[i];
        if (std::isfinite(residual) && std::fabs(residual) >= critical)
            g->drivers.push_back(GroupDriver{categories[used[i]], residual > 0 ? "more than expected" : "fewer than expected",
                                             current[i], table.expected_current[i], residual});
    }
}

}  // namespace

const char* screen_against_name(ScreenAgainst against) { return against == ScreenAgainst::rest ? "rest" : "model"; }

bool screen_against_from_name(const std::string& name, ScreenAgainst* against) {
    if (name == "model") *against = ScreenAgainst::model;
    else if (name == "rest") *against = ScreenAgainst::rest;
    else return false;
    return true;
}

namespace {

// Work units, in proportion to their cost, so that a slice sized from one phase's rate fits the next.
constexpr std::uint64_t kTallyUnits = 1;       // a group totalled before the tests
constexpr std::uint64_t kShortPathUnits = 8;   // a group by the short path or against the rest (estimated: a statistic and a tail, ~8x a total)
constexpr std::uint64_t kAnalysisUnits = 200;  // a group by the whole single analysis (measured: ~25x the short path)

// Checks the input's shape and sets up the run (the totals, pooled counts, shared shares and Monte
// Carlo budget come in tally_step, in slices); false (result.status set) when the screen is refused.
bool set_up(ScreenJob& j, const GroupedCounts& counts) {
    const Analysis& base = j.base;
    const ScreenChoice& choice = j.choice;
    ScreenResult& s = j.result;
    s = ScreenResult{};
    s.choice = choice;
    s.categories = counts.categories;
    const std::size_t k = counts.categories.size(), groups = counts.groups.size();
    if (!counts.status.ok) { s.status = counts.status; return false; }
    if (!(choice.q > 0 && choice.q < 1)) { s.status = Status::failure("The false discovery rate q must lie between 0 and 1."); return false; }
    if (base.conformity.requested) {  // one rule (issue 26): refused, never silently ignored
        s.status = Status::failure(
            "Showing conformity within a margin w0 is a question for one sample; a screen of many groups looks for "
            "departures (each group tested, the p-values adjusted across groups). Test the group on its own for "
            "conformity, or screen without the margin.");
        return false;
    }
    if (groups < 2) { s.status = Status::failure("Only one group: screening compares two or more groups."); return false; }
    if (k < 2) { s.status = Status::failure("Only one category: a goodness-of-fit test needs at least two."); return false; }
    if (counts.counts.size() != groups * k) { s.status = Status::failure("The counts do not fill groups x categories."); return false; }

    j.pooled.assign(k, 0.0);
    j.total = 0;
    s.groups.clear();
    s.groups.reserve(groups);  // the rows come in tally_step
    j.quick.assign(groups, 0);
    j.next = 0;
    j.phase = -1;  // each group's total first (tally_step), then the tests
    j.progress = WorkProgress{};
    j.progress.units_estimate = groups * (kTallyUnits + kShortPathUnits);
    return true;
}

// Each group's name and total, and the pooled counts, up to `budget` groups; when every group is
// tallied, the checks that need the totals and the shares every group is tested against.
// False when the screen is refused (s.status).
bool tally_step(ScreenJob& j, const GroupedCounts& counts, std::uint64_t budget, std::uint64_t* spent) {
    const Analysis& base = j.base;
    const ScreenChoice& choice = j.choice;
    ScreenResult& s = j.result;
    const std::size_t k = counts.categories.size(), groups = counts.groups.size();
    for (; j.next < groups && *spent < budget; ++j.next, *spent += kTallyUnits) {
        const std::size_t g = j.next;
        GroupRow& row = s.groups.emplace_back();
        row.name = counts.groups[g];
        row.line = g < counts.group_lines.size() ? counts.group_lines[g] : 0;
        for (std::size_t c = 0; c < k; ++c) {
            const double x = counts.counts[g * k + c];
            if (!std::isfinite(x) || x < 0 || x != std::floor(x)) {
                s.status = Status::failure("Group " + quote_cell(row.name) + ": the count for " + quote_cell(counts.categories[c]) +
                                           " must be a non-negative whole number.", row.line, 0);
                return false;
            }
            row.n += x;
            j.pooled[c] += x;
        }
        j.total += row.n;
    }
    if (j.next < groups) return true;
    if (!(j.total > 0)) { s.status = Status::failure("Every group has a total of zero: there is nothing to test."); return false; }

    // One Monte Carlo budget for the whole screen (monte_carlo.hpp): refused at once when the groups'
    // simulations asked for cannot fit; thin groups' fallbacks then share what is left.
    j.draws_left = kMonteCarloDrawBudget;
    if (choice.against == ScreenAgainst::model && base.pvalue.method == PValueMethod::monte_carlo) {
        std::size_t simulated = 0;
        for (const auto& row : s.groups) simulated += row.n > 0;
        const Status budget_left = monte_carlo_within_budget(static_cast<double>(base.pvalue.replicates) * static_cast<double>(simulated),
                                                             static_cast<double>(k),
                                                             "tables of " + std::to_string(k) + " categories: " +
                                                                 format_grouped(base.pvalue.replicates) + " for each of " +
                                                                 std::to_string(simulated) + " groups");
        if (!budget_left.ok) { s.status = budget_left; return false; }
    }
    std::string shared_description;
    j.shares = choice.against == ScreenAgainst::model ? shared_shares(base, counts.categories, j.pooled, &shared_description)
                                                      : std::vector<double>{};
    j.next = 0;
    j.phase = 0;
    return true;
}

// Multiplicity across the tested groups, on log10 p so that tiny p-values keep their order; lists
// the flagged groups tested by the short path, whose drivers come from the whole single analysis.
bool adjust(ScreenJob& j) {
    ScreenResult& s = j.result;
    std::vector<double> log10_p;
    std::vector<std::size_t> at;
    for (std::size_t g = 0; g < s.groups.size(); ++g)
        if (s.groups[g].tested) { log10_p.push_back(s.groups[g].p.log10_p); at.push_back(g); }
    s.tested = at.size();
    if (s.tested == 0) {
        std::string why = s.groups[0].note;
        if (why.rfind("not tested: ", 0) == 0) why = why.substr(12);
        s.status = Status::failure("No group could be tested (group " + quote_cell(s.groups[0].name) + ": " + why + ").");
        return false;
    }
    std::vector<double> adjusted;
    if (Status st = adjust_log10_p_values(log10_p, j.choice.adjust, &adjusted); !st.ok) { s.status = st; return false; }
    const double log10_q = std::log10(j.choice.q);
    j.flagged_quick.clear();
    for (std::size_t i = 0; i < at.size(); ++i) {
        GroupRow& row = s.groups[at[i]];
        row.q.log10_p = adjusted[i];
        row.q.p = std::pow(10.0, adjusted[i]);
        row.flagged = adjusted[i] <= log10_q;
        if (!row.flagged) row.drivers.clear();
        if (row.flagged && j.quick[at[i]]) j.flagged_quick.push_back(at[i]);
        s.flagged += row.flagged;
        s.thin += row.thin;
    }
    j.next = 0;
    return true;
}

// The screen's description, notes and cautions, once every group is tested.
void describe(ScreenJob& j, const GroupedCounts& counts) {
    const Analysis& base = j.base;
    const ScreenChoice& choice = j.choice;
    ScreenResult& s = j.result;
    if (choice.against == ScreenAgainst::rest) s.model_description = "the other groups pooled";
    else if (model_is_fitted(base.model.kind))  // one fit per group: the pooled fit would mislead
        s.model_description = (base.model.kind == ModelKind::poisson ? std::string("Poisson") : model_kind_name(base.model.kind)) +
                              std::string(" (parameters estimated per group)");
    else if (Result r0 = [&] { Analysis a = base; a.categories = counts.categories; a.observed = j.pooled; a.plan = PlanChoice{}; return analyse(a); }();
             r0.status.ok) s.model_description = r0.model_description;
    else s.model_description = model_kind_name(base.model.kind);
    s.statistic_symbol = statistic_symbol(base.statistic.lambda);
    if (s.thin > 0)
        s.notes.push_back(std::to_string(s.thin) + (s.thin == 1 ? " group is" : " groups are") + " too thin for the asymptotic test (Cochran's rule)" +
                          (choice.against == ScreenAgainst::model ? ": exact or Monte Carlo p-values were used." : ": marked thin; treat their p-values with care."));
    s.cautions.push_back("A flag is a reason to look closer at a group, never proof of error or misconduct: groups differ for many genuine reasons.");
    if (choice.adjust == MultiplicityMethod::benjamini_hochberg)
        s.cautions.push_back("A false discovery rate of " + format_plain(100 * choice.q) +
                             "% means that, on average, about that share of the flagged groups would be flagged by chance alone; it does not say which ones.");
    else if (choice.adjust == MultiplicityMethod::none)
        s.cautions.push_back("The p-values are not adjusted for testing many groups: at q = " + format_significant(choice.q, 3) +
                             ", about that share of groups that follow the model are flagged by chance alone.");
    else
        s.cautions.push_back("The adjustment keeps the chance of flagging any group that follows the model at most " +
                             format_plain(100 * choice.q) + "%.");
    s.cautions.push_back("Decisions that affect people or suppliers should follow your local rules and professional review, not this screen alone.");
}

void mark_done(ScreenJob& j) {
    j.phase = 2;
    j.progress.done = true;
    j.progress.fraction = 1;
}

// Up to about `budget` units: the groups in input order, then the drivers of flagged groups, then
// the description. The same operations in the same order whatever the budget.
WorkProgress step(ScreenJob& j, const GroupedCounts& counts, std::uint64_t budget) {
    WorkProgress& pr = j.progress;
    if (pr.done || pr.cancelled) return pr;
    if (j.cancel_requested) { pr.cancelled = true; return pr; }
    const std::size_t k = counts.categories.size(), groups = counts.groups.size();
    ScreenResult& s = j.result;
    std::uint64_t spent = 0;
    if (j.phase == -1 && !tally_step(j, counts, budget, &spent)) { mark_done(j); return pr; }
    while (j.phase == 0 && j.next < groups && spent < budget) {
        const std::size_t g = j.next++;
        GroupRow& row = s.groups[g];
        if (!(row.n > 0)) {
            row.note = "not tested: the group has no counts";
            s.notes.push_back("Group " + quote_cell(row.name) + (row.line ? " (line " + std::to_string(row.line) + ")" : "") +
                              " has a total of zero: it is listed but not tested.");
            spent += kShortPathUnits;
            continue;
        }
        const double* cells = counts.counts.data() + g * k;
        if (j.choice.against == ScreenAgainst::model && !j.shares.empty() && quick_test_against_shares(j.base, j.shares, cells, &row)) {
            j.quick[g] = 1;
            spent += kShortPathUnits;
        } else if (j.choice.against == ScreenAgainst::model) {
            test_against_model(j.base, counts.categories, cells, &row, &j.draws_left);
            spent += kAnalysisUnits;
        } else {
            test_against_rest(j.base.statistic, counts.categories, cells, j.pooled, j.total, &row);
            spent += kShortPathUnits;
        }
        if (!row.tested && row.n > 0) s.notes.push_back("Group " + quote_cell(row.name) + " was " + row.note + ".");
    }
    if (j.phase == 0 && j.next == groups) {
        if (!adjust(j)) { mark_done(j); return pr; }
        j.phase = 1;
        pr.units_estimate = groups * (kTallyUnits + kShortPathUnits) + j.flagged_quick.size() * kAnalysisUnits;
    }
    while (j.phase == 1 && j.next < j.flagged_quick.size() && spent < budget) {
        const std::size_t g = j.flagged_quick[j.next++];  // the drivers come from the whole single analysis
        GroupRow full = s.groups[g];
        full.drivers.clear();
        double no_draws = 0;  // only the drivers are wanted: no p-value is simulated again
        test_against_model(j.base, counts.categories, counts.counts.data() + g * k, &full, &no_draws);
        s.groups[g].drivers = full.drivers;
        spent += kAnalysisUnits;
    }
    if (j.phase == 1 && j.next == j.flagged_quick.size()) {
        describe(j, counts);
        mark_done(j);  // the result is complete
        return pr;
    }
    pr.units_done += spent;
    // Testing is nine tenths of the bar, the drivers of flagged groups the rest (their number is known
    // only once every group is tested), so the fraction never goes back.
    const double f = j.phase == -1 ? 0.0
                     : j.phase == 0 ? 0.9 * static_cast<double>(j.next) / static_cast<double>(groups)
                                  : 0.9 + 0.1 * static_cast<double>(j.next) / static_cast<double>(std::max<std::size_t>(j.flagged_quick.size(), 1));
    pr.fraction = std::max(pr.fraction, std::min(f, 0.99));
    return pr;
}

}  // namespace

void start_screen_job(const Analysis& base, GroupedCounts counts, const ScreenChoice& choice, ScreenJob* job) {
    job->base = base;
    job->choice = choice;
    job->counts = std::move(counts);
    job->viewed = nullptr;
    job->cancel_requested = false;
    job->progress = WorkProgress{};
    if (!set_up(*job, job->counts)) mark_done(*job);
}

void start_screen_job_on(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice, ScreenJob* job) {
    job->base = base;
    job->choice = choice;
    job->counts = GroupedCounts{};
    job->viewed = &counts;
    job->cancel_requested = false;
    job->progress = WorkProgress{};
    if (!set_up(*job, counts)) mark_done(*job);
}

WorkProgress step_screen_job(ScreenJob* job, std::uint64_t budget) {
    return step(*job, job->viewed ? *job->viewed : job->counts, budget);
}

void cancel_screen_job(ScreenJob* job) {
    job->cancel_requested = true;
    step(*job, job->counts, 0);
}

ScreenResult screen_groups(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice) {
    ScreenJob j;  // the one-call form: the same steps on the caller's counts, not a copy
    j.base = base;
    j.choice = choice;
    if (set_up(j, counts))
        while (!j.progress.done) step(j, counts, std::numeric_limits<std::uint64_t>::max());
    return std::move(j.result);
}

}  // namespace tallyproof
