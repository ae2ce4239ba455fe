// Cell values as text. Shortest round-trip digits by trying 1 to 17 significant digits (C's %.*g
// and strtod; Emscripten 3.1.6's libc++ has no floating std::to_chars). Serial dates: ECMA-376
// Part 1, 18.17.4.1 (1900 system: serial 1 is 1900-01-01 and 60 the fictitious 1900-02-29 kept
// for compatibility; 1904 system: serial 0 is 1904-01-01); civil dates from a day count by
// H. Hinnant's days_from_civil inverse ("chrono-Compatible Low-Level Date Algorithms", 2013).
// Built-in date formats: ECMA-376 Part 1, 18.8.30 (ids 14-22, 45-47).
#include "cell_values.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace tallyproof {

std::string number_text(double x) {
    if (!std::isfinite(x)) return "";
    char buf[40];
    if (x == std::floor(x) && std::fabs(x) < 1e15) {
        std::snprintf(buf, sizeof buf, "%.0f", x == 0 ? 0.0 : x);  // no "-0"
        return buf;
    }
    for (int digits = 1; digits <= 17; ++digits) {
        std::snprintf(buf, sizeof buf, "%.*g", digits, x);
        if (std::strtod(buf, nullptr) == x) break;
    }
    return buf;
}

DateShow builtin_format_shows(int id) {
    if (id >= 14 && id <= 17) return DateShow::date;
    if (id >= 18 && id <= 21) return DateShow::time;
    if (id == 22) return DateShow::date_time;
    if (id == 45 || id == 47) return DateShow::time;
    if (id == 46) return DateShow::elapsed;
    return DateShow::none;
}

DateShow format_code_shows(std::string_view code) {
    // Only the first section (positive numbers) decides.
    bool date = false, time = false, month_or_minute = false, elapsed = false;
    for (std::size_t i = 0; i < code.size(); ++i) {
        const char c = code[i];
        if (c == ';') break;
        if (c == '"') { const auto q = code.find('"', i + 1); if (q == std::string_view::npos) break; i = q; continue; }
        if (c == '\\' || c == '_' || c == '*') { ++i; continue; }
        if (c == '[') {
            const auto q = code.find(']', i + 1);
            if (q == std::string_view::npos) break;
            const std::string_view inside = code.substr(i + 1, q - i - 1);
            if (!inside.empty() && inside.find_first_not_of("hHmMsS") == std::string_view::npos) elapsed = time = true;
            i = q;
            continue;
        }
        const char l = c >= 'A' && c <= 'Z' ? static_cast<char>(c - 'A' + 'a') : c;
        if (l == 'a' && (code.substr(i, 5) == "AM/PM" || code.substr(i, 5) == "am/pm" || code.substr(i, 3) == "A/P" || code.substr(i, 3) == "a/p")) {
            time = true;
            i += code[i + 1] == 'M' || code[i + 1] == 'm' ? 4 : 2;
            continue;
        }
        if (l == 'g' && (code.substr(i, 7) == "General" || code.substr(i, 7) == "general")) { i += 6; continue; }
        if (l == 'e' && i + 1 < code.size() && (code[i + 1] == '+' || code[i + 1] == '-')) { ++i; continue; }  // 0.00E+00
        if (l == 'd' || l == 'y') date = true;
        else if (l == 'h' || l == 's') time = true;
        else if (l == 'm') month_or_minute = true;
    }
    if (elapsed && !date) return DateShow::elapsed;
    if (month_or_minute && !time) date = true;  // "mmm yyyy", "mm": months without hours or seconds
    if (date && time) return DateShow::date_time;
    if (date) return DateShow::date;
    if (time) return DateShow::time;
    return DateShow::none;
}

namespace {

// Days since 1970-01-01 to a civil date (Hinnant, civil_from_days).
void civil_from_days(long long z, long long* y, unsigned* m, unsigned* d) {
    z += 719468;
    const long long era = (z >= 0 ? z : z - 146096) / 146097;
    const unsigned doe = static_cast<unsigned>(z - era * 146097);
    const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
    const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    const unsigned mp = (5 * doy + 2) / 153;
    *d = doy - (153 * mp + 2) / 5 + 1;
    *m = mp < 10 ? mp + 3 : mp - 9;
    *y = static_cast<long long>(yoe) + era * 400 + (*m <= 2);
}

}  // namespace

std::string serial_date_text(double serial, bool date1904, DateShow show) {
    if (!std::isfinite(serial) || serial < 0 || serial >= 2958466) return "";
    // Whole seconds, rounded: a time of day typed as 13:45 is stored as a fraction with rounding error.
    const long long seconds = std::llround(serial * 86400.0);
    long long days = seconds / 86400;
    const long long second_of_day = seconds % 86400;
    char time_text[32];
    if (show == DateShow::elapsed) {
        std::snprintf(time_text, sizeof time_text, "%lld:%02lld:%02lld", seconds / 3600, seconds / 60 % 60, seconds % 60);
        return time_text;
    }
    std::snprintf(time_text, sizeof time_text, "%02lld:%02lld:%02lld", second_of_day / 3600, second_of_day / 60 % 60, second_of_day % 60);
    if (show == DateShow::time && days == 0) return time_text;
    char date_text[32];
    if (!date1904 && days == 60) {
        std::snprintf(date_text, sizeof date_text, "1900-02-29");  // the fictitious day of the 1900 system
    } else {
        if (!date1904 && days < 1) return show == DateShow::time ? std::string(time_text) : std::string();
        // Days since 1970-01-01: the 1900 system counts from 1899-12-31 before its day 60 and from 1899-12-30 after.
        const long long since_epoch = date1904 ? days - 24107 : days < 60 ? days - 25568 : days - 25569;
        long long y = 0;
        unsigned m = 0, d = 0;
        civil_from_days(since_epoch, &y, &m, &d);
        std::snprintf(date_text, sizeof date_text, "%04lld-%02u-%02u", y, m, d);
    }
    if (show == DateShow::date) return date_text;
    return std::string(date_text) + " " + time_text;
}

}  // namespace tallyproof
