// P(T <= t_obs) for a power-divergence statistic T (Cressie and Read 1984) under the multinomial
// null, summed over every outcome: P(x) = N! prod pi_j^x_j / x_j! (its logarithm from lgamma).
// Used for the "fit too good to be true" check at small N, where chi2(df) is far off (X² = 0 with
// N = 15 in three equal categories: exact 756756 / 3^15 = 0.0527, chi2(2) gives 0).
#include "exact_lower_tail.hpp"

#include <cmath>

#include "exact_multinomial.hpp"

namespace tallyproof {
namespace {

constexpr double kLn10 = 2.302585092994045684;

struct Walk {
    const OutcomeScores& s;
    std::vector<double> log_pi;
    double limit;  // T(x) <= limit counts
    std::vector<double> zero_suffix;  // sum of score[i][0] over i >= j: the categories left all take 0
    double scale = -INFINITY, sum = 0;

    void add(double log_mass) {
        if (log_mass > scale) {
            sum = sum * std::exp(scale - log_mass) + 1;
            scale = log_mass;
        } else {
            sum += std::exp(log_mass - scale);
        }
    }
    // Categories j.. take the remaining `left` counts.
    void visit(std::size_t j, int left, double score, double log_mass) {
        const std::size_t last = s.shares.size() - 1;
        if (left == 0) {
            // Nothing left to place: one outcome, in one step rather than one level per category
            // (k = 1000 at N = 2 walked 5e8 levels for 5e5 outcomes).
            if (score + zero_suffix[j] <= limit) add(log_mass);
            return;
        }
        if (j == last) {
            const double t = score + s.score[j][static_cast<std::size_t>(left)];
            if (t <= limit) add(log_mass + left * log_pi[j] - s.log_factorial[static_cast<std::size_t>(left)]);
            return;
        }
        for (int x = 0; x <= left; ++x)
            visit(j + 1, left - x, score + s.score[j][static_cast<std::size_t>(x)],
                  log_mass + x * log_pi[j] - s.log_factorial[static_cast<std::size_t>(x)]);
    }
};

}  // namespace

Status exact_lower_tail(const std::vector<double>& observed, const std::vector<double>& expected, double lambda,
                        TailProbability* out) {
    MultinomialTestSpec spec;
    spec.observed = observed;
    spec.null_shares = expected;
    spec.ordering = ExtremeOrdering::statistic;
    spec.lambda = lambda;
    double n = 0;
    for (double o : observed) n += o;
    if (!(n >= 1) || n > 1e7) return Status::failure("The exact lower tail is enumerated only for small totals.");
    const double outcomes = multinomial_outcome_count(static_cast<int>(n), static_cast<int>(observed.size()));
    if (!(outcomes <= kMaxLowerTailOutcomes))
        return Status::failure("Too many outcomes to enumerate for the exact lower tail.");
    OutcomeScores s;
    Status st = make_outcome_scores(spec, &s);
    if (!st.ok) return st;
    Walk w{s, {}, s.observed_score + kTieRelativeTolerance * std::max(1.0, std::fabs(s.observed_score)), {}};
    for (double pi : s.shares) w.log_pi.push_back(std::log(pi));
    w.zero_suffix.assign(s.shares.size() + 1, 0.0);
    for (std::size_t j = s.shares.size(); j-- > 0;) w.zero_suffix[j] = w.zero_suffix[j + 1] + s.score[j][0];
    w.visit(0, s.n, 0.0, s.log_factorial[static_cast<std::size_t>(s.n)]);
    const double log_p = std::min(0.0, w.scale + std::log(w.sum));
    *out = TailProbability{std::exp(log_p), log_p / kLn10};
    return Status::success();
}

}  // namespace tallyproof
