// Null shares per model kind: stated mixes through expected_counts(); digit laws from
// digit_laws (Benford 1938; uniform last digits); fitted distributions by grouped maximum
// likelihood (fit_discrete, fit_binned_continuous), each estimated parameter costing one df.
#include "null_model.hpp"

#include <cmath>
#include <optional>

#include "fit_category_values.hpp"
#include "digit_laws.hpp"
#include "expected_counts.hpp"
#include "fit_binned_continuous.hpp"
#include "fit_discrete.hpp"
#include "number_format.hpp"

namespace tallyproof {
namespace {

std::optional<double> given(const Model& m, const char* name) {
    for (const auto& [k, v] : m.parameters)
        if (k == name) return v;
    return std::nullopt;
}

Status unknown_parameters(const Model& m, std::initializer_list<const char*> allowed) {
    for (const auto& [k, v] : m.parameters) {
        bool ok = false;
        for (const char* a : allowed) ok = ok || k == a;
        if (!ok) {
            std::string list;
            for (const char* a : allowed) list += std::string(list.empty() ? "" : ", ") + a;
            return Status::failure("The " + std::string(model_kind_name(m.kind)) + " model has no parameter \"" +
                                   k.substr(0, 30) + "\"" + (list.empty() ? "." : " (its parameters: " + list + ")."));
        }
    }
    return Status::success();
}

Status digit_model(const Analysis& a, NullModel* out) {
    DigitTest test = DigitTest::first;
    digit_test_of(a.model.kind, &test);
    const std::vector<int> digits = digit_values(test);
    if (a.categories.size() != digits.size())
        return Status::failure("The " + std::string(digit_test_name(test)) + " law has " + std::to_string(digits.size()) +
                               " categories (" + std::to_string(digits.front()) + " to " + std::to_string(digits.back()) +
                               ") but there are " + std::to_string(a.categories.size()) + ".");
    for (std::size_t i = 0; i < digits.size(); ++i) {
        if (a.categories[i] != std::to_string(digits[i]))
            return Status::failure("For the " + std::string(digit_test_name(test)) + " law the categories must be the digits " +
                                   std::to_string(digits.front()) + " to " + std::to_string(digits.back()) +
                                   " in order; category " + std::to_string(i + 1) + " is \"" + a.categories[i].substr(0, 30) + "\".");
    }
    out->shares = digit_probabilities(test);
    out->description = (test == DigitTest::last || test == DigitTest::last_even)
                           ? std::string("uniform ") + digit_test_name(test)
                           : std::string("Benford's law, ") + digit_test_name(test);
    return Status::success();
}

Status fitted_model(const Analysis& a, NullModel* out) {
    const Model& m = a.model;
    FittedDistribution fit;
    std::vector<IntegerBin> bins;
    const bool continuous = m.kind == ModelKind::normal || m.kind == ModelKind::lognormal || m.kind == ModelKind::exponential;
    if (continuous) {
        if (m.edges.size() != a.observed.size() + 1)
            return Status::failure("Binned measurements need " + std::to_string(a.observed.size() + 1) +
                                   " bin edges for " + std::to_string(a.observed.size()) + " bins; " +
                                   std::to_string(m.edges.size()) + " were given.");
    } else {
        Status s = integer_bins_from_labels(a.categories, &bins);
        if (!s.ok) return s;
    }
    Status s;
    switch (m.kind) {
        case ModelKind::poisson:
            s = unknown_parameters(m, {"mean"});
            if (s.ok) fit = fit_poisson(bins, a.observed, given(m, "mean"));
            break;
        case ModelKind::binomial: {
            s = unknown_parameters(m, {"trials", "p"});
            const auto trials = given(m, "trials");
            if (s.ok && !trials) return Status::failure("The binomial model needs the number of trials (parameter \"trials\").");
            if (s.ok) fit = fit_binomial(bins, a.observed, *trials, given(m, "p"));
            break;
        }
        case ModelKind::geometric:
            s = unknown_parameters(m, {"p"});
            if (s.ok) fit = fit_geometric(bins, a.observed, given(m, "p"));
            break;
        case ModelKind::negative_binomial:
            s = unknown_parameters(m, {"size", "p", "mean"});
            if (s.ok) fit = fit_negative_binomial(bins, a.observed, {given(m, "size"), given(m, "p"), given(m, "mean")});
            break;
        case ModelKind::uniform:
            s = unknown_parameters(m, {});
            if (s.ok) fit = fit_discrete_uniform(bins, a.observed);
            break;
        case ModelKind::normal:
            s = unknown_parameters(m, {"mean", "sd"});
            if (s.ok) fit = fit_normal(m.edges, a.observed, given(m, "mean"), given(m, "sd"));
            break;
        case ModelKind::lognormal:
            s = unknown_parameters(m, {"meanlog", "sdlog"});
            if (s.ok) fit = fit_lognormal(m.edges, a.observed, given(m, "meanlog"), given(m, "sdlog"));
            break;
        case ModelKind::exponential:
            s = unknown_parameters(m, {"rate"});
            if (s.ok) fit = fit_exponential(m.edges, a.observed, given(m, "rate"));
            break;
        default:
            return Status::failure("Internal: not a fitted model.");
    }
    if (!s.ok) return s;
    if (!fit.status.ok) return fit.status;
    if (fit.probabilities.size() != a.observed.size())
        return Status::failure("The fitted model changed the number of cells; give bins that cover the whole range.");
    out->shares = fit.probabilities;
    out->parameters = fit.parameters;
    out->estimated_parameters = fit.estimated_parameters;
    out->warnings.insert(out->warnings.end(), fit.warnings.begin(), fit.warnings.end());
    std::string d = fit.model;
    for (const auto& p : fit.parameters)
        d += ", " + p.name + " " + (p.estimated ? "estimated " + format_significant(p.value, 4) : "given " + format_plain(p.value));
    out->description = d;
    return Status::success();
}

}  // namespace

bool digit_test_of(ModelKind kind, DigitTest* t) {
    switch (kind) {
        case ModelKind::benford_first: *t = DigitTest::first; return true;
        case ModelKind::benford_second: *t = DigitTest::second; return true;
        case ModelKind::benford_first_two: *t = DigitTest::first_two; return true;
        case ModelKind::last_digit: *t = DigitTest::last; return true;
        case ModelKind::last_digit_even: *t = DigitTest::last_even; return true;
        default: return false;
    }
}

ModelKind model_kind_of(DigitTest test) {
    switch (test) {
        case DigitTest::first: return ModelKind::benford_first;
        case DigitTest::second: return ModelKind::benford_second;
        case DigitTest::first_two: return ModelKind::benford_first_two;
        case DigitTest::last: return ModelKind::last_digit;
        case DigitTest::last_even: return ModelKind::last_digit_even;
    }
    return ModelKind::benford_first;
}

Status null_model(const Analysis& a, double n, NullModel* out) {
    *out = NullModel{};
    const std::size_t k = a.observed.size();
    if (model_is_digit_law(a.model.kind)) return digit_model(a, out);
    if (model_is_fitted(a.model.kind)) return fitted_model(a, out);
    std::vector<double> expected;
    Status s = expected_counts(a.model, k, n, &expected, &out->warnings);
    if (!s.ok) return s;
    out->shares.resize(k);
    for (std::size_t i = 0; i < k; ++i) out->shares[i] = expected[i] / n;
    switch (a.model.kind) {
        case ModelKind::equal: out->description = "equal shares across " + std::to_string(k) + " categories"; break;
        case ModelKind::shares: {
            double total = 0;
            for (double v : a.model.values) total += v;
            std::string r;
            for (double v : a.model.values) r += (r.empty() ? "" : ", ") + format_plain(v);
            out->description = "stated shares " + r + (std::fabs(total - 100) < std::fabs(total - 1) ? " (%)" : "");
            break;
        }
        case ModelKind::ratio: {
            std::string r;
            for (double v : a.model.values) r += (r.empty() ? "" : ":") + format_plain(v);
            out->description = "ratio " + r;
            break;
        }
        case ModelKind::counts: {
            std::string r;
            for (double v : a.model.values) r += (r.empty() ? "" : ", ") + format_plain(v);
            out->description = "stated expected counts " + r;
            break;
        }
        default: break;
    }
    return Status::success();
}

}  // namespace tallyproof
