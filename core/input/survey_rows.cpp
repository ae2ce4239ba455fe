// Survey rows read into a SurveySample: delimited text (core/text/delimited_text), columns by
// header name or number as the group column is chosen (grouped_table), weights read by
// read_typed_number. The design conventions are R survey's (Lumley 2010, ch. 2).
#include "survey_rows.hpp"

#include <algorithm>
#include <cmath>
#include <map>
#include <numeric>

#include "delimited_text.hpp"
#include "label_text.hpp"
#include "number_reading.hpp"
#include "parsed_input.hpp"

namespace tallyproof {
namespace {

std::string lower(std::string_view s) {
    std::string out(s);
    for (char& c : out)
        if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a');
    return out;
}

bool is_column_number(const std::string& spec, std::size_t* index) {
    if (spec.empty() || !std::all_of(spec.begin(), spec.end(), [](char c) { return c >= '0' && c <= '9'; })) return false;
    if (spec.size() > 6) return false;
    const std::size_t v = static_cast<std::size_t>(std::stoul(spec));
    if (v < 1) return false;
    *index = v - 1;
    return true;
}

// Index of an interned label.
std::size_t intern(const std::string& key, std::map<std::string, std::size_t>* seen, std::vector<std::string>* labels,
                   const std::string& label) {
    auto it = seen->find(key);
    if (it != seen->end()) return it->second;
    const std::size_t i = labels->size();
    seen->emplace(key, i);
    labels->push_back(label);
    return i;
}

}  // namespace

SurveyRowsReading read_survey_rows(std::string_view text_in, const SurveyColumns& cols) {
    SurveyRowsReading out;
    if (text_in.size() > kMaxInputBytes) {
        out.status = Status::failure("The text is too large to read.");
        return out;
    }
    if (cols.category.empty()) {
        out.status = Status::failure("Choose the category column (--category): survey rows need one.");
        return out;
    }
    const std::string_view text = skip_byte_order_mark(text_in);
    DelimitedReader reader(text, detect_separator(text));
    std::vector<std::vector<std::string>> rows;
    std::vector<int> lines;
    Record rec;
    while (reader.next(&rec)) {
        if (rec.blank()) continue;
        std::vector<std::string> cells;
        for (auto c : rec.cells) cells.emplace_back(trim_cell_ends(c));
        rows.push_back(std::move(cells));
        lines.push_back(rec.line);
    }
    if (!reader.status().ok) { out.status = reader.status(); return out; }
    if (rows.empty()) { out.status = Status::failure("Nothing to read: the survey rows are empty."); return out; }

    // The chosen columns; a name needs a header row, which is then the first line.
    const std::vector<std::string>& head = rows[0];
    bool named = false;
    struct Choice { const char* role; const std::string* spec; std::size_t index = 0; bool given = false; };
    Choice choices[] = {{"category", &cols.category}, {"weight", &cols.weight}, {"stratum", &cols.stratum}, {"cluster", &cols.cluster}};
    for (Choice& c : choices) {
        if (c.spec->empty()) continue;
        c.given = true;
        if (is_column_number(*c.spec, &c.index)) continue;
        auto it = std::find_if(head.begin(), head.end(), [&](const std::string& h) { return lower(h) == lower(*c.spec); });
        if (it == head.end()) {
            std::string names;
            for (const auto& h : head) names += (names.empty() ? "" : ", ") + quote_cell(h);
            out.status = Status::failure("The " + std::string(c.role) + " column " + quote_cell(*c.spec) +
                                         " is missing: the first line has " + names + " (or give the column's number).", lines[0], 0);
            return out;
        }
        c.index = static_cast<std::size_t>(it - head.begin());
        named = true;
    }
    double probe = 0;
    // Columns by number only: a header when the weight cell is not a number, or (no weight column)
    // when the first line's category occurs nowhere below it (a column's name, not an answer).
    bool header = named || (choices[1].given && choices[1].index < head.size() && !read_typed_number(head[choices[1].index], &probe));
    if (!named && !choices[1].given && rows.size() > 1 && choices[0].index < head.size()) {
        header = true;
        for (std::size_t r = 1; r < rows.size() && header; ++r)
            header = !(choices[0].index < rows[r].size() && rows[r][choices[0].index] == head[choices[0].index]);
    }
    for (const Choice& c : choices) {
        if (!c.given) continue;
        std::size_t width = 0;
        for (const auto& r : rows) width = std::max(width, r.size());
        if (c.index >= width) {
            out.status = Status::failure("The " + std::string(c.role) + " column " + *c.spec + " does not exist: the rows have " +
                                         std::to_string(width) + " columns.");
            return out;
        }
    }
    SurveySample& s = out.sample;
    auto name_of = [&](const Choice& c) { return !c.given ? std::string() : header ? normalised_label(head[c.index]) : "column " + std::to_string(c.index + 1); };
    s.category_column = name_of(choices[0]);
    s.weight_column = name_of(choices[1]);
    s.stratum_column = name_of(choices[2]);
    s.cluster_column = name_of(choices[3]);

    std::map<std::string, std::size_t> cat_seen, stratum_seen, cluster_seen;
    for (std::size_t r = header ? 1 : 0; r < rows.size(); ++r) {
        const auto& row = rows[r];
        const int line = lines[r];
        auto cell = [&](const Choice& c) { return c.index < row.size() ? row[c.index] : std::string(); };
        const std::string category = cell(choices[0]);
        if (category.empty()) {
            out.status = Status::failure(cell_location(line, static_cast<int>(choices[0].index) + 1) +
                                         "the category is missing; every respondent needs one.", line, static_cast<int>(choices[0].index) + 1);
            return out;
        }
        const std::string label = normalised_label(category);
        s.category.push_back(intern(label, &cat_seen, &s.categories, label));
        double w = 1;
        if (choices[1].given) {
            const std::string wc = cell(choices[1]);
            const int col = static_cast<int>(choices[1].index) + 1;
            if (wc.empty()) {
                out.status = Status::failure(cell_location(line, col) + "the weight is missing; every respondent needs a weight greater than 0.", line, col);
                return out;
            }
            if (!read_typed_number(wc, &w) || !std::isfinite(w)) {
                out.status = Status::failure(cell_location(line, col) + "the weight " + quote_cell(wc) + " is not a number.", line, col);
                return out;
            }
            if (!(w > 0)) {
                out.status = Status::failure(cell_location(line, col) + "the weight " + quote_cell(wc) + " is " +
                                             (w == 0 ? "zero" : "negative") + "; survey weights must be greater than 0 "
                                             "(leave out respondents who should not count).", line, col);
                return out;
            }
        }
        s.weight.push_back(w);
        std::string stratum;
        if (choices[2].given) {
            stratum = cell(choices[2]);
            if (stratum.empty()) {
                out.status = Status::failure(cell_location(line, static_cast<int>(choices[2].index) + 1) + "the stratum is missing.", line, 0);
                return out;
            }
            s.stratum.push_back(intern(stratum, &stratum_seen, &s.strata, normalised_label(stratum)));
        }
        if (choices[3].given) {
            const std::string cluster = cell(choices[3]);
            if (cluster.empty()) {
                out.status = Status::failure(cell_location(line, static_cast<int>(choices[3].index) + 1) + "the cluster is missing.", line, 0);
                return out;
            }
            const std::string key = stratum + '\x1f' + cluster;
            s.cluster.push_back(intern(key, &cluster_seen, &s.clusters, normalised_label(cluster)));
        }
    }
    if (s.weight.empty()) { out.status = Status::failure("Only a header row: no respondents to read."); return out; }
    if (choices[3].given && s.clusters.size() < 2) {
        out.status = Status::failure("The cluster column holds one value: with a single cluster the design's variance cannot be "
                                     "estimated.");
        return out;
    }
    if (cols.sorted) {
        std::vector<std::size_t> order(s.categories.size());
        std::iota(order.begin(), order.end(), 0);
        std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return s.categories[a] < s.categories[b]; });
        std::vector<std::size_t> rank(order.size());
        std::vector<std::string> labels;
        for (std::size_t i = 0; i < order.size(); ++i) { rank[order[i]] = i; labels.push_back(s.categories[order[i]]); }
        for (auto& c : s.category) c = rank[c];
        s.categories = labels;
    }
    out.counts.assign(s.categories.size(), 0.0);
    for (std::size_t c : s.category) out.counts[c] += 1;
    out.status = check_survey_sample(s);
    return out;
}

}  // namespace tallyproof
