// The bytes of a file or a paste as text for read_input: a workbook by its content (workbook_kind,
// never the file's name) read by read_workbook, anything else decoded by decode_text, which
// refuses other binary files by their signatures.
#include "input_text.hpp"

#include <utility>

namespace tallyproof {

InputText input_text(std::string bytes, std::string_view name, const WorkbookChoice& choice) {
    InputText out;
    if (workbook_kind(bytes) == WorkbookKind::none) {
        const TextDecoding decoded = decode_text(&bytes);
        out.status = decoded.status;
        out.notice = decoded.notice;
        out.text = std::move(bytes);  // refused: the bytes as given, so a paste can be shown for correction
        return out;
    }
    WorkbookReading r = read_workbook(bytes, choice);
    out.from_workbook = true;
    out.status = r.status;
    out.sheets = r.sheets;
    out.sheet_index = r.sheet_index;
    out.range = r.range;
    out.notes = std::move(r.notes);
    if (!r.status.ok) return out;
    out.text = std::move(r.text);
    std::string list;
    for (std::size_t i = 0; i < r.sheets.size(); ++i)
        list += (i ? ", " : "") + r.sheets[i].name + (r.sheets[i].hidden ? " (hidden)" : "");
    const std::size_t n = r.sheets.size();
    out.notice = "Read sheet \"" + r.sheets[r.sheet_index].name + "\" (" + range_name(r.range) + ") of " +
                 (name.empty() ? std::string("the workbook") : std::string(name)) + "; " + std::to_string(n) +
                 (n == 1 ? " sheet: " : " sheets: ") + list + ".";
    return out;
}

}  // namespace tallyproof
