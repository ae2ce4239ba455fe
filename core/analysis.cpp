// Names of model kinds as they appear in the analysis document.
#include "analysis.hpp"

namespace tallyproof {
namespace {
struct KindName { ModelKind kind; const char* name; };
constexpr KindName kKindNames[] = {
    {ModelKind::equal, "equal"},
    {ModelKind::shares, "shares"},
    {ModelKind::ratio, "ratio"},
    {ModelKind::counts, "counts"},
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

}  // namespace tallyproof
