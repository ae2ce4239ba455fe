// Portable seeded random numbers: xoshiro256** (Blackman & Vigna 2021, ACM TOMS 47(4):36) seeded
// by splitmix64 (Steele, Lea & Flood 2014, OOPSLA); Lemire (2019, ACM TOMACS 29:3) bounded integers;
// binomial and multinomial draws by Walker (1977, ACM TOMS 3:253) alias tables, Vose (1991) build.
// Binomials of more than kDirectMaxTrials trials are drawn without tables by BTRD (Hörmann 1993,
// J. Statist. Comput. Simul. 46:101-110; core/numerics/binomial_draw.hpp), at a cost that does
// not grow with the trials. Integer ops, IEEE +,-,*,/, sqrt and portable_log only, so a seed gives
// bit-identical draws natively and in WebAssembly; tables omit only tail weights below 2^-64 of
// the mode's (< 1e-15 in total per table).
#pragma once
#include <cstddef>
#include <cstdint>
#include <memory>
#include <vector>

#include "binomial_draw.hpp"

namespace tallyproof {

struct Xoshiro256 {
    std::uint64_t s[4] = {0, 0, 0, 0};
};

Xoshiro256 seed_xoshiro256(std::uint64_t seed);        // state from splitmix64(seed)
inline std::uint64_t next_u64(Xoshiro256* g) {          // 64 uniform bits (inline: it is in every draw's loop)
    std::uint64_t* s = g->s;
    const std::uint64_t result = ((s[1] * 5) << 7 | (s[1] * 5) >> 57) * 9;  // rotl(s1 * 5, 7) * 9
    const std::uint64_t t = s[1] << 17;
    s[2] ^= s[0];
    s[3] ^= s[1];
    s[1] ^= s[2];
    s[0] ^= s[3];
    s[2] ^= t;
    s[3] = (s[3] << 45) | (s[3] >> 19);  // rotl(s3, 45)
    return result;
}
inline double next_unit(Xoshiro256* g) {  // uniform on [0, 1), 53-bit grid
    return static_cast<double>(next_u64(g) >> 11) * 0x1.0p-53;
}
std::uint32_t next_below(Xoshiro256* g, std::uint32_t n);  // uniform on {0..n-1}, unbiased; n >= 1

// Alias table of a distribution on {lo, ..., lo + size - 1}.
struct AliasColumn {
    double accept;         // keep this column with this probability
    std::uint32_t alias;   // otherwise take this column
};
struct AliasTable {
    int lo = 0;
    std::vector<AliasColumn> columns;
};

// Binomial(n, q) alias table, q = odds / (1 + odds) given as odds = q / (1 - q) > 0 (odds are
// what the conditional multinomial steps have exactly). n >= 0.
AliasTable binomial_alias_table(int n, double q, double odds);
// One draw from one 53-bit uniform u: column floor(u size), kept if frac(u size) < accept, so
// probabilities are resolved to size * 2^-53 (about 1e-13 for tables of 1000 columns).
int sample_alias(const AliasTable& t, Xoshiro256* g);

// Multinomial(n, pi) sampler. Sparse tables (n <= kCategoricalPerCategory * k) are drawn as n
// single categorical draws from one alias table over the k categories (one 64-bit word per draw:
// its high 32 bits pick the column by Lemire's exact multiply-and-reject, its low 32 bits decide
// the alias, so shares are resolved to 2^-32 of a column), O(n + k) per table. Otherwise by
// sequential conditional binomials. A binomial of m <= kDirectMaxTrials
// trials is drawn from one alias table for (category, m); a larger one by draw_binomial (BTRD or,
// where its mode is below 11, the waiting-time method) with the smaller of q and 1 - q, except
// for the first category, which always has all n trials: its one table of Bin(n, q_0) is kept
// outside the cache when it has at most kFirstTableMaxColumns columns.
// Tables are built on first use and cached; when the cache would exceed max_cached_entries
// (columns plus slots, 16 bytes each) it is emptied. The cache changes speed, never draws.
// The switch point was chosen by measurement (docs/benchmarks.md, "Monte Carlo p-values on the
// grid of issue #28").
constexpr int kDirectMaxTrials = 1024;
constexpr double kFirstTableMaxColumns = 65536;  // 1 MB
constexpr int kCategoricalPerCategory = 32;
struct CategoryColumn {
    std::uint64_t keep;   // keep the column when the low 32 bits are below this (2^32: always)
    std::uint32_t alias;  // otherwise take this category
};
struct MultinomialSampler {
    int n = 0;
    std::vector<CategoryColumn> categories;  // non-empty: the categorical path is used
    std::vector<double> q;     // q[j] = pi_j / (pi_j + ... + pi_{k-1})
    std::vector<double> odds;  // pi_j / (pi_{j+1} + ... + pi_{k-1})
    std::vector<BinomialShare> share;  // min(q_j, 1 - q_j) for draw_binomial
    std::vector<char> flipped;         // 1 where share[j] is 1 - q_j (then the draw is m - Bin(m, 1 - q_j))
    struct Slot {  // flat view of one cached table: one load before the column itself
        const AliasColumn* columns = nullptr;  // null until built
        int lo = 0;
        std::uint32_t size = 0;
    };
    std::size_t direct_size = 0;                           // min(n, kDirectMaxTrials) + 1
    std::vector<std::vector<Slot>> direct;                 // [j][m], m <= kDirectMaxTrials; rows made on first use
    std::vector<std::shared_ptr<const AliasTable>> owned;  // keeps the cached tables alive
    AliasTable first;          // Bin(n, q_0), built on first use when narrow enough (first_built)
    bool first_built = false;
    std::size_t cached_entries = 0;
    std::size_t max_cached_entries = std::size_t(1) << 22;  // 16 B each: 64 MB; cleared when exceeded
};

// Sampler for n trials over shares `pi` (non-negative, positive sum; need not sum to 1).
// Returns false (and leaves *s empty) on bad arguments.
enum class MultinomialPath { automatic, categorical, conditional_binomials };
bool make_multinomial_sampler(int n, const std::vector<double>& pi, MultinomialSampler* s,
                              MultinomialPath path = MultinomialPath::automatic);
void sample_multinomial(MultinomialSampler* s, Xoshiro256* g, int* counts);  // counts[k]
// One draw of Bin(m, q[j]) as sample_multinomial makes it on the conditional path (j + 1 < k, 0 <= m <= n).
int sample_binomial(MultinomialSampler* s, std::size_t j, int m, Xoshiro256* g);

}  // namespace tallyproof
