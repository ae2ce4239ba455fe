// Conformity of an analysed Result: the equivalence test on its statistic, df and N (Wellek
// 2010, from memory), with planning of the N needed to show conformity.
#include "conformity_analysis.hpp"

#include <cmath>

namespace tallyproof {

void add_conformity(const Analysis& a, Result* r) {
    if (!a.conformity.requested || !r->status.ok) return;
    ConformityResult c;
    c.margin_w = a.conformity.margin_w;
    if (r->reference) {
        c.status = Status::failure("Conformity is shown against a stated mix (a contract or specification), not against a "
                                   "previous sample; compare the samples with the test of homogeneity instead.");
    } else if (r->estimated_parameters > 0) {
        c.status = Status::failure("Conformity is not shown for a fitted model: parameters estimated from these counts move "
                                   "the model toward the data, so a close fit says little. Give every parameter to test "
                                   "conformity to that distribution.");
    } else {
        conformity_test(r->statistic, r->n, r->df, r->alpha, a.conformity.margin_w, &c);
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
