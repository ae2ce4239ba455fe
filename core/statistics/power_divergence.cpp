// Power-divergence statistics (Cressie & Read 1984) in the centred per-category form
// f_l(O,E) = 2/(l(l+1)) [O (O/E)^l - O - l (O - E)], evaluated through expm1/log1p so l near
// 0 needs no special case, and through the identity f_l(O,E) = f_{-1-l}(E,O) for l < -1/2 so
// l near -1 loses nothing. Williams' (1976) q for goodness of fit: 1 + (k^2 - 1)/(6 N nu),
// nu = k - 1, i.e. 1 + (k + 1)/(6 N) (as given by Sokal & Rohlf, Biometry; recalled from memory).
#include "power_divergence.hpp"

#include <cmath>
#include <cstdio>
#include <limits>

namespace tallyproof {
namespace {

// f_l(O, E) for O >= 0, E > 0, l >= -1/2 (the caller reflects smaller l).
double centred_term(double o, double e, double lambda) {
    if (lambda == 1.0) {
        const double d = o - e;
        return d * d / e;
    }
    if (o == 0) return 2.0 * e / (lambda + 1.0);  // O^(l+1) -> 0 for l > -1
    const double d = (o - e) / e;                 // r - 1, formed without cancellation
    const double log_r = std::log1p(d);
    const double r = o / e;
    // (r^l - 1)/l, continuous at l = 0 where it is log r.
    const double g = lambda == 0.0 ? log_r : std::expm1(lambda * log_r) / lambda;
    const double bracket = r * g - d;  // r (r^l - 1)/l - (r - 1) >= 0 by convexity
    return (2.0 * e / (lambda + 1.0)) * (bracket > 0 ? bracket : 0.0);
}

std::string lambda_text(double lambda) {
    const char* name = power_lambda_name(lambda);
    return "λ = " + lambda_value_text(lambda) + (*name ? std::string(" (") + name + ")" : std::string());
}

}  // namespace

const char* power_lambda_name(double lambda) {
    if (lambda == power_lambda::pearson) return "Pearson χ²";
    if (lambda == power_lambda::log_likelihood) return "likelihood ratio G²";
    if (lambda == power_lambda::freeman_tukey) return "Freeman-Tukey T²";
    if (lambda == power_lambda::mod_log_likelihood) return "modified likelihood ratio GM²";
    if (lambda == power_lambda::neyman) return "Neyman NM²";
    if (lambda == power_lambda::cressie_read) return "Cressie-Read CR";
    return "";
}

std::string lambda_value_text(double lambda) {
    if (lambda == power_lambda::cressie_read) return "2/3";
    if (lambda == power_lambda::freeman_tukey) return "−1/2";
    char buf[40];
    std::snprintf(buf, sizeof buf, "%.4g", std::fabs(lambda));
    return (lambda < 0 ? "−" : "") + std::string(buf);  // a true minus sign, as the page's list writes it
}

double power_divergence_term(double o, double e, double lambda) {
    const double nan = std::numeric_limits<double>::quiet_NaN();
    if (!std::isfinite(o) || !std::isfinite(e) || !std::isfinite(lambda) || o < 0 || !(e > 0)) return nan;
    if (lambda >= -0.5) return centred_term(o, e, lambda);
    if (o == 0) return lambda > -1.0 ? 2.0 * e / (lambda + 1.0) : std::numeric_limits<double>::infinity();
    return centred_term(e, o, -1.0 - lambda);  // f_l(O,E) = f_{-1-l}(E,O), from the definition
}

Status power_divergence(const std::vector<double>& observed, const std::vector<double>& expected,
                        const PowerDivergenceOptions& options, PowerDivergence* out) {
    *out = PowerDivergence{};
    const double lambda = options.lambda;
    const std::size_t k = observed.size();
    char buf[320];
    if (k == 0) return Status::failure("There are no categories to compare.");
    if (expected.size() != k) {
        std::snprintf(buf, sizeof buf, "There are %zu observed counts but %zu expected counts.", k, expected.size());
        return Status::failure(buf);
    }
    if (!std::isfinite(lambda))
        return Status::failure("The power-divergence parameter λ must be a finite number.");
    if (options.williams_correction && lambda != 0.0)
        return Status::failure("Williams' correction applies to the likelihood ratio G² (λ = 0) only; "
                               "here " + lambda_text(lambda) + ".");
    double n_obs = 0, n_exp = 0;
    std::size_t k_used = 0;
    for (std::size_t i = 0; i < k; ++i) {
        const double o = observed[i], e = expected[i];
        if (!std::isfinite(o) || o < 0) {
            std::snprintf(buf, sizeof buf, "Observed count %g for category %zu must be a non-negative number.", o, i + 1);
            return Status::failure(buf);
        }
        if (!std::isfinite(e) || e < 0) {
            std::snprintf(buf, sizeof buf, "Expected count %g for category %zu must be a non-negative number.", e, i + 1);
            return Status::failure(buf);
        }
        if (e == 0 && o > 0) {
            std::snprintf(buf, sizeof buf,
                          "Category %zu has an expected count of zero but was observed %g times: the stated mix "
                          "rules it out.", i + 1, o);
            return Status::failure(buf);
        }
        if (e > 0 && o == 0 && lambda <= -1.0) {
            std::snprintf(buf, sizeof buf,
                          "Category %zu has an observed count of 0: with %s the statistic is undefined there "
                          "(its term involves %s, infinite at O = 0). Choose λ > −1, e.g. G² or Pearson χ².",
                          i + 1, lambda_text(lambda).c_str(), lambda == -1.0 ? "E log(E/O)" : "E (E/O)^(−λ−1)");
            return Status::failure(buf);
        }
        n_obs += o;
        n_exp += e;
        if (e > 0) ++k_used;
    }
    if (!(n_exp > 0)) return Status::failure("The expected counts are all zero.");
    if (std::fabs(n_obs - n_exp) > 1e-8 * n_exp) {
        std::snprintf(buf, sizeof buf,
                      "The observed counts total %.10g but the expected counts total %.10g; they must agree.", n_obs,
                      n_exp);
        return Status::failure(buf);
    }
    if (options.williams_correction) {
        if (!(n_obs > 0)) return Status::failure("Williams' correction needs a positive total count.");
        out->williams_q = 1.0 + (static_cast<double>(k_used) + 1.0) / (6.0 * n_obs);
    }
    out->lambda = lambda;
    out->contributions.assign(k, 0.0);
    double sum = 0;
    for (std::size_t i = 0; i < k; ++i) {
        if (expected[i] == 0) continue;
        double c = power_divergence_term(observed[i], expected[i], lambda);
        if (options.williams_correction) c /= out->williams_q;
        if (!std::isfinite(c)) {
            std::snprintf(buf, sizeof buf, "The term of category %zu overflows with %s.", i + 1, lambda_text(lambda).c_str());
            *out = PowerDivergence{};
            return Status::failure(buf);
        }
        out->contributions[i] = c;
        sum += c;
    }
    out->statistic = sum;
    return Status::success();
}

std::string statistic_symbol(double lambda) {
    if (lambda == power_lambda::pearson) return "χ²";
    if (lambda == power_lambda::log_likelihood) return "G²";
    if (lambda == power_lambda::freeman_tukey) return "T²";
    if (lambda == power_lambda::mod_log_likelihood) return "GM²";
    if (lambda == power_lambda::neyman) return "NM²";
    return "CR";
}

}  // namespace tallyproof
