// Maximiser for grouped (multinomial) log-likelihoods of one or two parameters, used by the
// fit_* functions. One parameter: a grid scan on the transformed scale, Brent (1973) inside the
// best grid cell, then Newton steps on a central-difference score. Two: Nelder and Mead (1965)
// with restarts, then Newton steps on a central-difference gradient and Hessian.
#pragma once
#include <functional>
#include <vector>

namespace tallyproof {

// The scale a parameter is searched on: real (as is), positive (log), unit_interval (logit).
enum class ParameterScale { real, positive, unit_interval };

struct ParameterSearch {
    ParameterScale scale = ParameterScale::real;
    double start = 0;   // starting value (natural units), e.g. from the raw moments
    double step = 0.25; // typical step on the search scale (log/logit units unless real)
    double lower = 0;   // search box, natural units; the maximum must lie strictly inside
    double upper = 0;
};

struct MaximumLikelihood {
    bool converged = false;       // a maximum strictly inside the box, with zero score
    bool at_boundary = false;     // the likelihood rises towards an edge of the box
    int boundary_parameter = -1;  // which parameter ran to the edge
    bool boundary_upper = false;  // it ran to the upper edge
    std::vector<double> theta;    // natural units
    double log_likelihood = 0;
    int evaluations = 0;
};

// `log_likelihood` returns -inf where the data are impossible; it must not throw.
using LogLikelihood = std::function<double(const std::vector<double>& theta)>;

// Maximises over 1 or 2 parameters (other sizes: converged = false).
MaximumLikelihood maximise_log_likelihood(const LogLikelihood& log_likelihood,
                                          const std::vector<ParameterSearch>& parameters);

}  // namespace tallyproof
