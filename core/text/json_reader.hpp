// A strict, bounded JSON reader (RFC 8259) for analysis documents and share links: refuses
// malformed, oversized or deeply nested input with a message giving the byte offset.
#pragma once
#include <map>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "status.hpp"

namespace tallyproof {

struct JsonValue {
    enum class Type { null, boolean, number, string, array, object };
    Type type = Type::null;
    bool boolean = false;
    double number = 0;
    std::string string;
    std::vector<JsonValue> array;
    std::vector<std::pair<std::string, JsonValue>> object;  // in document order

    const JsonValue* find(std::string_view key) const;  // member of an object, or nullptr
    bool is(Type t) const { return type == t; }
};

struct JsonLimits {
    std::size_t max_bytes = 64u << 20;  // whole document
    int max_depth = 32;                  // nesting of arrays and objects
    std::size_t max_elements = 4000000;  // array elements and members in total
};

// Parses `text`; on failure the status names the offset (as "column" in a one-line sense).
Status parse_json(std::string_view text, JsonValue* out, const JsonLimits& limits = {});

}  // namespace tallyproof
