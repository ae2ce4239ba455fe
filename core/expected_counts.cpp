// Expected counts E_i = N * pi_i for the null shares pi_i (common practice). Stated counts whose
// total differs from N by rounding (at most 0.5 per category) are rescaled to N and reported.
#include "expected_counts.hpp"

#include <cmath>
#include <cstdio>
#include <string>

namespace tallyproof {

Status expected_counts(const Model& model, std::size_t k, double n, std::vector<double>* expected,
                       std::vector<std::string>* warnings) {
    expected->assign(k, 0.0);
    if (model.kind == ModelKind::equal) {
        for (auto& e : *expected) e = n / static_cast<double>(k);
        return Status::success();
    }
    if (model.values.size() != k) {
        return Status::failure("The " + std::string(model_kind_name(model.kind)) + " model has " +
                               std::to_string(model.values.size()) + " values but there are " +
                               std::to_string(k) + " categories.");
    }
    double total = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double v = model.values[i];
        if (!std::isfinite(v) || v < 0) {
            char buf[160];
            std::snprintf(buf, sizeof buf, "Expected value %g for category %zu must be a non-negative number.", v, i + 1);
            return Status::failure(buf);
        }
        total += v;
    }
    if (!(total > 0)) return Status::failure("The expected values are all zero.");
    if (model.kind == ModelKind::counts && std::fabs(total - n) > 0.5 * static_cast<double>(k)) {
        char buf[200];
        std::snprintf(buf, sizeof buf,
                      "The expected counts total %.10g but the observed counts total %.10g; they must agree.", total, n);
        return Status::failure(buf);
    }
    if (model.kind == ModelKind::counts && total != n) {
        char buf[200];
        std::snprintf(buf, sizeof buf, "Expected counts total %.10g, rescaled to the observed total %.10g.", total, n);
        warnings->push_back(buf);
    }
    for (std::size_t i = 0; i < k; ++i) (*expected)[i] = n * (model.values[i] / total);
    return Status::success();
}

}  // namespace tallyproof
