// Rao-Scott corrections of Pearson's X² for survey data: first order (Rao and Scott 1981, JASA
// 76:221-230, eq. 3.2 and 4.3), second order with Satterthwaite's df (Rao and Scott 1984, Ann.
// Stat. 12:46-60, s. 4), and the F form of R survey's svychisq. The generalised design effects
// δ are the eigenvalues of the linearised covariance of the Pearson terms (p̂_j − p0_j)/√p0_j
// times n, exactly as R survey 4.1-1's svygofchisq forms them (it linearises (T_j − E_j)/√E_j,
// E_j = N̂ p0_j, which centres the indicators at (p̂_j + p0_j)/2); only tr δ and tr δ² enter the
// tests. Checked against R survey 4.1-1 (tests/reference/survey_*.csv) to 1e-8 relative.
#include "rao_scott.hpp"

#include <cmath>

#include <boost/math/distributions/fisher_f.hpp>

#include "compensated_sum.hpp"
#include "design_covariance.hpp"
#include "math_policy.hpp"
#include "symmetric_eigenvalues.hpp"

namespace tallyproof {

const char* design_tier_name(DesignTier t) {
    switch (t) {
        case DesignTier::respondents: return "respondents";
        case DesignTier::category_design_effects: return "category-design-effects";
        case DesignTier::overall_design_effect: return "overall-design-effect";
    }
    return "respondents";
}

namespace {

DesignCorrection refusal(std::string message) {
    DesignCorrection d;
    d.status = Status::failure(std::move(message));
    return d;
}

// Rescales to sum 1; false when a value is not finite and > 0.
bool unit_shares(const std::vector<double>& in, std::vector<double>* out, bool allow_zero) {
    CompensatedSum sum;
    for (double x : in) {
        if (!std::isfinite(x) || x < 0 || (!allow_zero && x == 0)) return false;
        sum.add(x);
    }
    if (!(sum.value() > 0)) return false;
    out->clear();
    for (double x : in) out->push_back(x / sum.value());
    return true;
}

// The uncorrected X² of the shares scaled to n, and the common checks.
Status start(const std::vector<double>& shares, double n, const std::vector<double>& p0, DesignCorrection* d) {
    const std::size_t k = shares.size();
    if (k < 2) return Status::failure("A goodness-of-fit test needs at least two categories.");
    if (p0.size() != k)
        return Status::failure("The stated mix has " + std::to_string(p0.size()) + " shares for " + std::to_string(k) + " categories.");
    std::vector<double> p;
    if (!unit_shares(p0, &p, false))
        return Status::failure("Every stated share must be greater than 0 for the design-corrected test.");
    if (!unit_shares(shares, &d->shares, true)) return Status::failure("The weighted shares must be non-negative and not all zero.");
    if (!(std::isfinite(n) && n > 0)) return Status::failure("The sample size must be a positive number.");
    d->n = n;
    CompensatedSum x2;
    for (std::size_t j = 0; j < k; ++j) x2.add((d->shares[j] - p[j]) * (d->shares[j] - p[j]) / p[j]);
    d->uncorrected_statistic = n * x2.value();
    d->uncorrected_df = static_cast<double>(k - 1);
    d->uncorrected_p = chi_square_upper_tail(d->uncorrected_statistic, d->uncorrected_df);
    d->kish_design_effect = NAN;
    return Status::success();
}

void first_order(double mean_deff, DesignCorrection* d) {
    d->mean_design_effect = mean_deff;
    d->effective_n = d->n / mean_deff;
    d->first_order.available = true;
    d->first_order.statistic = d->uncorrected_statistic / mean_deff;
    d->first_order.df = d->uncorrected_df;
    d->first_order.p = chi_square_upper_tail(d->first_order.statistic, d->first_order.df);
}

TailProbability f_upper_tail(double f, double df1, double df2) {
    boost::math::fisher_f_distribution<double, quiet_policy> dist(df1, df2);
    TailProbability t;
    t.p = boost::math::cdf(boost::math::complement(dist, f));
    t.log10_p = t.p > 0 ? std::log10(t.p) : -INFINITY;
    return t;
}

}  // namespace

DesignCorrection rao_scott_respondents(const SurveySample& s, const std::vector<double>& p0_in) {
    const Status checked = check_survey_sample(s);
    if (!checked.ok) return refusal(checked.message);
    const std::size_t k = s.categories.size();
    const std::vector<double> totals = weighted_totals(s);
    DesignCorrection d;
    d.tier = DesignTier::respondents;
    const double n = static_cast<double>(s.weight.size());
    if (Status st = start(totals, n, p0_in, &d); !st.ok) return refusal(st.message);
    std::vector<double> p0;
    unit_shares(p0_in, &p0, false);
    CompensatedSum n_hat;
    for (double t : totals) n_hat.add(t);
    d.total_weight = n_hat.value();
    d.kish_design_effect = kish_design_effect(s.weight);
    d.clusters = survey_psu_count(s);
    d.strata = survey_stratum_count(s);
    d.clustered = !s.cluster.empty();

    // Per-category design effects and SEs of the shares (Kish's deff with n, not n − 1).
    const SquareMatrix Vp = weighted_share_covariance(s);
    for (std::size_t j = 0; j < k; ++j) {
        const double var = Vp.at(j, j), pj = d.shares[j];
        d.standard_errors.push_back(std::sqrt(var));
        d.design_effects.push_back(pj > 0 && pj < 1 ? n * var / (pj * (1 - pj)) : NAN);
    }

    // Generalised design effects: n/N̂² diag(1/√p0) C diag(1/√p0), C centred at (p̂ + p0)/2.
    std::vector<double> centre(k);
    for (std::size_t j = 0; j < k; ++j) centre[j] = (d.shares[j] + p0[j]) / 2;
    SquareMatrix M = linearised_covariance(s, centre);
    const double scale = n / (d.total_weight * d.total_weight);
    CompensatedSum trace, trace_sq;
    for (std::size_t a = 0; a < k; ++a)
        for (std::size_t b = 0; b < k; ++b) {
            double& x = M.v[a * k + b];
            x *= scale / std::sqrt(p0[a] * p0[b]);
            trace_sq.add(x * x);
            if (a == b) trace.add(x);
        }
    if (!(trace.value() > 0) || !std::isfinite(trace_sq.value()))
        return refusal("The design gives no variance for the shares (every PSU has the same mix): the design effects cannot be estimated.");
    std::vector<double> ev = symmetric_eigenvalues(M);
    if (!ev.empty()) ev.pop_back();  // the structural zero (the shares sum to 1)
    d.generalised_design_effects = ev;

    const double km1 = d.uncorrected_df;
    first_order(trace.value() / km1, &d);
    // Satterthwaite: scale Σδ²/Σδ = δ̄(1 + a²), df (Σδ)²/Σδ² = (k − 1)/(1 + a²).
    const double sat_scale = trace_sq.value() / trace.value();
    const double sat_df = trace.value() * trace.value() / trace_sq.value();
    d.cv2 = km1 / sat_df - 1;
    d.second_order.available = true;
    d.second_order.statistic = d.uncorrected_statistic / sat_scale;
    d.second_order.df = sat_df;
    d.second_order.p = chi_square_upper_tail(d.second_order.statistic, sat_df);
    const double design_df = static_cast<double>(d.clusters) - static_cast<double>(d.strata);
    if (design_df >= 1) {
        d.f_form.available = true;
        d.f_form.statistic = d.uncorrected_statistic / trace.value();
        d.f_form.numerator_df = sat_df;
        d.f_form.denominator_df = sat_df * design_df;
        d.f_form.p = f_upper_tail(d.f_form.statistic, d.f_form.numerator_df, d.f_form.denominator_df);
    } else {
        d.f_form.reason = "The design has no degrees of freedom left (PSUs − strata < 1).";
    }
    d.correction = "Rao–Scott second-order (Satterthwaite) correction, design-based covariance by linearisation with "
                   "PSUs treated as drawn with replacement within strata";
    return d;
}

DesignCorrection rao_scott_category_effects(const std::vector<double>& shares, double n,
                                            const std::vector<double>& deffs, const std::vector<double>& p0_in) {
    DesignCorrection d;
    d.tier = DesignTier::category_design_effects;
    if (Status st = start(shares, n, p0_in, &d); !st.ok) return refusal(st.message);
    const std::size_t k = shares.size();
    if (deffs.size() != k)
        return refusal("There are " + std::to_string(deffs.size()) + " design effects for " + std::to_string(k) +
                       " categories: give one per category.");
    std::vector<double> p0;
    unit_shares(p0_in, &p0, false);
    d.total_weight = n;
    // Rao and Scott (1981, eq. 4.3): δ̄ = Σ_j (p̂_j / p0_j)(1 − p̂_j) d_j / (k − 1).
    CompensatedSum sum;
    for (std::size_t j = 0; j < k; ++j) {
        if (!(std::isfinite(deffs[j]) && deffs[j] > 0))
            return refusal("Design effect " + std::to_string(j + 1) + " must be a number greater than 0.");
        const double pj = d.shares[j];
        sum.add(pj / p0[j] * (1 - pj) * deffs[j]);
        d.standard_errors.push_back(std::sqrt(deffs[j] * pj * (1 - pj) / n));
    }
    d.design_effects = deffs;
    if (!(sum.value() > 0)) return refusal("The design effects and shares give a mean design effect of 0.");
    first_order(sum.value() / d.uncorrected_df, &d);
    d.second_order.reason = "The second-order correction needs the covariances between the categories' shares, which "
                            "per-category design effects do not give; give the respondent-level data for it.";
    d.f_form.reason = d.second_order.reason;
    d.correction = "Rao–Scott first-order correction from the categories' design effects";
    return d;
}

DesignCorrection crude_design_correction(const std::vector<double>& shares, double n, double D,
                                         const std::vector<double>& p0, bool from_kish) {
    DesignCorrection d;
    d.tier = DesignTier::overall_design_effect;
    if (Status st = start(shares, n, p0, &d); !st.ok) return refusal(st.message);
    if (!(std::isfinite(D) && D > 0)) return refusal("The design effect must be a number greater than 0.");
    d.total_weight = n;
    first_order(D, &d);
    d.second_order.reason = "One overall design effect says nothing about how it varies across categories; the "
                            "second-order correction needs the covariances of the shares.";
    d.f_form.reason = d.second_order.reason;
    d.correction = std::string("crude correction by one overall design effect ") +
                   (from_kish ? "(Kish's 1 + CV² of the weights, which reflects unequal weighting only, not clustering)" : "(as given)");
    return d;
}

}  // namespace tallyproof
