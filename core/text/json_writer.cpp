// JSON text as in RFC 8259; non-finite doubles have no JSON form and are written as null.
#include "json_writer.hpp"

#include <cmath>
#include <cstdio>
#include <cstdlib>

namespace tallyproof {

void JsonWriter::separate() {
    if (after_key_) { after_key_ = false; return; }
    if (!first_.empty()) {
        if (!first_.back()) out_ += ',';
        first_.back() = false;
    }
}

JsonWriter& JsonWriter::begin_object() { separate(); out_ += '{'; first_.push_back(true); return *this; }
JsonWriter& JsonWriter::end_object() { out_ += '}'; first_.pop_back(); return *this; }
JsonWriter& JsonWriter::begin_array() { separate(); out_ += '['; first_.push_back(true); return *this; }
JsonWriter& JsonWriter::end_array() { out_ += ']'; first_.pop_back(); return *this; }

JsonWriter& JsonWriter::key(std::string_view k) {
    value(k);
    out_ += ':';
    after_key_ = true;
    return *this;
}

JsonWriter& JsonWriter::value(double v) {
    separate();
    if (!std::isfinite(v)) { out_ += "null"; return *this; }
    char buf[40];
    if (v == std::floor(v) && std::fabs(v) < 1e15) std::snprintf(buf, sizeof buf, "%.0f", v);
    else {
        // The shortest form that reads back as the same double (0.05, not 0.050000000000000003).
        for (int digits = 15; digits <= 17; ++digits) {
            std::snprintf(buf, sizeof buf, "%.*g", digits, v);
            if (std::strtod(buf, nullptr) == v) break;
        }
    }
    out_ += buf;
    return *this;
}

JsonWriter& JsonWriter::value(bool v) { separate(); out_ += v ? "true" : "false"; return *this; }
JsonWriter& JsonWriter::null() { separate(); out_ += "null"; return *this; }

JsonWriter& JsonWriter::value(std::string_view s) {
    separate();
    out_ += '"';
    for (unsigned char c : s) {
        switch (c) {
            case '"': out_ += "\\\""; break;
            case '\\': out_ += "\\\\"; break;
            case '\n': out_ += "\\n"; break;
            case '\r': out_ += "\\r"; break;
            case '\t': out_ += "\\t"; break;
            default:
                if (c < 0x20) {
                    char buf[8];
                    std::snprintf(buf, sizeof buf, "\\u%04x", c);
                    out_ += buf;
                } else {
                    out_ += static_cast<char>(c);
                }
        }
    }
    out_ += '"';
    return *this;
}

JsonWriter& JsonWriter::numbers(const std::vector<double>& v) {
    begin_array();
    for (double d : v) value(d);
    return end_array();
}

JsonWriter& JsonWriter::strings(const std::vector<std::string>& v) {
    begin_array();
    for (const auto& s : v) value(std::string_view(s));
    return end_array();
}

}  // namespace tallyproof
