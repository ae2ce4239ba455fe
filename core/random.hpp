// Portable seeded random numbers: xoshiro256** (Blackman & Vigna 2021, ACM TOMS 47(4):36) seeded
// by splitmix64 (Steele, Lea & Flood 2014, OOPSLA); Lemire (2019, ACM TOMACS 29:3) bounded integers;
// binomial and multinomial draws by Walker (1977, ACM TOMS 3:253) alias tables, Vose (1991) build.
// Integer ops and IEEE +,-,*,/ only, so a seed gives bit-identical draws natively and in
// WebAssembly; tables omit only tail weights below 2^-64 of the mode's (< 1e-15 in total).
#pragma once
#include <cstddef>
#include <cstdint>
#include <memory>
#include <vector>

namespace tallyproof {

struct Xoshiro256 {
    std::uint64_t s[4] = {0, 0, 0, 0};
};

Xoshiro256 seed_xoshiro256(std::uint64_t seed);        // state from splitmix64(seed)
std::uint64_t next_u64(Xoshiro256* g);                 // 64 uniform bits
double next_unit(Xoshiro256* g);                       // uniform on [0, 1), 53-bit grid
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

// Multinomial(n, pi) sampler by sequential conditional binomials; alias tables are built on
// first use per (category, remaining count) and cached (the cache changes speed, never draws).
struct MultinomialSampler {
    int n = 0;
    std::vector<double> q;     // q[j] = pi_j / (pi_j + ... + pi_{k-1})
    std::vector<double> odds;  // pi_j / (pi_{j+1} + ... + pi_{k-1})
    struct Slot {  // flat view of one cached table: one load before the column itself
        const AliasColumn* columns = nullptr;  // null until built
        int lo = 0;
        std::uint32_t size = 0;
    };
    std::vector<Slot> slots;                               // [j * (n + 1) + remaining]
    std::vector<std::shared_ptr<const AliasTable>> owned;  // keeps the cached tables alive
    std::size_t cached_entries = 0;
    std::size_t max_cached_entries = std::size_t(1) << 22;  // 16 B each: 64 MB; cleared when exceeded
};

// Sampler for n trials over shares `pi` (non-negative, positive sum; need not sum to 1).
// Returns false (and leaves *s empty) on bad arguments.
bool make_multinomial_sampler(int n, const std::vector<double>& pi, MultinomialSampler* s);
void sample_multinomial(MultinomialSampler* s, Xoshiro256* g, int* counts);  // counts[k]

}  // namespace tallyproof
