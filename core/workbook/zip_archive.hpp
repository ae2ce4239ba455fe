// A ZIP archive read from its bytes (PKWARE APPNOTE 6.3.10): the end of central directory record
// (4.3.16), the central directory's file headers (4.3.12) and each entry's local header (4.3.7),
// entries stored (method 0) or deflated (method 8, inflated by zlib). ZIP64, encrypted entries
// (general purpose bit 0) and other methods are refused by name. Budgets against a decompression
// bomb are checked on the declared sizes before anything is inflated, and again while inflating.
#pragma once
#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct ZipEntry {
    std::string name;               // the path inside the archive, as stored ("xl/workbook.xml")
    std::uint16_t flags = 0;        // general purpose bit flag
    std::uint16_t method = 0;       // 0 stored, 8 deflated
    std::uint32_t crc = 0;
    std::size_t stored_size = 0;    // compressed size, as declared in the central directory
    std::size_t inflated_size = 0;  // uncompressed size, as declared
    std::size_t local_offset = 0;   // offset of the local file header
};

struct ZipBudget {
    std::size_t max_inflated_bytes = 0;  // all entries together, declared and actual
    std::size_t max_entries = 0;
    double max_ratio = 0;                // inflated / stored, for entries over 1 MB inflated
};

struct ZipArchive {
    Status status;                 // !ok: not a ZIP we can read (corrupt, truncated, ZIP64, a bomb)
    std::vector<ZipEntry> entries;
    std::size_t inflated_so_far = 0;  // bytes inflated by read_zip_entry, against the budget
};

// True when `bytes` begin as a ZIP archive does (a local file header or an empty archive's end record).
bool looks_like_zip(std::string_view bytes);
// Reads the central directory and checks every entry's declaration against `budget`.
ZipArchive read_zip_directory(std::string_view bytes, const ZipBudget& budget);
// The entry named `name` (exact, or ASCII case-insensitive when no exact match), or nullptr.
const ZipEntry* find_zip_entry(const ZipArchive& zip, std::string_view name);
// Inflates one entry into `out`, checking its CRC-32 and stopping at its declared size and at
// the archive's remaining budget.
Status read_zip_entry(std::string_view bytes, const ZipEntry& entry, const ZipBudget& budget, ZipArchive* zip, std::string* out);

}  // namespace tallyproof
