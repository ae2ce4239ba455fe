// Previous-sample headers: the header is split into words (runs of ASCII letters and digits,
// lower-cased; "%" is a word of its own) and compared with three lists below. Common practice
// for spreadsheet headers; the lists are the documented rule (docs/analysis-document.md).
#include "previous_sample_header.hpp"

#include <vector>

namespace tallyproof {
namespace {

std::vector<std::string> words_of(const std::string& head) {
    std::vector<std::string> words;
    std::string word;
    auto flush = [&] { if (!word.empty()) words.push_back(word); word.clear(); };
    for (char c : head) {
        if (c >= 'A' && c <= 'Z') word += static_cast<char>(c - 'A' + 'a');
        else if ((c >= 'a' && c <= 'z') || (c >= '0' && c <= '9')) word += c;
        else { flush(); if (c == '%') words.push_back("%"); }
    }
    flush();
    return words;
}

bool has_word(const std::vector<std::string>& words, const char* const* list) {
    for (const auto& w : words)
        for (const char* const* l = list; *l != nullptr; ++l)
            if (w == *l) return true;
    return false;
}

// Two words in a row ("reference sample", "wave 1").
bool has_pair(const std::vector<std::string>& words, const char* const (*pairs)[2]) {
    for (std::size_t i = 0; i + 1 < words.size(); ++i)
        for (const char* const (*p)[2] = pairs; (*p)[0] != nullptr; ++p)
            if (words[i] == (*p)[0] && words[i + 1] == (*p)[1]) return true;
    return false;
}

// Words that name an earlier or comparison sample on their own.
constexpr const char* kPreviousWords[] = {"previous", "prior", "last", "before", "earlier", "baseline", "control",
                                          "pre", "past", "old", "older", "former", "preceding", nullptr};
// Word pairs that do so together.
constexpr const char* kPreviousPairs[][2] = {{"reference", "sample"}, {"reference", "group"}, {"reference", "period"},
                                             {"wave", "1"},           {"round", "1"},          {"sample", "1"},
                                             {"first", "wave"},       {"first", "round"},      {nullptr, nullptr}};
// Words that name a period or a sample: a third column and a count column both named so are two samples.
constexpr const char* kPeriodWords[] = {"month", "year", "week", "quarter", "day", "wave", "round", "period",
                                        "survey", "sample", "batch", "season", "term", nullptr};
// Words that name expected values: such a header is read as expected values, whatever else it says.
constexpr const char* kExpectedWords[] = {"expected", "expectation", "theory", "theoretical", "predicted", "prediction",
                                          "forecast", "target", "model", "null", "hypothesis", "hypothesised",
                                          "hypothesized", "share", "shares", "percent", "percentage", "pct",
                                          "proportion", "proportions", "ratio", "probability", "probabilities",
                                          "average", "mean", "law", "%", nullptr};

}  // namespace

bool names_previous_sample(const std::string& third_head, const std::string& count_head) {
    const auto third = words_of(third_head);
    if (third.empty() || has_word(third, kExpectedWords)) return false;
    if (has_word(third, kPreviousWords) || has_pair(third, kPreviousPairs)) return true;
    const auto count = words_of(count_head);
    return has_word(third, kPeriodWords) && has_word(count, kPeriodWords) && !has_word(count, kExpectedWords);
}

}  // namespace tallyproof
