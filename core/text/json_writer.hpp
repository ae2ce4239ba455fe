// A minimal JSON writer for the result document: escapes strings, writes non-finite numbers
// as null, and keeps doubles round-trippable (17 significant digits).
#pragma once
#include <string>
#include <string_view>
#include <vector>

namespace tallyproof {

class JsonWriter {
public:
    JsonWriter& begin_object();
    JsonWriter& end_object();
    JsonWriter& begin_array();
    JsonWriter& end_array();
    JsonWriter& key(std::string_view k);
    JsonWriter& value(double v);
    JsonWriter& value(bool v);
    JsonWriter& value(std::string_view s);
    JsonWriter& value(const char* s) { return value(std::string_view(s)); }
    JsonWriter& null();
    JsonWriter& numbers(const std::vector<double>& v);
    JsonWriter& strings(const std::vector<std::string>& v);
    const std::string& str() const { return out_; }

private:
    void separate();
    std::string out_;
    std::vector<bool> first_;  // per open container: no element written yet
    bool after_key_ = false;
};

}  // namespace tallyproof
