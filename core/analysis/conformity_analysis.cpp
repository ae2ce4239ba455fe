// Conformity of an analysed Result: the equivalence test on its statistic, df and N (Wellek
// 2010, from memory), with planning of the N needed to show conformity.
#include "conformity_analysis.hpp"

#include <cmath>
#include <vector>

#include "number_format.hpp"

namespace tallyproof {

namespace {

// The tested cells' expected shares, which the margin in percentage points refers to.
std::vector<double> tested_shares(const Result& r) {
    std::vector<double> shares;
    for (double e : r.tested_expected) shares.push_back(e / r.n);
    return shares;
}

}  // namespace

void add_conformity(const Analysis& a, Result* r) {
    if (!a.conformity.requested || !r->status.ok) return;
    ConformityResult c;
    const std::vector<double> shares = tested_shares(*r);
    const bool in_points = std::isfinite(a.conformity.margin_points);
    const double margin_w = in_points ? margin_w_from_points(a.conformity.margin_points, shares) : a.conformity.margin_w;
    c.margin_w = margin_w;
    c.margin_points = in_points ? a.conformity.margin_points : margin_points_from_w(margin_w, shares);
    if (in_points && !(margin_w > 0 && margin_w <= 1)) {
        c.status = Status::failure("A shift of " + format_plain(a.conformity.margin_points) + " percentage points between the two "
                                   "smallest categories is w0 = " + format_fixed(margin_w, 3) + ", beyond 1; give a smaller shift.");
    } else if (r->reference) {
        c.status = Status::failure("Conformity is shown against a stated mix (a contract or specification), not against a "
                                   "previous sample; compare the samples with the test of homogeneity instead.");
    } else if (r->estimated_parameters > 0) {
        c.status = Status::failure("Conformity is not shown for a fitted model: parameters estimated from these counts move "
                                   "the model toward the data, so a close fit says little. Give every parameter to test "
                                   "conformity to that distribution.");
    } else {
        conformity_test(r->statistic, r->n, r->df, r->alpha, margin_w, &c);
        c.margin_points = in_points ? a.conformity.margin_points : margin_points_from_w(margin_w, shares);
        c.smallest_margin_points = margin_points_from_w(c.smallest_margin_w, shares);
    }
    if (c.status.ok) {
        ConformityPlan& pl = c.plan;
        pl.true_w = std::isfinite(a.conformity.true_w) ? a.conformity.true_w : 0.0;
        pl.target_power = std::isfinite(a.conformity.target_power) ? a.conformity.target_power : 0.8;
        pl.power_at_n = conformity_power(pl.true_w, c.margin_w, r->n, r->alpha, r->df);
        pl.status = conformity_sample_size(pl.true_w, c.margin_w, pl.target_power, r->alpha, r->df, &pl.n_required);
        pl.computed = pl.status.ok;
        if (r->method != PValueMethod::asymptotic)
            r->warnings.push_back("The conformity p-value is asymptotic (noncentral chi-square), whatever the method of the departure p-value.");
        if (!r->validity.cochran_holds)
            r->warnings.push_back("Some expected counts are small: the noncentral chi-square behind the conformity p-value is only "
                                  "approximate here; merge thin categories first.");
    }
    r->conformity = c;
}

}  // namespace tallyproof
