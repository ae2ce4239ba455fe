// Expected counts E_i = N * pi_i for the null shares pi_i (common practice). Stated counts whose
// total differs from N by rounding (at most 0.5 per category), and shares whose total differs
// from 1 or 100 by rounding, are rescaled and reported; larger differences are refused.
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
    if (model.kind == ModelKind::shares) {
        // Shares total 1 (fractions) or 100 (percentages), give or take rounding of each share.
        const double kd = static_cast<double>(k);
        const bool fractions = std::fabs(total - 1) <= 0.005 * kd, percents = std::fabs(total - 100) <= 0.5 * kd;
        if (!fractions && !percents) {
            char buf[220];
            std::snprintf(buf, sizeof buf,
                          "The stated shares total %.10g; they must total 1 (fractions) or 100 (percentages).", total);
            std::string message = buf;
            // Whole numbers such as 5, 3, 1, 1 are far more often a ratio (5:3:1:1) than mistyped shares.
            bool whole = true;
            for (double v : model.values) whole = whole && v == std::floor(v);
            if (whole) {
                std::string ratio;
                for (std::size_t i = 0; i < model.values.size(); ++i) {
                    std::snprintf(buf, sizeof buf, "%s%.10g", i ? ":" : "", model.values[i]);
                    ratio += buf;
                }
                message += " If they are a ratio (" + ratio + "), choose Ratio as the expected mix (--model ratio).";
            }
            return Status::failure(message);
        }
        if (total != 1 && total != 100) {
            char buf[200];
            std::snprintf(buf, sizeof buf, "The stated shares total %.10g, rescaled to %s.", total, fractions ? "1" : "100%");
            warnings->push_back(buf);
        }
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
