// Portable seeded random numbers: xoshiro256** with splitmix64 seeding (Blackman & Vigna 2021),
// Lemire's (2019) unbiased bounded integers, and binomial/multinomial sampling by Walker alias
// tables (Vose 1991 construction) for binomials of at most kDirectMaxTrials trials; larger ones
// by draw_binomial (BTRD, Hörmann 1993, J. Statist. Comput. Simul. 46:101-110, see
// binomial_draw.hpp), whose cost does not grow with the trials and which needs no cache.
// Integer ops, IEEE +,-,*,/, sqrt and portable_log only (no platform libm), so results do not
// depend on the platform's math library; each table omits tails below 2^-64 of its mode weight
// (< 1e-15 in total).
// Sparse tables (n at most kCategoricalPerCategory per category) are drawn instead as n categorical
// draws from one Walker alias table over the categories (Lemire's exact column choice, 32-bit
// alias test): O(n + k) per table with no cache, so the cost is linear in k at a fixed n / k.
#include "random.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

namespace tallyproof {
namespace {

std::uint64_t splitmix64(std::uint64_t* x) {
    std::uint64_t z = (*x += 0x9e3779b97f4a7c15ULL);
    z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
    z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
    return z ^ (z >> 31);
}

constexpr double kTailCut = 5.421010862427522e-20;  // 2^-64: relative weight where tables stop

AliasTable point_mass(int x) {
    AliasTable t;
    t.lo = x;
    t.columns.assign(1, AliasColumn{1.0, 0});
    return t;
}

// Vose's (1991) stable alias construction over weights w summing to total.
std::vector<AliasColumn> vose_alias_columns(const std::vector<double>& w, double total) {
    const std::size_t size = w.size();
    std::vector<AliasColumn> columns(size, AliasColumn{1.0, 0});
    std::vector<double> scaled(size);
    std::vector<std::uint32_t> small, large;
    small.reserve(size);
    large.reserve(size);
    for (std::size_t i = 0; i < size; ++i) {
        scaled[i] = w[i] * static_cast<double>(size) / total;
        columns[i].alias = static_cast<std::uint32_t>(i);
        (scaled[i] < 1.0 ? small : large).push_back(static_cast<std::uint32_t>(i));
    }
    while (!small.empty() && !large.empty()) {
        const std::uint32_t l = small.back();
        small.pop_back();
        const std::uint32_t g = large.back();
        large.pop_back();
        columns[l].accept = scaled[l];
        columns[l].alias = g;
        scaled[g] = (scaled[g] + scaled[l]) - 1.0;
        (scaled[g] < 1.0 ? small : large).push_back(g);
    }
    for (std::uint32_t i : small) columns[i].accept = 1.0;  // leftovers are 1 up to rounding
    for (std::uint32_t i : large) columns[i].accept = 1.0;
    return columns;
}

}  // namespace

Xoshiro256 seed_xoshiro256(std::uint64_t seed) {
    Xoshiro256 g;
    std::uint64_t x = seed;
    for (auto& w : g.s) w = splitmix64(&x);
    return g;
}

std::uint32_t next_below(Xoshiro256* g, std::uint32_t n) {
    // Lemire's multiply-and-reject on 32-bit words: exactly uniform for every n.
    std::uint64_t m = (next_u64(g) >> 32) * n;
    std::uint32_t low = static_cast<std::uint32_t>(m);
    if (low < n) {
        const std::uint32_t threshold = static_cast<std::uint32_t>(-n) % n;
        while (low < threshold) {
            m = (next_u64(g) >> 32) * n;
            low = static_cast<std::uint32_t>(m);
        }
    }
    return static_cast<std::uint32_t>(m >> 32);
}

AliasTable binomial_alias_table(int n, double q, double odds) {
    if (n <= 0 || !(q > 0)) return point_mass(0);
    if (!(q < 1) || !(odds < std::numeric_limits<double>::infinity())) return point_mass(n);
    int mode = static_cast<int>(std::floor((n + 1.0) * q));
    if (mode > n) mode = n;
    // Weights relative to the mode by the ratio f(x+1)/f(x) = (n-x)/(x+1) * odds.
    std::vector<double> up{1.0}, down;
    for (int x = mode; x < n; ++x) {
        const double w = up.back() * (static_cast<double>(n - x) / (x + 1.0)) * odds;
        if (w < kTailCut) break;
        up.push_back(w);
    }
    for (int x = mode; x > 0; --x) {
        const double prev = down.empty() ? 1.0 : down.back();
        const double w = prev * (x / ((n - x + 1.0) * odds));
        if (w < kTailCut) break;
        down.push_back(w);
    }
    AliasTable t;
    t.lo = mode - static_cast<int>(down.size());
    const std::size_t size = down.size() + up.size();
    std::vector<double> w(size);
    for (std::size_t i = 0; i < down.size(); ++i) w[i] = down[down.size() - 1 - i];
    for (std::size_t i = 0; i < up.size(); ++i) w[down.size() + i] = up[i];
    // Sum from the smallest weights up so the total carries no avoidable rounding.
    double total = 0;
    {
        std::size_t lo = 0, hi = size;  // merge the two monotone halves from their small ends
        const std::size_t m0 = down.size();
        while (lo < m0 && hi > m0) total += (w[lo] <= w[hi - 1]) ? w[lo++] : w[--hi];
        while (lo < m0) total += w[lo++];
        while (hi > m0) total += w[--hi];
    }
    t.columns = vose_alias_columns(w, total);
    return t;
}

namespace {
// One draw from alias columns [0, size) offset by lo; every sampler here goes through it, so a
// seed gives the same draws whichever path a table is reached by.
inline int draw_columns(const AliasColumn* columns, std::uint32_t size, int lo, Xoshiro256* g) {
    if (size <= 1) return lo;
    const double x = next_unit(g) * static_cast<double>(size);  // exact: size < 2^31, u on 2^-53 grid
    const std::uint32_t col = static_cast<std::uint32_t>(x);  // truncation = floor for x >= 0
    const AliasColumn& c = columns[col];
    return lo + static_cast<int>(x - col < c.accept ? col : c.alias);
}
}  // namespace

int sample_alias(const AliasTable& t, Xoshiro256* g) {
    return draw_columns(t.columns.data(), static_cast<std::uint32_t>(t.columns.size()), t.lo, g);
}

bool make_multinomial_sampler(int n, const std::vector<double>& pi, MultinomialSampler* s, MultinomialPath path) {
    *s = MultinomialSampler{};
    const std::size_t k = pi.size();
    if (n < 0 || k == 0) return false;
    for (double p : pi)
        if (!std::isfinite(p) || p < 0) return false;
    // Suffix sums so every conditional share is formed without subtracting from 1.
    std::vector<double> rest(k + 1, 0.0);
    for (std::size_t j = k; j-- > 0;) rest[j] = rest[j + 1] + pi[j];
    if (!(rest[0] > 0)) return false;
    s->n = n;
    s->q.assign(k, 0.0);
    s->odds.assign(k, 0.0);
    s->share.assign(k, BinomialShare{});
    s->flipped.assign(k, 0);
    for (std::size_t j = 0; j < k; ++j) {
        s->q[j] = rest[j] > 0 ? pi[j] / rest[j] : 0.0;
        s->odds[j] = rest[j + 1] > 0 ? pi[j] / rest[j + 1] : std::numeric_limits<double>::infinity();
        // The smaller of q_j and 1 - q_j = rest[j + 1] / rest[j], each with its odds, from the suffix sums.
        if (!(rest[j] > 0) || pi[j] == 0) continue;  // q_j = 0: Bin(m, 0) = 0
        if (rest[j + 1] == 0) {                      // q_j = 1: m - Bin(m, 0)
            s->flipped[j] = 1;
            continue;
        }
        if (pi[j] <= rest[j + 1]) {
            s->share[j] = binomial_share(pi[j] / rest[j], pi[j] / rest[j + 1]);
        } else {
            s->share[j] = binomial_share(rest[j + 1] / rest[j], rest[j + 1] / pi[j]);
            s->flipped[j] = 1;
        }
    }
    s->direct_size = static_cast<std::size_t>(std::min(n, kDirectMaxTrials)) + 1;
    s->direct.assign(k, {});  // rows are made on first use
    const bool sparse = static_cast<double>(n) <= static_cast<double>(kCategoricalPerCategory) * static_cast<double>(k);
    if (k >= 2 && k < (std::size_t(1) << 31) &&
        (path == MultinomialPath::categorical || (path == MultinomialPath::automatic && sparse))) {
        const std::vector<AliasColumn> columns = vose_alias_columns(pi, rest[0]);
        s->categories.resize(k);
        for (std::size_t j = 0; j < k; ++j) {
            // keep = round(accept 2^32) exactly (accept <= 1, and 2^32 scaling is exact in IEEE).
            const double a = columns[j].accept * 4294967296.0;
            s->categories[j].keep = a >= 4294967296.0 ? (std::uint64_t(1) << 32) : static_cast<std::uint64_t>(a + 0.5);
            s->categories[j].alias = columns[j].alias;
        }
    }
    return true;
}

namespace {

void clear_cache(MultinomialSampler* s) {
    for (auto& row : s->direct) std::vector<MultinomialSampler::Slot>().swap(row);
    s->owned.clear();
    s->cached_entries = 0;
}

// Makes room for `entries` more cache entries, emptying the cache if the bound would be passed.
void reserve_entries(MultinomialSampler* s, std::size_t entries) {
    if (s->cached_entries + entries > s->max_cached_entries) clear_cache(s);
    s->cached_entries += entries;
}

// Builds and registers a table. Room for it and `extra` bookkeeping entries is made before it is
// registered, so the emptying of the cache can never free a table that is about to be handed out.
MultinomialSampler::Slot build_slot(MultinomialSampler* s, std::size_t j, int trials, std::size_t extra = 0) {
    auto made = std::make_shared<const AliasTable>(binomial_alias_table(trials, s->q[j], s->odds[j]));
    reserve_entries(s, made->columns.size() + extra);
    MultinomialSampler::Slot slot;
    slot.columns = made->columns.data();
    slot.lo = made->lo;
    slot.size = static_cast<std::uint32_t>(made->columns.size());
    s->owned.push_back(std::move(made));
    return slot;
}

// The table of Bin(m, q_j), m <= kDirectMaxTrials. The returned slot stays valid until the next
// table is built.
const MultinomialSampler::Slot& direct_slot(MultinomialSampler* s, std::size_t j, int m) {
    std::vector<MultinomialSampler::Slot>* row = &s->direct[j];
    if (row->empty()) {
        reserve_entries(s, s->direct_size);
        row->assign(s->direct_size, MultinomialSampler::Slot{});
    }
    MultinomialSampler::Slot* slot = &(*row)[static_cast<std::size_t>(m)];
    if (!slot->columns) {
        const MultinomialSampler::Slot made = build_slot(s, j, m);
        if (row->empty()) {  // the cache was emptied to make room
            reserve_entries(s, s->direct_size);
            row->assign(s->direct_size, MultinomialSampler::Slot{});
            slot = &(*row)[static_cast<std::size_t>(m)];
        }
        *slot = made;
    }
    return *slot;
}

inline int draw(const MultinomialSampler::Slot& slot, Xoshiro256* g) { return draw_columns(slot.columns, slot.size, slot.lo, g); }

}  // namespace

int sample_binomial(MultinomialSampler* s, std::size_t j, int m, Xoshiro256* g) {
    if (m == 0) return 0;
    if (m <= kDirectMaxTrials) {
        const std::vector<MultinomialSampler::Slot>& row = s->direct[j];
        if (!row.empty() && row[static_cast<std::size_t>(m)].columns) return draw(row[static_cast<std::size_t>(m)], g);
        return draw(direct_slot(s, j, m), g);
    }
    if (j == 0 && m == s->n) {  // the first category always has all n trials: one table, if not too wide
        if (!s->first_built) {
            s->first_built = true;
            const double q = s->q[0], sd = std::sqrt(static_cast<double>(m) * q * (1 - q));
            if (20 * sd + 64 <= kFirstTableMaxColumns) s->first = binomial_alias_table(m, q, s->odds[0]);
        }
        if (!s->first.columns.empty()) return sample_alias(s->first, g);
    }
    const int x = draw_binomial(m, s->share[j], g);
    return s->flipped[j] ? m - x : x;
}

void sample_multinomial(MultinomialSampler* s, Xoshiro256* g, int* counts) {
    const std::size_t k = s->q.size();
    if (!s->categories.empty()) {
        std::fill(counts, counts + k, 0);
        const CategoryColumn* columns = s->categories.data();
        const std::uint64_t size = k;
        const std::uint32_t reject_below = static_cast<std::uint32_t>(-static_cast<std::uint32_t>(size)) % static_cast<std::uint32_t>(size);
        for (int i = 0; i < s->n; ++i) {
            std::uint64_t u = next_u64(g);
            std::uint64_t m = (u >> 32) * size;  // Lemire (2019): column = m >> 32, exact after rejection
            while (static_cast<std::uint32_t>(m) < reject_below) {
                u = next_u64(g);
                m = (u >> 32) * size;
            }
            const CategoryColumn& c = columns[m >> 32];
            ++counts[(u & 0xffffffffULL) < c.keep ? (m >> 32) : c.alias];
        }
        return;
    }
    int m = s->n;
    for (std::size_t j = 0; j + 1 < k; ++j) {
        const int x = sample_binomial(s, j, m, g);
        counts[j] = x;
        m -= x;
    }
    counts[k - 1] = m;
}

}  // namespace tallyproof
