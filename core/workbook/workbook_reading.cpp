// Reading a workbook: what the bytes are (an OLE2 compound file, Microsoft's [MS-CFB] signature
// D0 CF 11 E0 A1 B1 1A E1, holding an "EncryptedPackage" stream when an .xlsx is password-protected,
// [MS-OFFCRYPTO] 2.3.4; a ZIP package holding an .xlsx, ECMA-376 Part 2, or an .xlsb's
// xl/workbook.bin; an OpenDocument package with its "mimetype" first, ODF 1.3 Part 2, 3.3), which
// sheet and range are read (common spreadsheet practice: the first visible sheet with values, its
// used range) and the notes a reader needs about what was not read.
#include "workbook_reading.hpp"

#include <algorithm>
#include <new>

#include "ods_sheets.hpp"
#include "sheet_cells.hpp"
#include "xlsx_sheets.hpp"
#include "zip_archive.hpp"

namespace tallyproof {
namespace {

constexpr std::string_view kOle2Signature = "\xD0\xCF\x11\xE0\xA1\xB1\x1A\xE1";
const std::string_view kEncryptedPackage("E\0n\0c\0r\0y\0p\0t\0e\0d\0P\0a\0c\0k\0a\0g\0e\0", 32);
const std::string_view kWorkbookStream("W\0o\0r\0k\0b\0o\0o\0k\0", 16);
constexpr const char* kCopyAdvice = "copy the cells and paste them";

ZipBudget workbook_budget() { return ZipBudget{workbook_max_inflated_bytes, workbook_max_entries, workbook_max_ratio}; }

bool contains(std::string_view s, std::string_view p) { return s.find(p) != std::string_view::npos; }

// The package's "mimetype" part (stored, as ODF requires, or deflated by a careless writer).
bool ods_mimetype_entry(std::string_view bytes, ZipArchive* zip) {
    const ZipEntry* e = find_zip_entry(*zip, "mimetype");
    if (e == nullptr || e->inflated_size > 256) return false;
    std::string text;
    if (!read_zip_entry(bytes, *e, workbook_budget(), zip, &text).ok) return false;
    return text.rfind(ods_mimetype, 0) == 0;
}

Status ole2_refusal(std::string_view bytes) {
    if (contains(bytes, kEncryptedPackage))
        return Status::failure("This workbook is encrypted (password-protected), so its cells cannot be read. Remove the password in the "
                               "spreadsheet program and save again, or " + std::string(kCopyAdvice) + ".");
    const bool workbook = contains(bytes, kWorkbookStream) || contains(bytes, std::string_view("B\0o\0o\0k\0", 8));
    return Status::failure(std::string(workbook ? "This is an older Excel workbook (.xls)" : "This is an older office document (an OLE compound file such as .xls)") +
                           ", which is not read. Save it as .xlsx or .ods, or " + kCopyAdvice + ".");
}

// The sheet asked for by name (exact, then ignoring ASCII case) or by its 1-based number.
bool find_sheet(const std::vector<WorkbookSheetInfo>& sheets, const std::string& asked, std::size_t* index) {
    for (std::size_t i = 0; i < sheets.size(); ++i)
        if (sheets[i].name == asked) { *index = i; return true; }
    const auto lower = [](std::string s) { for (auto& c : s) if (c >= 'A' && c <= 'Z') c = static_cast<char>(c - 'A' + 'a'); return s; };
    for (std::size_t i = 0; i < sheets.size(); ++i)
        if (lower(sheets[i].name) == lower(asked)) { *index = i; return true; }
    if (!asked.empty() && asked.size() <= 6 && asked.find_first_not_of("0123456789") == std::string::npos) {
        const std::size_t n = std::stoul(asked);
        if (n >= 1 && n <= sheets.size()) { *index = n - 1; return true; }
    }
    return false;
}

std::string sheet_list(const std::vector<WorkbookSheetInfo>& sheets) {
    std::string s;
    for (std::size_t i = 0; i < sheets.size(); ++i)
        s += (i ? ", " : "") + std::to_string(i + 1) + " \"" + sheets[i].name + "\"" + (sheets[i].hidden ? " (hidden)" : "") +
             (sheets[i].empty ? " (empty)" : "");
    return s;
}

// The cells named in a note: the first few, then how many more.
std::string cell_list(const std::vector<std::string>& names) {
    std::string s;
    for (std::size_t i = 0; i < names.size() && i < 5; ++i) s += (i ? ", " : "") + names[i];
    if (names.size() > 5) s += " and " + std::to_string(names.size() - 5) + " more";
    return s;
}

void add_range_notes(const SheetCells& sheet, const CellRange& range, std::vector<std::string>* notes) {
    std::vector<std::string> formulas, merged;
    for (const auto& c : sheet.formulas_without_value)
        if (range.contains(c.row, c.column)) formulas.push_back(cell_name(c.row, c.column));
    for (const auto& m : sheet.merged)
        if (m.first_row <= range.last_row && m.last_row >= range.first_row && m.first_column <= range.last_column && m.last_column >= range.first_column)
            merged.push_back(range_name(m));
    if (!formulas.empty())
        notes->push_back(cell_list(formulas) + (formulas.size() == 1 ? " has a formula" : " have formulas") +
                         " with no saved value (the file was written by a program that does not calculate), read as empty: "
                         "open the workbook and save it in the spreadsheet program first.");
    if (!merged.empty())
        notes->push_back("Merged cells " + cell_list(merged) + ": the value is read in the first cell of each, the others are empty.");
}

// Which sheet is read: the one asked for, or the first visible sheet with values.
Status choose_sheet(const WorkbookReading& r, const WorkbookChoice& choice, std::size_t* index, std::vector<std::string>* notes) {
    if (!choice.sheet.empty()) {
        if (!find_sheet(r.sheets, choice.sheet, index))
            return Status::failure("The workbook has no sheet \"" + choice.sheet + "\". Its sheets are " + sheet_list(r.sheets) + ".");
        if (r.sheets[*index].empty) return Status::failure("Sheet \"" + r.sheets[*index].name + "\" holds no cells with values. The workbook's sheets are " + sheet_list(r.sheets) + ".");
        return Status::success();
    }
    for (std::size_t i = 0; i < r.sheets.size(); ++i)
        if (!r.sheets[i].hidden && !r.sheets[i].empty) { *index = i; return Status::success(); }
    for (std::size_t i = 0; i < r.sheets.size(); ++i)
        if (!r.sheets[i].empty) {
            *index = i;
            notes->push_back("The only sheet with values, \"" + r.sheets[i].name + "\", is hidden in the workbook; it was read.");
            return Status::success();
        }
    if (r.sheets.empty()) return Status::failure("The workbook has no sheets.");
    return Status::failure("The workbook holds no cells with values in any sheet (its sheets are " + sheet_list(r.sheets) + ").");
}

// The choice's range within the sheet's used range (open sides take the used range's).
Status choose_range(const WorkbookChoice& choice, const WorkbookSheetInfo& info, const CellRange& used, CellRange* range) {
    *range = used;
    if (choice.range.empty()) return Status::success();
    CellRange asked;
    if (Status s = parse_cell_range(choice.range, &asked); !s.ok) return s;
    if (asked.first_row) range->first_row = std::max(used.first_row, asked.first_row);
    if (asked.last_row) range->last_row = std::min(used.last_row, asked.last_row);
    if (asked.first_column) range->first_column = std::max(used.first_column, asked.first_column);
    if (asked.last_column) range->last_column = std::min(used.last_column, asked.last_column);
    if (range->first_row > range->last_row || range->first_column > range->last_column)
        return Status::failure("The range " + choice.range + " holds no cells with values in sheet \"" + info.name +
                               "\", whose values lie in " + range_name(used) + ".");
    return Status::success();
}

WorkbookReading read_package(std::string_view bytes, WorkbookKind kind, const WorkbookChoice& choice) {
    WorkbookReading r;
    r.kind = kind;
    const ZipBudget budget = workbook_budget();
    ZipArchive zip = read_zip_directory(bytes, budget);
    if (!zip.status.ok) { r.status = zip.status; return r; }
    WorkbookCells cells = kind == WorkbookKind::xlsx ? read_xlsx_cells(bytes, &zip, budget) : read_ods_cells(bytes, &zip, budget);
    if (!cells.status.ok) { r.status = cells.status; return r; }
    std::vector<CellRange> used;
    for (const auto& s : cells.sheets) {
        used.push_back(used_range(s));
        const CellRange& u = used.back();
        r.sheets.push_back(WorkbookSheetInfo{s.name, s.hidden, s.cells.empty(), s.cells.empty() ? 0 : u.last_row - u.first_row + 1,
                                             s.cells.empty() ? 0 : u.last_column - u.first_column + 1});
    }
    r.notes = cells.notes;
    if ((r.status = choose_sheet(r, choice, &r.sheet_index, &r.notes)), !r.status.ok) return r;
    if ((r.status = choose_range(choice, r.sheets[r.sheet_index], used[r.sheet_index], &r.range)), !r.status.ok) return r;
    SheetCells& sheet = cells.sheets[r.sheet_index];
    if ((r.status = cells_as_text(&sheet, r.range, &r.text)), !r.status.ok) return r;
    add_range_notes(sheet, r.range, &r.notes);
    return r;
}

}  // namespace

WorkbookKind workbook_kind(std::string_view bytes) {
    if (bytes.substr(0, kOle2Signature.size()) == kOle2Signature) return WorkbookKind::refused;
    if (!looks_like_zip(bytes)) return WorkbookKind::none;
    ZipArchive zip = read_zip_directory(bytes, workbook_budget());
    if (!zip.status.ok) {
        // Damaged, or refused before inflating: a workbook by its part names, so the refusal names the workbook.
        if (contains(bytes, "xl/workbook.bin")) return WorkbookKind::refused;
        if (contains(bytes, std::string("mimetype") + std::string(ods_mimetype))) return WorkbookKind::ods;
        return contains(bytes, "xl/workbook.xml") || contains(bytes, "xl/worksheets/") ? WorkbookKind::xlsx : WorkbookKind::none;
    }
    if (find_zip_entry(zip, "xl/workbook.bin")) return WorkbookKind::refused;
    if (ods_mimetype_entry(bytes, &zip)) return WorkbookKind::ods;
    if (find_zip_entry(zip, "[Content_Types].xml") && find_zip_entry(zip, "xl/workbook.xml")) return WorkbookKind::xlsx;
    return WorkbookKind::none;
}

WorkbookReading read_workbook(std::string_view bytes, const WorkbookChoice& choice) {
    WorkbookReading r;
    try {
        r.kind = workbook_kind(bytes);
        if (r.kind == WorkbookKind::none) {
            r.status = Status::failure("This is not a workbook (.xlsx or .ods).");
        } else if (r.kind == WorkbookKind::refused && bytes.substr(0, kOle2Signature.size()) == kOle2Signature) {
            r.status = ole2_refusal(bytes);
        } else if (r.kind == WorkbookKind::refused) {
            r.status = Status::failure("This is a binary Excel workbook (.xlsb), which is not read. Save it as .xlsx or .ods, or " +
                                       std::string(kCopyAdvice) + ".");
        } else {
            r = read_package(bytes, r.kind, choice);
        }
    } catch (const std::bad_alloc&) {
        r = WorkbookReading{};
        r.status = Status::failure("The workbook is too large to read in the memory available. Copy the cells you need instead.");
    }
    if (!r.status.ok) r.text.clear();
    return r;
}

}  // namespace tallyproof
