// Reader of the screening members of the analysis document; names fixed by docs/analysis-document.md.
#include "screen_document.hpp"

#include <cmath>
#include <set>

#include "json_reader.hpp"

namespace tallyproof {
namespace {

using Type = JsonValue::Type;

Status wrong(const std::string& member, const std::string& expected) {
    return Status::failure("In the document, \"" + member + "\" must be " + expected + ".");
}

}  // namespace

Status read_screen_document(std::string_view json, GroupedCounts* counts, ScreenChoice* choice, bool* is_screen) {
    *is_screen = false;
    JsonValue doc;
    if (Status s = parse_json(json, &doc); !s.ok) return s;
    if (!doc.is(Type::object)) return Status::failure("The document must be a JSON object.");
    const JsonValue* groups = doc.find("groups");
    const JsonValue* screen = doc.find("screen");
    if (!groups || groups->is(Type::null)) {
        if (screen && !screen->is(Type::null))
            return Status::failure("In the document, \"screen\" needs \"groups\": a list of {\"name\", \"observed\"}.");
        return Status::success();
    }
    *is_screen = true;
    GroupedCounts out;
    if (!groups->is(Type::array)) return wrong("groups", "a list of {\"name\", \"observed\"}");
    if (const JsonValue* c = doc.find("categories"); c && c->is(Type::array))
        for (const auto& v : c->array)
            if (v.is(Type::string)) out.categories.push_back(v.string);
    if (const JsonValue* by = doc.find("by"); by && !by->is(Type::null)) {
        if (!by->is(Type::string)) return wrong("by", "a string (the group column's name)");
        out.group_column_name = by->string;
    }
    if (doc.find("observed") && !doc.find("observed")->is(Type::null))
        return Status::failure("In the document, give either \"observed\" (one sample) or \"groups\" (a screen), not both.");
    std::set<std::string> names;
    for (std::size_t g = 0; g < groups->array.size(); ++g) {
        const JsonValue& e = groups->array[g];
        const std::string at = "groups[" + std::to_string(g) + "]";
        if (!e.is(Type::object)) return wrong(at, "an object {\"name\", \"observed\"}");
        const JsonValue* name = e.find("name");
        if (!name || !name->is(Type::string) || name->string.empty()) return wrong(at + ".name", "a non-empty string");
        if (!names.insert(name->string).second)
            return Status::failure("In the document, the group \"" + name->string.substr(0, 40) + "\" appears twice; each group needs its own name.");
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
        out.groups.push_back(name->string);
        out.group_lines.push_back(0);
    }
    if (out.groups.size() < 2)
        return Status::failure("In the document, \"groups\" has " + std::to_string(out.groups.size()) +
                               " group; screening compares two or more groups.");
    ScreenChoice c;
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
    }
    *counts = std::move(out);
    *choice = c;
    return Status::success();
}

}  // namespace tallyproof
