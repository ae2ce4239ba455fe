// Certified bracket on the exact p-value for any shares and any separable ordering (every
// power-divergence lambda > -1, or outcome probability): a dynamic programme over categories on
// (count so far, partial score on a grid of width h), the scores rounded down in one pass and up
// in the other, so the passes give p_low <= p <= p_high (an outcome's rounded-down score can only
// make fewer outcomes extreme, rounded-up more). Partial scores only grow: a prefix whose least
// completion is extreme joins the tail at once, one whose greatest is not is dropped. The grid is
// refined until the bracket is narrower than the requested bound, or (decision-aimed, after the
// bracket-and-refine use of lattices in Keich & Nagarajan 2006, J. Comput. Graph. Stat.
// 15:779-802) until it lies wholly on one side of alpha, or for a tail p <= 1e-3 until its
// relative width is 1e-6, whichever the work budget reaches first; p is its midpoint. For X² with
// shares whose reciprocals are fractions of small denominator (1/pi_j = p_j/q_j, q_j <= 1000),
// every term is a whole multiple of 1/(N lcm q_j): on that lattice the two passes coincide and
// the bracket closes (ties on the lattice are resolved exactly).
#pragma once
#include <cstdint>
#include <vector>

#include "compensated_sum.hpp"
#include "exact_multinomial.hpp"
#include "status.hpp"
#include "work_slice.hpp"

namespace tallyproof {

struct GridBracketOptions {
    double error_bound = 1e-6;  // wanted half-width of the bracket (absolute)
    int max_rounds = 12;        // grid refinements before giving the bracket reached
    double max_work = 2e9;      // work units (state updates) of all rounds; the next round is skipped past it
    double alpha = -1;          // decision aimed at: refinement stops once the bracket excludes it (none if outside (0, 1))
    double tail_p = 1e-3;       // a bracket reaching down to it may hold a tail p: refined toward tail_relative_width
    double tail_relative_width = 1e-6;  // (p_high - p_low) / p_low wanted for a tail p (six significant figures)
};

// Whether a bracket [p_low, p_high] needs no more refinement under the options: one reaching down
// to tail_p at its relative width, else alpha outside the bracket, else the half-width within error_bound.
bool grid_bracket_settled(const GridBracketOptions& options, double p_low, double p_high);
// Whether the bracket decides the test at alpha (rejecting when p <= alpha): p_high <= alpha or p_low > alpha.
bool bracket_decides(double p_low, double p_high, double alpha);

// Estimated work units (about 1e9 a second natively) to reach the bound from the first round.
double estimate_grid_bracket_work(const OutcomeScores& scores, double error_bound);

struct GridBracketState {
    struct Row {
        std::int64_t lo = 0;        // grid index of v[0]
        std::vector<double> v;
    };
    OutcomeScores s;
    GridBracketOptions options;
    std::vector<std::vector<double>> min_rest;   // V[j][m] (exact_multinomial's least completion)
    std::vector<std::vector<double>> max_rest;   // greatest completion score of categories j.. with m counts
    std::vector<double> shift;                   // min over x of score[j][x]; partial scores kept shifted
    std::vector<double> shift_rest;              // sum of shift over categories j..
    std::vector<double> q, odds;                 // conditional binomials
    double h = 0;                                // grid width of this round
    bool lattice = false;                        // X² with rational shares: h is the lattice unit, no rounding
    int round = 0, pass = 0, level = 0;          // pass 0: rounded down (p_low), 1: rounded up (p_high)
    std::vector<std::vector<std::int64_t>> inc;  // rounded increments [j][x] of this pass
    std::vector<Row> rows;
    CompensatedSum tail;
    double dropped = 0;                          // mass dropped in the upper pass (added to p_high)
    double light_cut = 0;                        // states lighter than this are dropped (lowered for a tail p)
    double p_low = 0, p_high = 1;                // best bracket so far
    double work = 0;                             // state updates so far
    double round_start_work = 0;                 // work when this round began
    double cells = 0, peak_cells = 0;            // grid cells held by one level's rows: now, and the most this round
    double estimated_work = 0;
    WorkProgress progress;
    bool cancel_requested = false;
};

Status grid_bracket_start(const OutcomeScores& scores, const GridBracketOptions& options, GridBracketState* state);
WorkProgress grid_bracket_step(GridBracketState* state, std::uint64_t budget);  // a category at a time
void grid_bracket_cancel(GridBracketState* state);
// p = midpoint, error_bound = half-width (with rounding); a bracket wider than asked is still returned.
Status grid_bracket_result(const GridBracketState& state, ExactMultinomialResult* result);

}  // namespace tallyproof
