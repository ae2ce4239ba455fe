// The "workbook" member of the result document, written with the project's JSON writer (RFC 8259).
#include "workbook_member.hpp"

#include "json_writer.hpp"

namespace tallyproof {

std::string workbook_member_json(const InputText& input) {
    JsonWriter j;
    j.begin_object();
    j.key("sheet").value(input.sheet_index < input.sheets.size() ? std::string_view(input.sheets[input.sheet_index].name) : std::string_view());
    j.key("range").value(input.range.first_row ? range_name(input.range) : std::string());
    j.key("sheets").begin_array();
    for (const auto& s : input.sheets) j.begin_object().key("name").value(s.name).key("hidden").value(s.hidden).end_object();
    j.end_array();
    j.end_object();
    return j.str();
}

void add_workbook_member(std::string* document, const InputText& input) {
    if (!input.from_workbook || !input.status.ok) return;
    const std::size_t close = document->rfind('}');
    if (close == std::string::npos) return;
    const std::size_t open = document->find('{');
    const bool empty = document->find_first_not_of(" \t\r\n", open + 1) == close;
    document->insert(close, std::string(empty ? "" : ",") + "\"workbook\":" + workbook_member_json(input));
}

}  // namespace tallyproof
