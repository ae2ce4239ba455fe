// Reader of the screening members of the analysis document; names fixed by docs/analysis-document.md.
#include "screen_document.hpp"

#include <cmath>
#include <set>

#include "analysis_document.hpp"
#include "json_reader.hpp"
#include "json_writer.hpp"
#include "label_text.hpp"

namespace tallyproof {
namespace {

using Type = JsonValue::Type;

Status wrong(const std::string& member, const std::string& expected) {
    return Status::failure("In the document, \"" + member + "\" must be " + expected + ".");
}

}  // namespace

bool screen_sort_known(const std::string& column) {
    for (const char* name : {"", "name", "n", "statistic", "df", "p", "q", "w", "flag"})
        if (column == name) return true;
    return false;
}

Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, bool* is_screen) {
    ScreenView view;
    return read_screen_document(json, counts, choice, &view, is_screen);
}

Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, ScreenView* view, bool* is_screen) {
    *is_screen = false;
    JsonValue doc;
    if (Status s = parse_json(json, &doc); !s.ok) return s;
    if (!doc.is(Type::object)) return Status::failure("The document must be a JSON object.");
    const JsonValue* groups = doc.find("groups");
    const JsonValue* screen = doc.find("screen");
    if (!groups) {
        if (screen && !screen->is(Type::null))
            return Status::failure("In the document, \"screen\" needs \"groups\": a list of {\"name\", \"observed\"}.");
        return Status::success();
    }
    *is_screen = true;
    GroupedCounts out;
    if (!groups->is(Type::array))
        return wrong("groups", std::string("a list of {\"name\", \"observed\"} (it is ") + (groups->is(Type::null) ? "null" : "not a list") +
                                   "); leave it out for one sample");
    if (const JsonValue* c = doc.find("categories"); c && c->is(Type::array))
        for (const auto& v : c->array)
            if (v.is(Type::string)) out.categories.push_back(normalised_label(v.string));
    if (const JsonValue* by = doc.find("by"); by && !by->is(Type::null)) {
        if (!by->is(Type::string)) return wrong("by", "a string (the group column's name)");
        out.group_column_name = normalised_label(by->string);
    }
    if (doc.find("observed") && !doc.find("observed")->is(Type::null))
        return Status::failure("In the document, give either \"observed\" (one sample) or \"groups\" (a screen), not both.");
    std::set<std::string> names;
    for (std::size_t g = 0; g < groups->array.size(); ++g) {
        const JsonValue& e = groups->array[g];
        const std::string at = "groups[" + std::to_string(g) + "]";
        if (!e.is(Type::object)) return wrong(at, "an object {\"name\", \"observed\"}");
        const JsonValue* name_value = e.find("name");
        if (!name_value || !name_value->is(Type::string) || name_value->string.empty())
            return wrong(at + ".name", "a non-empty string (every group needs its name)");
        const std::string name = normalised_label(name_value->string);
        if (!names.insert(name).second)
            return Status::failure("In the document, the group \"" + name.substr(0, 40) + "\" appears twice (" + at +
                                   ".name; names are compared in Unicode NFC); each group needs its own name.");
        const JsonValue* obs = e.find("observed");
        if (!obs || !obs->is(Type::array)) return wrong(at + ".observed", "a list of counts");
        if (out.categories.empty())
            for (std::size_t i = 0; i < obs->array.size(); ++i) out.categories.push_back("Category " + std::to_string(i + 1));
        if (obs->array.size() != out.categories.size())
            return Status::failure("In the document, " + at + ".observed has " + std::to_string(obs->array.size()) + " counts but there are " +
                                   std::to_string(out.categories.size()) + " categories.");
        if (groups->array.size() * out.categories.size() > kMaxGroupCells)
            return Status::failure("The document has more than " + std::to_string(kMaxGroupCells) + " group cells.");
        for (std::size_t i = 0; i < obs->array.size(); ++i) {
            const JsonValue& v = obs->array[i];
            if (!v.is(Type::number) || !(v.number >= 0) || v.number != std::floor(v.number) || v.number >= 9007199254740992.0)
                return wrong(at + ".observed[" + std::to_string(i) + "]", "a non-negative whole number");
            out.counts.push_back(v.number);
        }
        out.groups.push_back(name);
        out.group_lines.push_back(0);
    }
    if (out.groups.size() < 2) {
        Status s = Status::failure("In the document, \"groups\" has " + std::to_string(out.groups.size()) +
                                   (out.groups.size() == 1 ? " group (" + quote_cell(out.groups[0]) + ")" : " groups") +
                                   ": screening compares two or more groups; read its counts as one sample instead.");
        return s;
    }
    out.look_alike_groups = look_alike_groups(out.groups);
    if (!out.look_alike_groups.empty()) out.notes.push_back(group_look_alike_note(out.groups, out.look_alike_groups));
    ScreenChoice c;
    ScreenView v;
    if (screen && !screen->is(Type::null)) {
        if (!screen->is(Type::object)) return wrong("screen", "an object {\"against\", \"adjust\", \"q\"}");
        if (const JsonValue* v = screen->find("against"); v && !v->is(Type::null))
            if (!v->is(Type::string) || !screen_against_from_name(v->string, &c.against)) return wrong("screen.against", "\"model\" or \"rest\"");
        if (const JsonValue* v = screen->find("adjust"); v && !v->is(Type::null)) {
            std::string m = v->is(Type::string) ? v->string : "";
            if (m == "bh") m = "BH";
            if (!multiplicity_method_from_name(m, &c.adjust)) return wrong("screen.adjust", "\"BH\", \"holm\", \"bonferroni\" or \"none\"");
        }
        if (const JsonValue* v = screen->find("q"); v && !v->is(Type::null))
            if (!v->is(Type::number) || !(v->number > 0 && v->number < 1)) return wrong("screen.q", "a number between 0 and 1");
        if (const JsonValue* v = screen->find("q"); v && v->is(Type::number)) c.q = v->number;
        // How the groups were read (for the record) and looked at.
        if (const JsonValue* m = screen->find("shape"); m && !m->is(Type::null))
            if (!m->is(Type::string) || !group_shape_from_name(m->string, &out.shape)) return wrong("screen.shape", "\"long\", \"wide\" or \"raw\"");
        if (const JsonValue* m = screen->find("header"); m && !m->is(Type::null)) {
            if (!m->is(Type::boolean)) return wrong("screen.header", "true or false");
            out.header = m->boolean;
        }
        if (const JsonValue* m = screen->find("sort"); m && !m->is(Type::null))
            if (!m->is(Type::string) || !screen_sort_known(m->string))
                return wrong("screen.sort", "one of \"name\", \"n\", \"statistic\", \"df\", \"p\", \"q\", \"w\", \"flag\"");
        if (const JsonValue* m = screen->find("sort"); m && m->is(Type::string)) v.sort = m->string;
        if (const JsonValue* m = screen->find("ascending"); m && !m->is(Type::null)) {
            if (!m->is(Type::boolean)) return wrong("screen.ascending", "true or false");
            v.ascending = m->boolean;
        }
        if (const JsonValue* m = screen->find("opened"); m && !m->is(Type::null)) {
            if (!m->is(Type::string)) return wrong("screen.opened", "the name of a group, or null");
            v.opened = normalised_label(m->string);
            if (!names.count(v.opened))
                return Status::failure("In the document, \"screen.opened\" names the group \"" + v.opened.substr(0, 40) +
                                       "\", which is not in \"groups\".");
        }
    }
    *counts = std::move(out);
    *choice = c;
    *view = v;
    return Status::success();
}

std::string write_screen_document(const Analysis& base, const GroupedCounts& counts, const ScreenChoice& choice, const ScreenView& view) {
    JsonWriter j;
    j.begin_object();
    j.key("format").value(kDocumentFormat);
    j.key("categories").strings(counts.categories);
    Analysis settings = base;
    settings.conformity = ConformityChoice{};  // a screen looks for departures (screen_groups refuses conformity)
    settings.plan = PlanChoice{};
    write_analysis_settings(j, settings);
    if (!counts.group_column_name.empty()) j.key("by").value(counts.group_column_name);
    const std::size_t k = counts.categories.size();
    j.key("groups").begin_array();
    for (std::size_t g = 0; g < counts.groups.size(); ++g) {
        j.begin_object().key("name").value(counts.groups[g]);
        if (counts.counts.size() == counts.groups.size() * k)
            j.key("observed").numbers(std::vector<double>(counts.counts.begin() + static_cast<std::ptrdiff_t>(g * k),
                                                          counts.counts.begin() + static_cast<std::ptrdiff_t>((g + 1) * k)));
        j.end_object();
    }
    j.end_array();
    begin_screen_settings(j, counts, choice, view);
    j.end_object();  // screen
    j.end_object();
    return j.str();
}

void begin_screen_settings(JsonWriter& j, const GroupedCounts& counts, const ScreenChoice& choice, const ScreenView& view) {
    j.key("screen").begin_object()
        .key("against").value(screen_against_name(choice.against))
        .key("adjust").value(multiplicity_method_name(choice.adjust))
        .key("q").value(choice.q)
        .key("shape").value(group_shape_name(counts.shape))
        .key("header").value(counts.header);
    if (!view.sort.empty()) j.key("sort").value(view.sort).key("ascending").value(view.ascending);
    if (!view.opened.empty()) j.key("opened").value(view.opened);
    else j.key("opened").null();
}

}  // namespace tallyproof
