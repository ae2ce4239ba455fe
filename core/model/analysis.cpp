// Names of the analysis document's enumerations, exactly as they appear in the JSON.
#include "analysis.hpp"

namespace tallyproof {
namespace {
struct KindName { ModelKind kind; const char* name; };
constexpr KindName kKindNames[] = {
    {ModelKind::equal, "equal"},
    {ModelKind::shares, "shares"},
    {ModelKind::ratio, "ratio"},
    {ModelKind::counts, "counts"},
    {ModelKind::poisson, "poisson"},
    {ModelKind::binomial, "binomial"},
    {ModelKind::geometric, "geometric"},
    {ModelKind::negative_binomial, "negative-binomial"},
    {ModelKind::uniform, "uniform"},
    {ModelKind::normal, "normal"},
    {ModelKind::lognormal, "lognormal"},
    {ModelKind::exponential, "exponential"},
    {ModelKind::benford_first, "benford-first"},
    {ModelKind::benford_second, "benford-second"},
    {ModelKind::benford_first_two, "benford-first-two"},
    {ModelKind::last_digit, "last-digit"},
    {ModelKind::last_digit_even, "last-digit-even"},
    {ModelKind::reference_sample, "reference-sample"},
};
}  // namespace

const char* model_kind_name(ModelKind kind) {
    for (const auto& k : kKindNames)
        if (k.kind == kind) return k.name;
    return "unknown";
}

bool model_kind_from_name(const std::string& name, ModelKind* kind) {
    for (const auto& k : kKindNames)
        if (name == k.name) { *kind = k.kind; return true; }
    return false;
}

bool model_is_fitted(ModelKind kind) {
    switch (kind) {
        case ModelKind::poisson: case ModelKind::binomial: case ModelKind::geometric:
        case ModelKind::negative_binomial: case ModelKind::uniform: case ModelKind::normal:
        case ModelKind::lognormal: case ModelKind::exponential: return true;
        default: return false;
    }
}

bool model_is_digit_law(ModelKind kind) {
    switch (kind) {
        case ModelKind::benford_first: case ModelKind::benford_second: case ModelKind::benford_first_two:
        case ModelKind::last_digit: case ModelKind::last_digit_even: return true;
        default: return false;
    }
}

const char* pvalue_method_name(PValueMethod m) {
    switch (m) {
        case PValueMethod::asymptotic: return "asymptotic";
        case PValueMethod::exact: return "exact";
        case PValueMethod::monte_carlo: return "monte-carlo";
    }
    return "asymptotic";
}

}  // namespace tallyproof
