// Label forms for count categories are common practice in frequency tables ("5 or more",
// "3-4"); the forms accepted are listed in fit_category_values.hpp. Bins must ascend contiguously.
#include "fit_category_values.hpp"

#include <cctype>
#include <cmath>
#include <limits>

namespace tallyproof {
namespace {

std::string lower_trimmed(const std::string& s) {
    std::size_t b = 0, e = s.size();
    while (b < e && std::isspace(static_cast<unsigned char>(s[b]))) ++b;
    while (e > b && std::isspace(static_cast<unsigned char>(s[e - 1]))) --e;
    std::string out;
    for (std::size_t i = b; i < e; ++i) out += static_cast<char>(std::tolower(static_cast<unsigned char>(s[i])));
    return out;
}

bool strip_prefix(std::string* s, const std::string& p) {
    if (s->compare(0, p.size(), p) != 0) return false;
    s->erase(0, p.size());
    while (!s->empty() && s->front() == ' ') s->erase(0, 1);
    return true;
}

bool strip_suffix(std::string* s, const std::string& p) {
    if (s->size() < p.size() || s->compare(s->size() - p.size(), p.size(), p) != 0) return false;
    s->erase(s->size() - p.size());
    while (!s->empty() && s->back() == ' ') s->pop_back();
    return true;
}

bool whole(const std::string& s, double* v) {
    if (s.empty() || s.size() > 15) return false;
    std::size_t i = 0;
    if (s[0] == '-') i = 1;
    if (i >= s.size()) return false;
    for (std::size_t j = i; j < s.size(); ++j)
        if (!std::isdigit(static_cast<unsigned char>(s[j]))) return false;
    *v = std::stod(s);
    return true;
}

bool read_bin(const std::string& label, IntegerBin* bin) {
    const double inf = std::numeric_limits<double>::infinity();
    std::string s = lower_trimmed(label);
    double v = 0, w = 0;
    if (whole(s, &v)) { *bin = {v, v}; return true; }
    std::string t = s;
    if (strip_suffix(&t, "or more") || strip_suffix(&t, "and more") || strip_suffix(&t, "and over") ||
        strip_suffix(&t, "or over") || strip_suffix(&t, "+")) {
        if (whole(t, &v)) { *bin = {v, inf}; return true; }
        return false;
    }
    t = s;
    if (strip_prefix(&t, "\xE2\x89\xA5") || strip_prefix(&t, ">=") || strip_prefix(&t, "at least")) {
        if (whole(t, &v)) { *bin = {v, inf}; return true; }
        return false;
    }
    t = s;
    if (strip_suffix(&t, "or fewer") || strip_suffix(&t, "or less") || strip_suffix(&t, "and under") ||
        strip_suffix(&t, "or under")) {
        if (whole(t, &v)) { *bin = {-inf, v}; return true; }
        return false;
    }
    t = s;
    if (strip_prefix(&t, "\xE2\x89\xA4") || strip_prefix(&t, "<=") || strip_prefix(&t, "up to") ||
        strip_prefix(&t, "at most")) {
        if (whole(t, &v)) { *bin = {-inf, v}; return true; }
        return false;
    }
    for (const char* sep : {"\xE2\x80\x93", " to ", "-"}) {  // en dash, "to", hyphen
        const std::size_t at = s.find(sep, 1);
        if (at == std::string::npos) continue;
        std::string a = lower_trimmed(s.substr(0, at)), b = lower_trimmed(s.substr(at + std::string(sep).size()));
        if (whole(a, &v) && whole(b, &w) && w >= v) { *bin = {v, w}; return true; }
    }
    return false;
}

}  // namespace

Status integer_bins_from_labels(const std::vector<std::string>& labels, std::vector<IntegerBin>* bins) {
    bins->clear();
    for (std::size_t i = 0; i < labels.size(); ++i) {
        IntegerBin b;
        if (!read_bin(labels[i], &b))
            return Status::failure("Category \"" + labels[i].substr(0, 40) +
                                   "\" is not a whole-number category (expected forms such as 3, 3-4, 5 or more, 2 or fewer).");
        if (!bins->empty() && !(b.lo == bins->back().hi + 1))
            return Status::failure("Category \"" + labels[i].substr(0, 40) +
                                   "\" does not follow on from the one before it; whole-number categories must ascend without gaps or overlaps.");
        bins->push_back(b);
    }
    return Status::success();
}

}  // namespace tallyproof
