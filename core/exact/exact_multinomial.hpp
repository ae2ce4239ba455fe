// Exact multinomial goodness-of-fit p-value P(T >= t_obs) for T a power-divergence statistic or
// the outcome probability (outcomes no more probable than the observed). Branch and bound over
// count prefixes (in the spirit of Resin 2023, J. Comput. Graph. Stat. 32(2):539-550): a prefix
// whose every completion is extreme adds its closed-form binomial mass, so p is a sum of positive
// terms (no 1 - P(acceptance) cancellation); rounding bound stated per run, typically < 1e-12.
#pragma once
#include <cstdint>
#include <string>
#include <vector>

#include "chi_square_tail.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

enum class ExtremeOrdering {
    statistic,    // extreme: power-divergence statistic >= observed
    probability,  // extreme: outcome probability <= observed (the "exact multinomial test")
};

// Ties: a statistic within 1e-9 relative of the observed one (a probability within 1e-9 relative,
// i.e. log-probability within 1e-9) counts as at least as extreme, so outcomes equal in exact
// arithmetic but not in rounding (permutations under equal shares) are all counted.
constexpr double kTieRelativeTolerance = 1e-9;

// The question both the exact and the Monte Carlo p-value answer.
struct MultinomialTestSpec {
    std::vector<double> observed;     // non-negative whole counts, total N >= 1
    std::vector<double> null_shares;  // non-negative, positive total (rescaled to sum 1)
    ExtremeOrdering ordering = ExtremeOrdering::statistic;
    double lambda = 1.0;              // power-divergence lambda (> -1) for the statistic ordering
};

// Extremeness as a separable score T(x) = sum_j score[j][x_j] (left-to-right sum): the
// centred power-divergence terms, or log x_j! - x_j log pi_j (= -log P(x) + log N!). Categories
// with share 0 (and count 0) are dropped. An outcome is extreme iff T(x) >= threshold.
struct OutcomeScores {
    ExtremeOrdering ordering = ExtremeOrdering::statistic;
    int n = 0;
    std::vector<std::size_t> kept;             // original index of each category used
    std::vector<double> shares;                // pi_j of the kept categories, summing to 1
    std::vector<int> observed;                 // observed counts of the kept categories
    std::vector<std::vector<double>> score;    // [j][x - score_lo[j]], x = 0..n unless windowed
    std::vector<int> score_lo;                 // first x of each row: 0 unless windowed
    double lambda = 1;                         // of the power divergence (statistic ordering)
    std::vector<double> log_factorial;         // log x!, x = 0..n (empty when windowed)
    double observed_score = 0;                 // T(observed)
    double threshold = 0;                      // observed_score less the tie tolerance
};

// Validates the spec (refusals name the bad input) and builds the score tables. Refuses
// lambda <= -1 (infinite statistic at every outcome with an empty category) and, for full rows
// (the exact tests), N > 1e7 or N * k > 2e7 (rows of N + 1 doubles: 160 MB at the limit).
// windowed (for Monte Carlo): each row holds only x within 40 standard deviations of N pi_j and
// log_factorial is left empty, so memory grows with sqrt(N k), not N k; outcome_score gives the rest.
// Refused there: N > kMaxSimulatedTotal (counts are int; Bin(N, q) draws take int trials) or windows
// of more than kMaxWindowedScoreEntries entries in all (32 MB; about N k <= 2.5e9 for equal shares).
constexpr double kMaxSimulatedTotal = 1e9;
constexpr double kMaxWindowedScoreEntries = 4e6;
Status make_outcome_scores(const MultinomialTestSpec& spec, OutcomeScores* scores, bool windowed = false);
// T_j(x) for any x in 0..n, the same value a full row holds.
double outcome_score(const OutcomeScores& scores, std::size_t j, int x);

struct ExactMultinomialOptions {
    double max_work = 1e8;  // refuse when the estimated work units exceed this (~1e8 units/s natively)
};

struct ExactMultinomialResult {
    TailProbability p;                 // the exact p-value (log10 kept where p underflows)
    double error_bound = 0;            // bound on |computed p - exact p| (rounding + truncation)
    double relative_error_bound = 0;   // error_bound / p
    double p_lower = 0, p_upper = 1;   // certified bracket on the exact p (the grid's bounds; p -+ error_bound otherwise)
    std::uint64_t work_units = 0;      // outcome evaluations: boundary searches and tail terms
    std::uint64_t nodes = 0;           // count prefixes visited
    double estimated_work = 0;         // the estimate made before starting
    double total_outcomes = 0;         // C(N + k - 1, k - 1), for comparison
    double observed_score = 0;         // T(observed), see OutcomeScores
};

// V[j][m]: the least score of categories j.. holding m counts (every score row is discrete-convex,
// so an infimal convolution by merging sorted increments; Ibaraki & Katoh 1988). argmin (if given)
// receives the count of category j in that least completion. Rows j = 0..k-1; V[0] is left empty.
std::vector<std::vector<double>> least_completion_scores(const OutcomeScores& scores,
                                                         std::vector<std::vector<int>>* argmin = nullptr);

// Cheap estimate (chi-square-ellipsoid volume) of the work units the exact run will take.
double estimate_exact_work(const OutcomeScores& scores);
double multinomial_outcome_count(int n, int k);  // C(n + k - 1, k - 1) as a double

// Resumable exact computation. Start refuses (offering Monte Carlo) when the estimate exceeds
// options.max_work. Each step does about `budget` work units (finishing the prefix in hand).
struct ExactMultinomialState {
    struct Frame {
        int level, m, next, end;
        double log_mass, partial, abs_log;  // log P(prefix), prefix score, sum |log terms|
    };
    OutcomeScores s;
    std::vector<double> log_pi_cond, log_rest_cond, odds;  // per level: log q, log(1-q), q/(1-q)
    std::vector<std::vector<double>> min_rest;  // V[j][m]: least score of categories j.. summing to m
    std::vector<std::vector<int>> argmin;       // argmin split for V at level j
    std::vector<Frame> stack;
    double log_scale = 0, margin = 0, log_observed = 0;
    double sum = 0, compensation = 0, truncated = 0, worst_log_error = 0;
    int longest_tail = 0;
    WorkProgress progress;
    std::uint64_t nodes = 0;
    double estimated_work = 0;
    bool started = false;
    bool cancel_requested = false;
};

Status exact_multinomial_start(const MultinomialTestSpec& spec, const ExactMultinomialOptions& options,
                               ExactMultinomialState* state);
WorkProgress exact_multinomial_step(ExactMultinomialState* state, std::uint64_t budget);
void exact_multinomial_cancel(ExactMultinomialState* state);  // the next step reports cancelled
// The result once progress.done; a failure Status before that or after cancellation.
Status exact_multinomial_result(const ExactMultinomialState& state, ExactMultinomialResult* result);

// One-call form: start, then step until done.
Status exact_multinomial_p_value(const MultinomialTestSpec& spec, const ExactMultinomialOptions& options,
                                 ExactMultinomialResult* result);

}  // namespace tallyproof
