// Reader and writer of the analysis document; member names are fixed by docs/analysis-document.md.
#include "analysis_document.hpp"

#include <cmath>

#include <set>

#include "json_reader.hpp"
#include "label_text.hpp"
#include "parsed_input.hpp"  // kMaxCategories
#include "json_writer.hpp"

namespace tallyproof {
namespace {

using Type = JsonValue::Type;

Status wrong(const std::string& member, const std::string& expected) {
    return Status::failure("In the document, \"" + member + "\" must be " + expected + ".");
}

Status read_number(const JsonValue& parent, const char* name, const std::string& path, double* out, bool* present = nullptr) {
    const JsonValue* v = parent.find(name);
    if (present) *present = v && !v->is(Type::null);
    if (!v || v->is(Type::null)) return Status::success();
    if (!v->is(Type::number)) return wrong(path + name, "a number");
    *out = v->number;
    return Status::success();
}

Status read_enum_string(const JsonValue& parent, const char* name, const std::string& path, std::string* out) {
    const JsonValue* v = parent.find(name);
    if (!v || v->is(Type::null)) return Status::success();
    if (!v->is(Type::string)) return wrong(path + name, "a string");
    *out = v->string;
    return Status::success();
}

// Lists of numbers; with `infinities`, the strings "inf", "+inf" and "-inf" stand for open bin
// ends (JSON has no infinity).
Status read_numbers(const JsonValue& v, const std::string& path, std::vector<double>* out, bool infinities = false) {
    if (!v.is(Type::array)) return wrong(path, "a list of numbers");
    out->clear();
    out->reserve(v.array.size());
    for (std::size_t i = 0; i < v.array.size(); ++i) {
        const JsonValue& e = v.array[i];
        if (infinities && e.is(Type::string) && (e.string == "inf" || e.string == "+inf" || e.string == "-inf")) {
            out->push_back(e.string == "-inf" ? -HUGE_VAL : HUGE_VAL);
            continue;
        }
        if (!e.is(Type::number))
            return wrong(path + "[" + std::to_string(i) + "]", infinities ? "a number, \"-inf\" or \"inf\"" : "a number");
        out->push_back(e.number);
    }
    return Status::success();
}

#define TP_TRY(expr) do { Status s_ = (expr); if (!s_.ok) return s_; } while (0)

// A list of whole-number indices below `limit` (respondents' categories, strata, clusters).
Status read_indices(const JsonValue& v, const std::string& path, std::size_t limit, std::vector<std::size_t>* out) {
    std::vector<double> x;
    TP_TRY(read_numbers(v, path, &x));
    out->clear();
    for (std::size_t i = 0; i < x.size(); ++i) {
        if (!(x[i] >= 0 && x[i] < static_cast<double>(limit) && x[i] == std::floor(x[i])))
            return wrong(path + "[" + std::to_string(i) + "]", "a whole number from 0 to " + std::to_string(limit) + " − 1");
        out->push_back(static_cast<std::size_t>(x[i]));
    }
    return Status::success();
}

Status read_labels(const JsonValue& v, const std::string& path, std::vector<std::string>* out) {
    if (!v.is(Type::array)) return wrong(path, "a list of labels");
    out->clear();
    for (std::size_t i = 0; i < v.array.size(); ++i) {
        if (!v.array[i].is(Type::string)) return wrong(path + "[" + std::to_string(i) + "]", "a string");
        out->push_back(normalised_label(v.array[i].string));
    }
    return Status::success();
}

// "design" (docs/analysis-document.md, Survey design): respondent rows, design effects per
// category, or one overall design effect (a number or "kish").
Status read_design(const JsonValue& d, const std::vector<std::string>& categories, DesignChoice* out) {
    if (!d.is(Type::object)) return wrong("design", "an object such as {\"design_effect\": 1.8}");
    DesignChoice c;
    c.requested = true;
    if (const JsonValue* r = d.find("respondents"); r && !r->is(Type::null)) {
        if (!r->is(Type::object)) return wrong("design.respondents", "an object with category and weight lists");
        SurveySample& s = c.sample;
        s.categories = categories;
        const JsonValue* cat = r->find("category");
        const JsonValue* w = r->find("weight");
        if (!cat || !w) return wrong("design.respondents", "an object with \"category\" and \"weight\" lists");
        TP_TRY(read_indices(*cat, "design.respondents.category", categories.size(), &s.category));
        TP_TRY(read_numbers(*w, "design.respondents.weight", &s.weight));
        if (s.weight.size() != s.category.size()) return wrong("design.respondents.weight", "one weight per respondent");
        if (const JsonValue* v = r->find("strata"); v && !v->is(Type::null)) TP_TRY(read_labels(*v, "design.respondents.strata", &s.strata));
        if (const JsonValue* v = r->find("clusters"); v && !v->is(Type::null)) TP_TRY(read_labels(*v, "design.respondents.clusters", &s.clusters));
        if (const JsonValue* v = r->find("stratum"); v && !v->is(Type::null)) {
            TP_TRY(read_indices(*v, "design.respondents.stratum", s.strata.size(), &s.stratum));
            if (s.stratum.size() != s.weight.size()) return wrong("design.respondents.stratum", "one stratum per respondent");
        }
        if (const JsonValue* v = r->find("cluster"); v && !v->is(Type::null)) {
            TP_TRY(read_indices(*v, "design.respondents.cluster", s.clusters.size(), &s.cluster));
            if (s.cluster.size() != s.weight.size()) return wrong("design.respondents.cluster", "one cluster per respondent");
        }
        if (const JsonValue* cols = r->find("columns"); cols && cols->is(Type::object)) {
            TP_TRY(read_enum_string(*cols, "category", "design.respondents.columns.", &s.category_column));
            TP_TRY(read_enum_string(*cols, "weight", "design.respondents.columns.", &s.weight_column));
            TP_TRY(read_enum_string(*cols, "stratum", "design.respondents.columns.", &s.stratum_column));
            TP_TRY(read_enum_string(*cols, "cluster", "design.respondents.columns.", &s.cluster_column));
        }
    }
    if (const JsonValue* v = d.find("design_effects"); v && !v->is(Type::null))
        TP_TRY(read_numbers(*v, "design.design_effects", &c.category_design_effects));
    if (const JsonValue* v = d.find("design_effect"); v && !v->is(Type::null)) {
        if (v->is(Type::string) && v->string == "kish") c.kish = true;
        else if (v->is(Type::number) && v->number > 0 && std::isfinite(v->number)) c.overall_design_effect = v->number;
        else return wrong("design.design_effect", "a number greater than 0, or \"kish\"");
    }
    *out = std::move(c);
    return Status::success();
}

Status read_model(const JsonValue& m, Model* model) {
    if (!m.is(Type::object)) return wrong("model", "an object");
    std::string kind = "equal";
    TP_TRY(read_enum_string(m, "kind", "model.", &kind));
    if (!model_kind_from_name(kind, &model->kind))
        return Status::failure("In the document, model.kind \"" + kind.substr(0, 40) + "\" is not a known model kind.");
    if (const JsonValue* v = m.find("values"); v && !v->is(Type::null)) TP_TRY(read_numbers(*v, "model.values", &model->values));
    if (const JsonValue* v = m.find("edges"); v && !v->is(Type::null)) TP_TRY(read_numbers(*v, "model.edges", &model->edges, true));
    if (const JsonValue* p = m.find("parameters"); p && !p->is(Type::null)) {
        if (!p->is(Type::object)) return wrong("model.parameters", "an object of named numbers");
        for (const auto& [name, value] : p->object) {
            if (value.is(Type::null)) continue;  // null: to be estimated
            if (!value.is(Type::number)) return wrong("model.parameters." + name.substr(0, 40), "a number");
            model->parameters.emplace_back(name, value.number);
        }
    }
    return Status::success();
}

// The document's "format": absent, null or "tallyproof/1"; a newer or unknown format is named.
Status check_format(const JsonValue& doc) {
    const JsonValue* f = doc.find("format");
    if (!f || f->is(Type::null)) return Status::success();
    if (!f->is(Type::string)) return wrong("format", "a string such as \"tallyproof/1\"");
    if (f->string != kDocumentFormat) {
        const std::string shown = f->string.substr(0, 30);
        if (f->string.rfind("tallyproof/", 0) == 0) {
            const std::string v = f->string.substr(11);
            const bool number = !v.empty() && v.size() < 9 && v.find_first_not_of("0123456789") == std::string::npos;
            if (number && std::stol(v) > 1)
                return Status::failure("This document has format \"" + shown +
                                       "\", written by a newer version of Tallyproof; this version reads \"tallyproof/1\".");
            return Status::failure("This document has an unknown format \"" + shown + "\"; this version reads \"tallyproof/1\".");
        }
        return Status::failure("This is not a Tallyproof document (format \"" + shown + "\").");
    }
    return Status::success();
}

// The "pvalue" member: method, ordering, Monte Carlo replicates and seed.
Status read_pvalue_choice(const JsonValue& p, PValueChoice* out) {
    if (!p.is(Type::object)) return wrong("pvalue", "an object");
    std::string method = "asymptotic", ordering = "statistic";
    TP_TRY(read_enum_string(p, "method", "pvalue.", &method));
    TP_TRY(read_enum_string(p, "ordering", "pvalue.", &ordering));
    if (method == "asymptotic") out->method = PValueMethod::asymptotic;
    else if (method == "exact") out->method = PValueMethod::exact;
    else if (method == "monte-carlo") out->method = PValueMethod::monte_carlo;
    else return wrong("pvalue.method", "\"asymptotic\", \"exact\" or \"monte-carlo\"");
    if (ordering == "statistic") out->ordering = ExactOrdering::statistic;
    else if (ordering == "probability") out->ordering = ExactOrdering::probability;
    else return wrong("pvalue.ordering", "\"statistic\" or \"probability\"");
    double replicates = static_cast<double>(out->replicates), seed = static_cast<double>(out->seed);
    TP_TRY(read_number(p, "replicates", "pvalue.", &replicates));
    TP_TRY(read_number(p, "seed", "pvalue.", &seed));
    if (!(replicates >= 1 && replicates <= 1e9) || replicates != std::floor(replicates))
        return wrong("pvalue.replicates", "a whole number from 1 to 1000000000");
    if (!(seed >= 0 && seed <= 9007199254740991.0) || seed != std::floor(seed))
        return wrong("pvalue.seed", "a whole number from 0 to 2^53 - 1");
    out->replicates = static_cast<std::uint64_t>(replicates);
    out->seed = static_cast<std::uint64_t>(seed);
    return Status::success();
}

}  // namespace

Status read_analysis_document(std::string_view json, Analysis* out) {
    JsonValue doc;
    TP_TRY(parse_json(json, &doc));
    if (!doc.is(Type::object)) return Status::failure("The document must be a JSON object.");
    Analysis a;
    TP_TRY(check_format(doc));
    if (const JsonValue* c = doc.find("categories"); c && !c->is(Type::null)) {
        if (!c->is(Type::array)) return wrong("categories", "a list of labels");
        for (std::size_t i = 0; i < c->array.size(); ++i) {
            if (!c->array[i].is(Type::string)) return wrong("categories[" + std::to_string(i) + "]", "a string");
            a.categories.push_back(c->array[i].string);
        }
    }
    const JsonValue* obs = doc.find("observed");
    const JsonValue* groups = doc.find("groups");
    if (groups && !groups->is(Type::array))  // null included: a screen member left empty is not one sample
        return Status::failure(std::string("In the document, \"groups\" must be a list of {\"name\", \"observed\"} (it is ") +
                               (groups->is(Type::null) ? "null" : "not a list") + "); leave it out for one sample.");
    const bool screen = groups != nullptr;  // a screening document (screen_document.hpp)
    if (!obs && !screen) return Status::failure("The document has no \"observed\" counts.");
    if (obs) TP_TRY(read_numbers(*obs, "observed", &a.observed));
    if (a.observed.size() > kMaxCategories)
        return Status::failure("The document has " + std::to_string(a.observed.size()) + " categories; at most " +
                               std::to_string(kMaxCategories) + " can be analysed.");
    normalise_labels(&a.categories);  // the same text in two Unicode forms is then refused as twice the same label
    {
        std::set<std::string> seen;  // each category needs its own label, as in a paste
        for (const auto& c : a.categories)
            if (!seen.insert(c).second)
                return Status::failure("In the document, the label \"" + c.substr(0, 40) + "\" appears twice; each category needs its own label.");
    }
    if (a.categories.empty() && !screen)
        for (std::size_t i = 0; i < a.observed.size(); ++i) a.categories.push_back("Category " + std::to_string(i + 1));
    if (const JsonValue* o = doc.find("ordered"); o && !o->is(Type::null)) {
        if (!o->is(Type::boolean)) return wrong("ordered", "true or false");
        a.ordered = o->boolean;
    }
    if (const JsonValue* m = doc.find("model"); m && !m->is(Type::null)) TP_TRY(read_model(*m, &a.model));
    if (const JsonValue* s = doc.find("statistic"); s && s->is(Type::object)) {
        TP_TRY(read_number(*s, "lambda", "statistic.", &a.statistic.lambda));
        if (const JsonValue* w = s->find("williams"); w && !w->is(Type::null)) {
            if (!w->is(Type::boolean)) return wrong("statistic.williams", "true or false");
            a.statistic.williams = w->boolean;
        }
    } else if (s && !s->is(Type::null)) {
        return wrong("statistic", "an object such as {\"lambda\": 1}");
    }
    TP_TRY(read_number(doc, "alpha", "", &a.alpha));
    if (const JsonValue* p = doc.find("pvalue"); p && !p->is(Type::null)) TP_TRY(read_pvalue_choice(*p, &a.pvalue));
    if (const JsonValue* m = doc.find("merge"); m && !m->is(Type::null)) {
        if (!m->is(Type::object)) return wrong("merge", "an object");
        std::string rule = "none";
        TP_TRY(read_enum_string(*m, "rule", "merge.", &rule));
        if (!merge_rule_from_name(rule, &a.merge.rule)) return wrong("merge.rule", "\"none\", \"all-5\", \"cochran\" or \"minimum\"");
        TP_TRY(read_number(*m, "minimum", "merge.", &a.merge.minimum));
    }
    double extra = 0;
    TP_TRY(read_number(doc, "extra_estimated_parameters", "", &extra));
    if (!(extra >= 0 && extra <= 1000) || extra != std::floor(extra))
        return wrong("extra_estimated_parameters", "a whole number from 0 to 1000");
    a.extra_estimated_parameters = static_cast<int>(extra);
    if (const JsonValue* p = doc.find("plan"); p && !p->is(Type::null)) {
        if (!p->is(Type::object)) return wrong("plan", "an object");
        a.plan.requested = true;
        TP_TRY(read_number(*p, "w", "plan.", &a.plan.w));
        TP_TRY(read_number(*p, "n", "plan.", &a.plan.n));
        TP_TRY(read_number(*p, "alpha", "plan.", &a.plan.alpha));
        TP_TRY(read_number(*p, "df", "plan.", &a.plan.df));
        TP_TRY(read_number(*p, "target_power", "plan.", &a.plan.target_power));
    }
    if (const JsonValue* c = doc.find("conformity"); c && !c->is(Type::null)) {
        if (!c->is(Type::object)) return wrong("conformity", "an object such as {\"margin_w\": 0.1}");
        a.conformity.requested = true;
        TP_TRY(read_number(*c, "margin_w", "conformity.", &a.conformity.margin_w));
        TP_TRY(read_number(*c, "margin_points", "conformity.", &a.conformity.margin_points));
        TP_TRY(read_number(*c, "true_w", "conformity.", &a.conformity.true_w));
        TP_TRY(read_number(*c, "target_power", "conformity.", &a.conformity.target_power));
        if (std::isfinite(a.conformity.margin_points)) {  // the margin as a shift in percentage points
            if (!(a.conformity.margin_points > 0 && a.conformity.margin_points <= 100))
                return wrong("conformity.margin_points", "a shift in percentage points above 0 and at most 100, such as 2");
            if (std::isfinite(a.conformity.margin_w))
                return wrong("conformity", "either margin_w or margin_points, not both");
        } else if (!(a.conformity.margin_w > 0 && a.conformity.margin_w <= 1)) {
            return wrong("conformity.margin_w", "a margin w0 in (0, 1], such as 0.1 (Cohen's small effect), or margin_points");
        }
    }
    if (const JsonValue* d = doc.find("design"); d && !d->is(Type::null)) TP_TRY(read_design(*d, a.categories, &a.design));
    *out = std::move(a);
    return Status::success();
}

namespace {

// The survey design's inputs, so a saved analysis reopens with them (read_design reads them back).
void write_design_inputs(JsonWriter& j, const DesignChoice& d) {
    if (!d.requested) return;
    j.key("design").begin_object();
    const SurveySample& s = d.sample;
    if (!s.weight.empty()) {
        auto indices = [&](const char* key, const std::vector<std::size_t>& v) {
            j.key(key).begin_array();
            for (std::size_t x : v) j.value(static_cast<double>(x));
            j.end_array();
        };
        j.key("respondents").begin_object();
        j.key("columns").begin_object().key("category").value(s.category_column).key("weight").value(s.weight_column)
            .key("stratum").value(s.stratum_column).key("cluster").value(s.cluster_column).end_object();
        indices("category", s.category);
        j.key("weight").numbers(s.weight);
        if (!s.stratum.empty()) { j.key("strata").strings(s.strata); indices("stratum", s.stratum); }
        if (!s.cluster.empty()) { j.key("clusters").strings(s.clusters); indices("cluster", s.cluster); }
        j.end_object();
    }
    if (!d.category_design_effects.empty()) j.key("design_effects").numbers(d.category_design_effects);
    if (d.kish) j.key("design_effect").value("kish");
    else if (std::isfinite(d.overall_design_effect)) j.key("design_effect").value(d.overall_design_effect);
    j.end_object();
}

}  // namespace

std::string write_analysis_document(const Analysis& a) {
    JsonWriter j;
    j.begin_object();
    j.key("format").value(kDocumentFormat);
    j.key("categories").strings(a.categories);
    j.key("observed").numbers(a.observed);
    write_analysis_settings(j, a);
    write_design_inputs(j, a.design);
    j.end_object();
    return j.str();
}

void write_analysis_settings(JsonWriter& j, const Analysis& a, const std::string& model_description) {
    j.key("ordered").value(a.ordered);
    j.key("model").begin_object().key("kind").value(model_kind_name(a.model.kind));
    if (!model_description.empty()) j.key("description").value(model_description);
    if (!a.model.values.empty()) j.key("values").numbers(a.model.values);
    if (!a.model.parameters.empty()) {
        j.key("parameters").begin_object();
        for (const auto& [name, value] : a.model.parameters) j.key(name).value(value);
        j.end_object();
    }
    if (!a.model.edges.empty()) {
        j.key("edges").begin_array();
        for (double e : a.model.edges) {
            if (std::isinf(e)) j.value(e < 0 ? "-inf" : "inf");
            else j.value(e);
        }
        j.end_array();
    }
    j.end_object();
    j.key("statistic").begin_object().key("lambda").value(a.statistic.lambda).key("williams").value(a.statistic.williams).end_object();
    j.key("alpha").value(a.alpha);
    j.key("pvalue").begin_object().key("method").value(pvalue_method_name(a.pvalue.method))
        .key("ordering").value(a.pvalue.ordering == ExactOrdering::statistic ? "statistic" : "probability")
        .key("replicates").value(static_cast<double>(a.pvalue.replicates))
        .key("seed").value(static_cast<double>(a.pvalue.seed)).end_object();
    j.key("merge").begin_object().key("rule").value(merge_rule_name(a.merge.rule)).key("minimum").value(a.merge.minimum).end_object();
    j.key("extra_estimated_parameters").value(static_cast<double>(a.extra_estimated_parameters));
    if (a.plan.requested) {
        j.key("plan").begin_object();
        const std::pair<const char*, double> fields[] = {{"w", a.plan.w}, {"n", a.plan.n}, {"alpha", a.plan.alpha},
                                                         {"df", a.plan.df}, {"target_power", a.plan.target_power}};
        for (const auto& [name, value] : fields)
            if (std::isfinite(value)) j.key(name).value(value);
        j.end_object();
    }
    if (a.conformity.requested) {
        j.key("conformity").begin_object();
        const std::pair<const char*, double> fields[] = {{"margin_w", std::isfinite(a.conformity.margin_points) ? NAN : a.conformity.margin_w},
                                                         {"margin_points", a.conformity.margin_points}, {"true_w", a.conformity.true_w},
                                                         {"target_power", a.conformity.target_power}};
        for (const auto& [name, value] : fields)
            if (std::isfinite(value)) j.key(name).value(value);
        j.end_object();
    }
}

}  // namespace tallyproof
