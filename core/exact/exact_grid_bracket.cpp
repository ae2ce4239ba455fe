// Grid-bracket exact p-value: the branch-and-bound walk's separable scores (exact_multinomial),
// shifted to be non-negative per category, rounded to integer multiples of h down (pass 0) and up
// (pass 1); each pass is an exact computation of P(rounded score >= threshold) by a dynamic
// programme over categories with conditional binomial masses (Johnson, Kemp & Kotz 2005, sect.
// 11.2 for the multinomial as sequential binomials), so the two results bracket the true p.
// Dropped light states only lower pass 0 and are added to pass 1: the bracket stays certified.
// Refinement is aimed at what the bracket must show (Keich & Nagarajan 2006, J. Comput. Graph.
// Stat. 15:779-802, refine a lattice only as far as the question needs): each round's grid is
// chosen from the width wanted (alpha outside, or a tail p's relative width) and from the work
// and memory the last round took, so the rounds stay within the budget.
#include "exact_grid_bracket.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>

#include "binomial_terms.hpp"
#include "chi_square_tail.hpp"

namespace tallyproof {
namespace {

constexpr double kEps = std::numeric_limits<double>::epsilon();
constexpr double kInitialCells = 2000;  // grid cells across the threshold in the first round, budget allowing
constexpr double kLeastInitialCells = 64;  // the coarsest first round (large k and N: a wide first bracket)
// and at least this many cells a category: the rounding moves a score by up to k cells, so a grid of
// fewer than a few k cells brackets nothing and prunes nothing (measured natively, bench_exact_bracket
// shares 1..100: N = 1000 at 64 cells gave [6e-14, 1] in 0.2 s, at 4 k cells [3.6e-11, 5.1e-9] in 0.3 s;
// N = 5000 at 64 cells [2e-34, 1] in 1.2 s, at 4 k cells [3e-18, 4.5e-11] in 1.3 s, at 8 k cells 3.8 s).
constexpr double kLeastCellsPerCategory = 4;
constexpr double kMaxCells = 6e6;       // grid cells of all rows of one level, at most (48 MB a copy)

double shifted_threshold(const GridBracketState& st) { return st.s.threshold - st.shift_rest[0]; }

// Grid index past which a (shifted) partial score is extreme, for the pass in hand.
std::int64_t threshold_index(const GridBracketState& st) {
    const double t = shifted_threshold(st) / st.h;
    const double mg = 1e-9 + 8 * kEps * (std::fabs(st.s.threshold) + std::fabs(st.shift_rest[0])) / st.h;
    if (st.lattice) return static_cast<std::int64_t>(std::ceil(t - 1e-6));
    return st.pass == 0 ? static_cast<std::int64_t>(std::ceil(t + mg)) : static_cast<std::int64_t>(std::floor(t - mg));
}

double margin_of(const GridBracketState& st, double a, double b) {
    return 1e-9 + 8 * kEps * (std::fabs(a) + std::fabs(b)) / st.h;
}

void begin_pass(GridBracketState* st) {
    const int k = static_cast<int>(st->s.shares.size()), n = st->s.n;
    st->inc.assign(static_cast<std::size_t>(k), std::vector<std::int64_t>(static_cast<std::size_t>(n) + 1));
    for (int j = 0; j < k; ++j)
        for (int x = 0; x <= n; ++x) {
            const double sc = st->s.score[j][x];
            const double d = (sc - st->shift[j]) / st->h, mg = margin_of(*st, sc, st->shift[j]);
            if (st->lattice) {
                st->inc[j][x] = static_cast<std::int64_t>(std::llround(d));
                continue;
            }
            st->inc[j][x] = st->pass == 0 ? static_cast<std::int64_t>(std::floor(d - mg)) : static_cast<std::int64_t>(std::ceil(d + mg));
        }
    st->rows.assign(static_cast<std::size_t>(n) + 1, {});
    st->rows[0].lo = 0;
    st->rows[0].v.assign(1, 1.0);
    st->tail = CompensatedSum{};
    st->dropped = 0;
    st->level = 0;
}

// Least and greatest grid index a completion of categories j.. holding M counts can add.
void completion_indices(const GridBracketState& st, int j, int M, std::int64_t* least, std::int64_t* most) {
    const int k = static_cast<int>(st.s.shares.size());
    const double r = k - j;
    const double v = st.min_rest[j][M] - st.shift_rest[j], w = st.max_rest[j][M] - st.shift_rest[j];
    const double mv = margin_of(st, st.min_rest[j][M], st.shift_rest[j]) + 1e-10 * (1 + std::fabs(st.min_rest[j][M]));
    const double mw = margin_of(st, st.max_rest[j][M], st.shift_rest[j]) + 1e-10 * (1 + std::fabs(st.max_rest[j][M]));
    // Each rounded term is within one cell (and the margin) of its true value.
    if (st.pass == 0) {
        *least = static_cast<std::int64_t>(std::floor(v / st.h - mv - r * (1 + mv)));
        *most = static_cast<std::int64_t>(std::ceil(w / st.h + mw));
    } else {
        *least = static_cast<std::int64_t>(std::floor(v / st.h - mv));
        *most = static_cast<std::int64_t>(std::ceil(w / st.h + mw + r * (1 + mw)));
    }
}

void run_level(GridBracketState* st) {
    const int k = static_cast<int>(st->s.shares.size()), n = st->s.n, j = st->level;
    const std::int64_t I = threshold_index(*st);
    const double cut = st->light_cut;
    std::vector<GridBracketState::Row> next(static_cast<std::size_t>(n) + 1);
    std::vector<std::int64_t> dst_lo(static_cast<std::size_t>(n) + 1, std::numeric_limits<std::int64_t>::max()),
        dst_hi(static_cast<std::size_t>(n) + 1, std::numeric_limits<std::int64_t>::min());
    std::vector<double> pmf, suffix;
    for (int phase = 0; phase < 2; ++phase) {  // 0: spans of the next rows, 1: the masses
        for (int m = 0; m <= n; ++m) {
            const GridBracketState::Row& row = st->rows[static_cast<std::size_t>(m)];
            if (row.v.empty()) continue;
            const int M = n - m;
            const std::int64_t len = static_cast<std::int64_t>(row.v.size());
            if (phase == 1) {
                suffix.assign(row.v.size() + 1, 0.0);
                for (std::size_t i = row.v.size(); i-- > 0;) suffix[i] = suffix[i + 1] + row.v[i];
                st->work += static_cast<double>(row.v.size());  // counted too: at fine grids it rivals the updates
            }
            if (j == k - 1) {  // the last category takes the rest
                if (phase == 0) continue;
                const std::int64_t from = I - st->inc[j][M] - row.lo;
                st->tail.add(suffix[static_cast<std::size_t>(std::clamp<std::int64_t>(from, 0, len))]);
                continue;
            }
            int lo = 0, hi = 0;
            const double bounded = binomial_terms(M, st->q[j], st->odds[j], st->s.log_factorial, &pmf, &lo, &hi);
            st->work += static_cast<double>(hi - lo + 1);  // the terms visited, in both phases
            if (phase == 1 && st->pass == 1) st->dropped += suffix[0] * bounded;
            for (int x = lo; x <= hi; ++x) {
                const std::int64_t d = st->inc[j][x];
                std::int64_t least = 0, most = 0;
                completion_indices(*st, j + 1, M - x, &least, &most);
                // Source index i (absolute): extreme for sure at i >= I - d - least; never below I - d - most.
                const std::int64_t cap = I - d - least - row.lo, dead = I - d - most - row.lo;  // row-relative
                const std::int64_t l0 = std::max<std::int64_t>(0, dead), l1 = std::min<std::int64_t>(len, cap);
                if (phase == 0) {
                    if (l0 < l1) {
                        auto& a = dst_lo[static_cast<std::size_t>(m + x)];
                        auto& b = dst_hi[static_cast<std::size_t>(m + x)];
                        a = std::min(a, row.lo + l0 + d);
                        b = std::max(b, row.lo + l1 + d);
                    }
                    continue;
                }
                const double px = pmf[static_cast<std::size_t>(x)];
                if (cap < len) st->tail.add(px * suffix[static_cast<std::size_t>(std::max<std::int64_t>(0, cap))]);
                if (l0 >= l1) continue;
                GridBracketState::Row& dst = next[static_cast<std::size_t>(m + x)];
                double* out = dst.v.data() + (row.lo + d - dst.lo);
                const double* in = row.v.data();
                for (std::int64_t i = l0; i < l1; ++i) out[i] += px * in[i];
                st->work += static_cast<double>(l1 - l0);
            }
        }
        if (phase == 0)
            for (int m = 0; m <= n; ++m)
                if (dst_lo[static_cast<std::size_t>(m)] < dst_hi[static_cast<std::size_t>(m)]) {
                    next[static_cast<std::size_t>(m)].lo = dst_lo[static_cast<std::size_t>(m)];
                    next[static_cast<std::size_t>(m)].v.assign(
                        static_cast<std::size_t>(dst_hi[static_cast<std::size_t>(m)] - dst_lo[static_cast<std::size_t>(m)]), 0.0);
                }
    }
    // Light states: dropped (pass 0 may only lose mass; pass 1 adds it to its bound).
    for (auto& row : next) {
        if (row.v.empty()) continue;
        double light = 0;
        std::size_t a = row.v.size(), b = 0;
        for (std::size_t i = 0; i < row.v.size(); ++i) {
            if (row.v[i] < cut) {
                light += row.v[i];
                row.v[i] = 0;
            } else {
                a = std::min(a, i);
                b = i + 1;
            }
        }
        if (st->pass == 1) st->dropped += light;
        if (a >= b) {
            row = GridBracketState::Row{};
        } else if (a > 0 || b < row.v.size()) {
            row.v = std::vector<double>(row.v.begin() + static_cast<std::ptrdiff_t>(a), row.v.begin() + static_cast<std::ptrdiff_t>(b));
            row.lo += static_cast<std::int64_t>(a);
        }
    }
    double cells = 0;
    for (const auto& row : next) cells += static_cast<double>(row.v.size());
    st->cells = cells;
    st->peak_cells = std::max(st->peak_cells, cells);
    st->rows.swap(next);
    ++st->level;
}

// Work units of one round (both passes) times its grid width: rows x binomial terms x categories
// over the span a prefix's completions straddle (the terms of estimate_grid_bracket_work).
double round_work_times_width(const OutcomeScores& sc, double span) {
    const double k = static_cast<double>(sc.shares.size()), n = sc.n;
    const double states = std::min(n + 1, 16 * std::sqrt(n / 4) + 1), terms = 18 * std::sqrt(n / k) + 3;
    return 2 * k * states * terms * std::min(span, 12 * std::sqrt(2 * k));
}

// Denominator q <= 1000 with |v - p/q| <= 1e-12 v (continued fractions), or 0.
std::int64_t small_denominator(double v) {
    double x = v;
    std::int64_t p0 = 1, q0 = 0, p1 = static_cast<std::int64_t>(std::floor(x)), q1 = 1;
    for (int it = 0; it < 40; ++it) {
        if (std::fabs(v - static_cast<double>(p1) / q1) <= 1e-12 * v) return q1;
        const double frac = x - std::floor(x);
        if (frac < 1e-15) return 0;
        x = 1 / frac;
        const std::int64_t a = static_cast<std::int64_t>(std::floor(x));
        const std::int64_t p2 = a * p1 + p0, q2 = a * q1 + q0;
        if (q2 > 1000) return 0;
        p0 = p1; q0 = q1; p1 = p2; q1 = q2;
    }
    return 0;
}

// The lattice unit of X² terms (see the header), or 0 when the shares have none small enough.
double pearson_lattice_unit(const OutcomeScores& sc) {
    if (sc.ordering != ExtremeOrdering::statistic || sc.lambda != 1.0) return 0;
    std::int64_t l = 1;
    for (double p : sc.shares) {
        const std::int64_t q = small_denominator(1.0 / p);
        if (q == 0) return 0;
        l = l / std::gcd(l, q) * q;
        if (l > 1000000) return 0;
    }
    return 1.0 / (static_cast<double>(sc.n) * static_cast<double>(l));
}

// The observed table and the tables tied with it by permuting counts among categories of equal
// share have the same score and the same rounded-down score: if pass 0 left them out (their score
// lies within the rounding of the threshold, as the observed always does), their known mass
// P(observed) x (number of such tables) belongs to the lower bound.
double missed_ties(const GridBracketState& st) {
    const int k = static_cast<int>(st.s.shares.size());
    std::int64_t f = 0;
    for (int j = 0; j < k; ++j) f += st.inc[j][st.s.observed[j]];
    if (f >= threshold_index(st)) return 0;  // counted already
    const auto& lf = st.s.log_factorial;
    double log_p = lf[st.s.n];
    for (int j = 0; j < k; ++j) log_p += -lf[st.s.observed[j]] + st.s.observed[j] * std::log(st.s.shares[j]);
    // Distinct arrangements within each group of equal shares: g! / prod(multiplicity!).
    std::vector<bool> seen(static_cast<std::size_t>(k), false);
    for (int j = 0; j < k; ++j) {
        if (seen[j]) continue;
        std::vector<int> counts;
        for (int l = j; l < k; ++l)
            if (!seen[l] && st.s.shares[l] == st.s.shares[j] && st.s.score[l] == st.s.score[j]) {
                seen[l] = true;
                counts.push_back(st.s.observed[l]);
            }
        std::sort(counts.begin(), counts.end());
        log_p += std::lgamma(counts.size() + 1.0);
        for (std::size_t a = 0; a < counts.size();) {
            std::size_t b = a;
            while (b < counts.size() && counts[b] == counts[a]) ++b;
            log_p -= std::lgamma(static_cast<double>(b - a) + 1.0);
            a = b;
        }
    }
    // Rounded down by a relative 1e-12 (lgamma and the sums): still a lower bound.
    return std::exp(log_p) * (1 - 1e-12 * (1 + std::fabs(log_p)));
}

}  // namespace

bool bracket_decides(double p_low, double p_high, double alpha) {
    if (!(alpha > 0 && alpha < 1)) return false;
    return p_high <= alpha || p_low > alpha;
}

bool grid_bracket_settled(const GridBracketOptions& o, double p_low, double p_high) {
    // A bracket reaching down to the tail may hold a tail p: it is refined toward six figures even
    // when it already decides the test (the decision does not change; the figures do).
    if (p_low <= o.tail_p) return p_high - p_low <= o.tail_relative_width * p_low;
    if (bracket_decides(p_low, p_high, o.alpha)) return true;
    return p_high - p_low <= 2 * o.error_bound;
}

double estimate_grid_bracket_work(const OutcomeScores& sc, double error_bound) {
    const double k = static_cast<double>(sc.shares.size()), n = sc.n;
    if (k < 2) return 1;
    double least = 0;
    for (std::size_t j = 0; j < sc.shares.size(); ++j) least += *std::min_element(sc.score[j].begin(), sc.score[j].end());
    const double span = std::max(1.0, sc.threshold - least);
    // Density of the statistic at the threshold (chi-square guide; the probability ordering's score
    // is half a chi-square there) times the k cells the rounding spreads it over.
    const double x = sc.ordering == ExtremeOrdering::probability ? 2 * std::max(0.0, sc.observed_score - least) : sc.observed_score;
    double f = chi_square_density(std::max(x, 1e-3), k - 1) * (sc.ordering == ExtremeOrdering::probability ? 2 : 1);
    f = std::max(f, 1e-6);
    const double h = std::min(span / kInitialCells, 2 * error_bound / (f * k));
    const double states = std::min(n + 1, 16 * std::sqrt(n / 4) + 1), terms = 18 * std::sqrt(n / k) + 3;
    // Two passes; earlier coarser rounds add about a third.
    return 2 * 1.33 * k * states * terms * std::min(span, 12 * std::sqrt(2 * k)) / h;
}

Status grid_bracket_start(const OutcomeScores& sc, const GridBracketOptions& options, GridBracketState* st) {
    *st = GridBracketState{};
    if (sc.log_factorial.empty() || sc.shares.size() < 2) return Status::failure("Internal: the grid bracket needs full score rows.");
    if (!(options.error_bound > 0)) return Status::failure("The exact-test error bound must be positive.");
    st->s = sc;
    st->options = options;
    st->light_cut = std::min(1e-18, options.error_bound * 1e-10);
    const int k = static_cast<int>(sc.shares.size()), n = sc.n;
    st->shift.assign(static_cast<std::size_t>(k), 0.0);
    st->shift_rest.assign(static_cast<std::size_t>(k) + 1, 0.0);
    for (int j = 0; j < k; ++j) st->shift[j] = *std::min_element(sc.score[j].begin(), sc.score[j].end());
    for (int j = k - 1; j >= 0; --j) st->shift_rest[j] = st->shift_rest[j + 1] + st->shift[j];
    st->min_rest = least_completion_scores(sc);
    st->min_rest.push_back(std::vector<double>(static_cast<std::size_t>(n) + 1, std::numeric_limits<double>::infinity()));
    st->min_rest[k][0] = 0;  // no categories left: only an empty completion
    // Greatest completion: scores are convex, so at a vertex (all M counts in one category).
    st->max_rest.assign(static_cast<std::size_t>(k) + 1, {});
    st->max_rest[k].assign(static_cast<std::size_t>(n) + 1, -std::numeric_limits<double>::infinity());
    st->max_rest[k][0] = 0;
    std::vector<double> best(static_cast<std::size_t>(n) + 1, -std::numeric_limits<double>::infinity());
    double zeros = 0;
    for (int j = k - 1; j >= 1; --j) {
        zeros += sc.score[j][0];
        for (int m = 0; m <= n; ++m) best[m] = std::max(best[m], sc.score[j][m] - sc.score[j][0]);
        st->max_rest[j].resize(static_cast<std::size_t>(n) + 1);
        for (int m = 0; m <= n; ++m) st->max_rest[j][m] = zeros + best[m];
    }
    std::vector<double> rest(static_cast<std::size_t>(k) + 1, 0.0);
    for (int j = k - 1; j >= 0; --j) rest[j] = rest[j + 1] + sc.shares[j];
    st->q.assign(static_cast<std::size_t>(k), 1.0);
    st->odds.assign(static_cast<std::size_t>(k), 0.0);
    for (int j = 0; j + 1 < k; ++j) {
        st->q[j] = sc.shares[j] / rest[j];
        st->odds[j] = sc.shares[j] / rest[j + 1];
    }
    st->estimated_work = estimate_grid_bracket_work(sc, options.error_bound);
    st->progress.units_estimate = static_cast<std::uint64_t>(2 * k * 3);
    const double span = std::max(1e-12, shifted_threshold(*st));
    if (shifted_threshold(*st) <= 0) {  // every outcome is extreme
        st->p_low = st->p_high = 1;
        st->progress.done = true;
        st->progress.fraction = 1;
        return Status::success();
    }
    // The first round takes at most a quarter of the budget (a coarser grid at large k and N), so
    // later rounds have room to refine; it is never coarser than kLeastInitialCells cells.
    const double first_h = round_work_times_width(sc, span) / std::max(1.0, options.max_work / 4);
    st->h = std::min(span / std::max(kLeastInitialCells, kLeastCellsPerCategory * k), std::max(span / kInitialCells, first_h));
    const double unit = pearson_lattice_unit(sc);
    // The lattice closes the bracket in one round, but that round is not bounded by max_work as the
    // refinements are: taken only when its estimated state updates (cells x categories x the count
    // pairs of a level) fit the budget; otherwise the grid brackets p within it (a 6 s lattice run
    // at k = 10, N = 50 with shares 1..10 had been chosen for a 1 s budget).
    const double lattice_work = span / std::max(unit, 1e-300) * static_cast<double>(sc.shares.size()) *
                                (sc.n + 1.0) * (sc.n + 2.0) / 2;
    if (unit > 0 && span / unit <= 4e6 && lattice_work <= options.max_work) {
        st->lattice = true;
        st->h = unit;
    }
    begin_pass(st);
    return Status::success();
}

WorkProgress grid_bracket_step(GridBracketState* st, std::uint64_t budget) {
    WorkProgress& pr = st->progress;
    if (pr.done || pr.cancelled) return pr;
    if (st->cancel_requested) {
        pr.cancelled = true;
        st->rows.clear();
        return pr;
    }
    const int k = static_cast<int>(st->s.shares.size());
    const double start = st->work;
    while (!pr.done && st->work - start < static_cast<double>(budget)) {
        run_level(st);
        ++pr.units_done;
        if (st->round > 0 && st->work > st->options.max_work) {  // a refinement ran over: keep the last bracket
            pr.done = true;
            st->rows.clear();
            st->inc.clear();
            break;
        }
        if (st->level < k) continue;
        if (st->pass == 0) {
            st->p_low = std::max(st->p_low, std::min(1.0, st->tail.value() + missed_ties(*st)));
            if (!st->lattice && grid_bracket_settled(st->options, st->p_low, st->p_high)) {  // with the last round's p_high
                ++st->round;
                pr.done = true;
                st->rows.clear();
                st->inc.clear();
                break;
            }
            st->pass = 1;
            begin_pass(st);
            continue;
        }
        st->p_high = std::min(st->p_high, std::min(1.0, st->tail.value() + st->dropped));
        const GridBracketOptions& o = st->options;
        const double width = st->p_high - st->p_low;
        const double round_work = st->work - st->round_start_work;
        ++st->round;
        bool enough = grid_bracket_settled(o, st->p_low, st->p_high);
        // A tail p whose width is mostly the light states' mass: lower the cut in proportion (the
        // lattice then runs once more on the same grid; the grid's next round uses it too).
        bool cut_lowered = false;
        if (!enough && st->p_low <= o.tail_p && st->p_low > 0 && st->dropped > 0.1 * o.tail_relative_width * st->p_low) {
            st->light_cut = std::max(1e-300, st->light_cut * std::min(0.1, 0.01 * o.tail_relative_width * st->p_low / st->dropped));
            cut_lowered = true;
        }
        enough = enough || (st->lattice && !cut_lowered);
        // The width wanted next: a tail p's relative width, else alpha outside, else the bound.
        double wanted = 2 * o.error_bound;
        if (st->p_low <= o.tail_p) wanted = o.tail_relative_width * std::max(st->p_low, 1e-3 * st->p_high);
        else if (o.alpha > 0 && o.alpha < 1) wanted = std::max(wanted, 0.5 * std::fabs(0.5 * (st->p_low + st->p_high) - o.alpha));
        double shrink = std::clamp(wanted / std::max(width, 1e-300), 1.0 / 16, 0.5);
        // Work and cells grow as 1/shrink: the next round must fit the budget left and the memory.
        const double left = o.max_work - st->work;
        shrink = std::max({shrink, 1.25 * round_work / std::max(left, 1e-300), 1.25 * st->peak_cells / kMaxCells});
        const bool too_costly = st->round >= o.max_rounds || shrink > 0.5;
        if (enough || too_costly) {
            pr.done = true;
            st->rows.clear();
            st->inc.clear();
            break;
        }
        if (!st->lattice) st->h *= shrink;
        st->pass = 0;
        st->round_start_work = st->work;
        st->peak_cells = 0;
        begin_pass(st);
    }
    if (pr.done) {
        pr.fraction = 1;
        pr.units_estimate = pr.units_done;
    } else {
        pr.units_estimate = std::max(pr.units_estimate, pr.units_done + 1);
        pr.fraction = in_flight_fraction(pr.units_done, pr.units_estimate);
    }
    return pr;
}

void grid_bracket_cancel(GridBracketState* st) { st->cancel_requested = true; }

Status grid_bracket_result(const GridBracketState& st, ExactMultinomialResult* r) {
    *r = ExactMultinomialResult{};
    if (st.progress.cancelled) return Status::failure("The exact computation was cancelled.");
    if (!st.progress.done) return Status::failure("The exact computation has not finished.");
    const double lf = st.s.log_factorial.empty() ? 1.0 : st.s.log_factorial.back() + 1.0;
    const int k = static_cast<int>(st.s.shares.size());
    const double rel = k * (4 * lf + 3.0 * st.s.n + 8) * kEps + (st.s.n + 2.0 * k) * kEps;
    const double lo = std::max(0.0, st.p_low * (1 - rel)), hi = std::min(1.0, st.p_high * (1 + rel));
    const double p = 0.5 * (lo + hi);
    if (!(p > 0)) return Status::failure("The exact p-value could not be bracketed for this table; use the Monte Carlo p-value instead.");
    r->p.p = p;
    r->p.log10_p = std::min(0.0, std::log10(p));
    r->error_bound = 0.5 * (hi - lo);
    r->relative_error_bound = r->error_bound / p;
    r->p_lower = lo;
    r->p_upper = hi;
    r->work_units = static_cast<std::uint64_t>(st.work);
    r->estimated_work = st.estimated_work;
    r->total_outcomes = multinomial_outcome_count(st.s.n, k);
    r->observed_score = st.s.observed_score;
    return Status::success();
}

}  // namespace tallyproof
