// Survey sample checks and counts (Lumley 2010, "Complex Surveys", ch. 1-2; the lonely-PSU rule
// of R's survey package, ?surveyoptions) and Kish's (1965, "Survey Sampling", s. 11.7) weighting
// design effect 1 + CV² of the weights.
#include "survey_sample.hpp"

#include <cmath>
#include <map>
#include <set>
#include <utility>

#include "compensated_sum.hpp"

namespace tallyproof {

namespace {

std::size_t stratum_of(const SurveySample& s, std::size_t i) { return s.stratum.empty() ? 0 : s.stratum[i]; }
// A respondent's PSU: its cluster, or the respondent itself when there are no clusters.
std::size_t psu_of(const SurveySample& s, std::size_t i) { return s.cluster.empty() ? i : s.cluster[i]; }

}  // namespace

std::size_t survey_psu_count(const SurveySample& s) {
    std::set<std::pair<std::size_t, std::size_t>> psus;
    for (std::size_t i = 0; i < s.weight.size(); ++i) psus.insert({stratum_of(s, i), psu_of(s, i)});
    return psus.size();
}

std::size_t survey_stratum_count(const SurveySample& s) {
    std::set<std::size_t> strata;
    for (std::size_t i = 0; i < s.weight.size(); ++i) strata.insert(stratum_of(s, i));
    return strata.size();
}

Status check_survey_sample(const SurveySample& s) {
    const std::size_t n = s.weight.size();
    if (n == 0) return Status::failure("There are no respondents: the survey rows are empty.");
    if (s.category.size() != n || (!s.stratum.empty() && s.stratum.size() != n) || (!s.cluster.empty() && s.cluster.size() != n))
        return Status::failure("The survey columns have different lengths.");
    if (s.categories.size() < 2)
        return Status::failure("Only one category" + (s.categories.empty() ? std::string() : " (\"" + s.categories[0] + "\")") +
                               ": a goodness-of-fit test needs at least two.");
    CompensatedSum total;
    for (std::size_t i = 0; i < n; ++i) {
        if (s.category[i] >= s.categories.size()) return Status::failure("A respondent's category is out of range.");
        if (!(std::isfinite(s.weight[i]) && s.weight[i] > 0))
            return Status::failure("Respondent " + std::to_string(i + 1) + " has a weight that is not a positive number: "
                                   "survey weights must be greater than 0.");
        if (!s.stratum.empty() && s.stratum[i] >= s.strata.size()) return Status::failure("A respondent's stratum is out of range.");
        if (!s.cluster.empty() && s.cluster[i] >= s.clusters.size()) return Status::failure("A respondent's cluster is out of range.");
        total.add(s.weight[i]);
    }
    if (!std::isfinite(total.value())) return Status::failure("The weights sum to more than a double can hold.");
    // PSUs per stratum: a stratum with one PSU has no within-stratum variance to estimate.
    std::map<std::size_t, std::set<std::size_t>> psus;
    for (std::size_t i = 0; i < n; ++i) psus[stratum_of(s, i)].insert(psu_of(s, i));
    for (const auto& [h, members] : psus) {
        if (members.size() >= 2) continue;
        const std::string name = s.stratum.empty() ? std::string("the sample") : "stratum \"" + s.strata[h] + "\"";
        return Status::failure("Only one " + std::string(s.cluster.empty() ? "respondent" : "cluster") + " in " + name +
                               ": its variance cannot be estimated (a lonely PSU). R's survey package refuses this too by "
                               "default; merge the stratum with a similar one (the usual collapse) and test again.");
    }
    return Status::success();
}

double kish_design_effect(const std::vector<double>& weights) {
    CompensatedSum sum, squares;
    for (double w : weights) {
        sum.add(w);
        squares.add(w * w);
    }
    const double n = static_cast<double>(weights.size());
    if (weights.empty() || !(sum.value() > 0)) return NAN;
    return n * squares.value() / (sum.value() * sum.value());
}

}  // namespace tallyproof
