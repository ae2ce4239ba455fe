// The text a spreadsheet cell's value becomes for the paste reader: numbers as the shortest text
// that reads back to the same double, serial dates and times as ISO 8601 text (1900 and 1904 date
// systems, ECMA-376 Part 1, 18.17.4.1), and which number formats show a date or a time (built-in
// formats 14-22 and 45-47, ECMA-376 Part 1, 18.8.30; custom codes by their d, m, y, h, s tokens
// outside quoted text and brackets, 18.8.31).
#pragma once
#include <string>
#include <string_view>

namespace tallyproof {

std::string number_text(double x);  // 12 -> "12", 0.1 -> "0.1", 1e300 -> "1e+300"; "" when not finite

enum class DateShow { none, date, time, date_time, elapsed };  // elapsed: [h]:mm:ss, hours past 24
DateShow builtin_format_shows(int format_id);
DateShow format_code_shows(std::string_view code);

// A serial date-time as ISO 8601 text ("2024-03-01", "13:45:00", "2024-03-01 13:45:00"); "" when the
// serial lies outside 1900-01-01 .. 9999-12-31 (or is negative for a time), so the number is kept.
std::string serial_date_text(double serial, bool date1904, DateShow show);

}  // namespace tallyproof
