// Recursive-descent JSON reader following RFC 8259 exactly (no comments, no trailing commas,
// no NaN/Infinity); strings must be valid UTF-8, \u escapes with surrogate pairs decoded.
#include "json_reader.hpp"

#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <unordered_map>

#include "delimited_text.hpp"  // append_utf8

namespace tallyproof {

const JsonValue* JsonValue::find(std::string_view key) const {
    if (type != Type::object) return nullptr;
    for (const auto& m : object)
        if (m.first == key) return &m.second;
    return nullptr;
}

namespace {

class Reader {
public:
    Reader(std::string_view t, const JsonLimits& l) : text_(t), limits_(l) {}

    Status run(JsonValue* out) {
        if (text_.size() > limits_.max_bytes)
            return Status::failure("The document is too large (" + std::to_string(text_.size()) + " bytes; the limit is " +
                                   std::to_string(limits_.max_bytes) + ").");
        if (text_.size() >= 3 && text_.substr(0, 3) == "\xEF\xBB\xBF") pos_ = 3;
        skip_ws();
        if (!value(out, 0)) return error_;
        skip_ws();
        if (pos_ != text_.size()) return fail("unexpected text after the end of the document");
        return Status::success();
    }

private:
    bool fail_bool(const std::string& what) { error_ = fail(what); return false; }
    Status fail(const std::string& what) const {
        return Status::failure("Not a valid document: " + what + " at byte " + std::to_string(pos_ + 1) + ".", 0,
                               static_cast<int>(pos_ + 1));
    }
    void skip_ws() {
        while (pos_ < text_.size() && (text_[pos_] == ' ' || text_[pos_] == '\t' || text_[pos_] == '\n' || text_[pos_] == '\r')) ++pos_;
    }
    bool literal(std::string_view word) {
        if (text_.substr(pos_, word.size()) != word) return fail_bool("unknown word");
        pos_ += word.size();
        return true;
    }
    bool count_element() {
        if (++elements_ > limits_.max_elements) return fail_bool("too many elements");
        return true;
    }

    bool value(JsonValue* v, int depth) {
        if (pos_ >= text_.size()) return fail_bool("unexpected end");
        const char c = text_[pos_];
        switch (c) {
            case '{': return object(v, depth + 1);
            case '[': return array(v, depth + 1);
            case '"': v->type = JsonValue::Type::string; return string(&v->string);
            case 't': v->type = JsonValue::Type::boolean; v->boolean = true; return literal("true");
            case 'f': v->type = JsonValue::Type::boolean; v->boolean = false; return literal("false");
            case 'n': v->type = JsonValue::Type::null; return literal("null");
            default: return number(v);
        }
    }

    bool object(JsonValue* v, int depth) {
        if (depth > limits_.max_depth) return fail_bool("nesting deeper than " + std::to_string(limits_.max_depth));
        v->type = JsonValue::Type::object;
        ++pos_;
        skip_ws();
        if (pos_ < text_.size() && text_[pos_] == '}') { ++pos_; return true; }
        std::vector<std::size_t> key_at;                        // offset of each member name
        std::unordered_map<std::string, std::size_t> index;  // name -> member, for large objects
        for (;;) {
            skip_ws();
            if (pos_ >= text_.size() || text_[pos_] != '"') return fail_bool("expected a member name");
            const std::size_t at = pos_;
            std::string key;
            if (!string(&key)) return false;
            if (!unique_key(*v, key, at, &key_at, &index)) return false;
            skip_ws();
            if (pos_ >= text_.size() || text_[pos_] != ':') return fail_bool("expected ':'");
            ++pos_;
            skip_ws();
            if (!count_element()) return false;
            v->object.emplace_back(std::move(key), JsonValue{});
            if (!index.empty()) index.emplace(v->object.back().first, v->object.size() - 1);
            if (!value(&v->object.back().second, depth)) return false;
            skip_ws();
            if (pos_ < text_.size() && text_[pos_] == ',') { ++pos_; continue; }
            if (pos_ < text_.size() && text_[pos_] == '}') { ++pos_; return true; }
            return fail_bool("expected ',' or '}'");
        }
    }

    // "line 3, column 5" of a byte offset (1-based; columns count bytes).
    std::string where(std::size_t offset) const {
        int line = 1;
        std::size_t line_start = 0;
        for (std::size_t i = 0; i < offset && i < text_.size(); ++i)
            if (text_[i] == '\n') { ++line; line_start = i + 1; }
        return "line " + std::to_string(line) + ", column " + std::to_string(offset - line_start + 1);
    }

    // Refuses a member name the object already has (RFC 8259 leaves the meaning open; readers
    // differ on which value wins, so a hand-edited document is refused rather than guessed).
    bool unique_key(const JsonValue& v, const std::string& key, std::size_t at, std::vector<std::size_t>* key_at,
                    std::unordered_map<std::string, std::size_t>* index) {
        std::size_t first = v.object.size();
        if (v.object.size() < 16) {
            for (std::size_t i = 0; i < v.object.size(); ++i)
                if (v.object[i].first == key) { first = i; break; }
        } else {
            if (index->empty())
                for (std::size_t i = 0; i < v.object.size(); ++i) index->emplace(v.object[i].first, i);
            if (auto it = index->find(key); it != index->end()) first = it->second;
        }
        if (first < v.object.size()) {
            std::string shown = key.substr(0, 40);
            error_ = Status::failure("Not a valid document: the key \"" + shown + "\" appears twice (" + where(at) +
                                         "; first at " + where((*key_at)[first]) + "); keep one of them.",
                                     0, static_cast<int>(at + 1));
            return false;
        }
        key_at->push_back(at);
        return true;
    }

    bool array(JsonValue* v, int depth) {
        if (depth > limits_.max_depth) return fail_bool("nesting deeper than " + std::to_string(limits_.max_depth));
        v->type = JsonValue::Type::array;
        ++pos_;
        skip_ws();
        if (pos_ < text_.size() && text_[pos_] == ']') { ++pos_; return true; }
        for (;;) {
            skip_ws();
            if (!count_element()) return false;
            v->array.emplace_back();
            if (!value(&v->array.back(), depth)) return false;
            skip_ws();
            if (pos_ < text_.size() && text_[pos_] == ',') { ++pos_; continue; }
            if (pos_ < text_.size() && text_[pos_] == ']') { ++pos_; return true; }
            return fail_bool("expected ',' or ']'");
        }
    }

    bool hex4(unsigned* out) {
        if (pos_ + 4 > text_.size()) return fail_bool("short \\u escape");
        unsigned v = 0;
        for (int i = 0; i < 4; ++i) {
            const char c = text_[pos_++];
            v <<= 4;
            if (c >= '0' && c <= '9') v |= c - '0';
            else if (c >= 'a' && c <= 'f') v |= c - 'a' + 10;
            else if (c >= 'A' && c <= 'F') v |= c - 'A' + 10;
            else return fail_bool("bad \\u escape");
        }
        *out = v;
        return true;
    }

    // Length of a valid UTF-8 sequence starting at pos_, or 0 (RFC 3629: no overlongs, no surrogates).
    std::size_t utf8_length() const {
        const auto b = [&](std::size_t i) { return static_cast<unsigned char>(text_[pos_ + i]); };
        const unsigned char c = b(0);
        std::size_t n = c < 0x80 ? 1 : (c >= 0xC2 && c <= 0xDF) ? 2 : (c >= 0xE0 && c <= 0xEF) ? 3 : (c >= 0xF0 && c <= 0xF4) ? 4 : 0;
        if (n == 0 || pos_ + n > text_.size()) return 0;
        for (std::size_t i = 1; i < n; ++i) if ((b(i) & 0xC0) != 0x80) return 0;
        if (n == 3 && ((c == 0xE0 && b(1) < 0xA0) || (c == 0xED && b(1) >= 0xA0))) return 0;
        if (n == 4 && ((c == 0xF0 && b(1) < 0x90) || (c == 0xF4 && b(1) >= 0x90))) return 0;
        return n;
    }

    bool string(std::string* s) {
        ++pos_;  // opening quote
        for (;;) {
            if (pos_ >= text_.size()) return fail_bool("unterminated string");
            const unsigned char c = static_cast<unsigned char>(text_[pos_]);
            if (c == '"') { ++pos_; return true; }
            if (c < 0x20) return fail_bool("control character in a string");
            if (c == '\\') {
                if (++pos_ >= text_.size()) return fail_bool("unterminated escape");
                const char e = text_[pos_++];
                switch (e) {
                    case '"': *s += '"'; break;
                    case '\\': *s += '\\'; break;
                    case '/': *s += '/'; break;
                    case 'b': *s += '\b'; break;
                    case 'f': *s += '\f'; break;
                    case 'n': *s += '\n'; break;
                    case 'r': *s += '\r'; break;
                    case 't': *s += '\t'; break;
                    case 'u': {
                        unsigned cp = 0;
                        if (!hex4(&cp)) return false;
                        if (cp >= 0xD800 && cp <= 0xDBFF) {
                            unsigned lo = 0;
                            if (text_.substr(pos_, 2) != "\\u") return fail_bool("lone surrogate");
                            pos_ += 2;
                            if (!hex4(&lo) || lo < 0xDC00 || lo > 0xDFFF) return fail_bool("bad surrogate pair");
                            cp = 0x10000 + ((cp - 0xD800) << 10) + (lo - 0xDC00);
                        } else if (cp >= 0xDC00 && cp <= 0xDFFF) {
                            return fail_bool("lone surrogate");
                        }
                        append_utf8(s, cp);
                        break;
                    }
                    default: return fail_bool("unknown escape");
                }
                continue;
            }
            const std::size_t n = utf8_length();
            if (n == 0) return fail_bool("invalid UTF-8");
            s->append(text_.substr(pos_, n));
            pos_ += n;
        }
    }

    bool number(JsonValue* v) {
        const std::size_t start = pos_;
        if (pos_ < text_.size() && text_[pos_] == '-') ++pos_;
        if (pos_ >= text_.size() || !(text_[pos_] >= '0' && text_[pos_] <= '9')) return fail_bool("unexpected character");
        if (text_[pos_] == '0') ++pos_;
        else while (pos_ < text_.size() && text_[pos_] >= '0' && text_[pos_] <= '9') ++pos_;
        if (pos_ < text_.size() && text_[pos_] == '.') {
            ++pos_;
            if (pos_ >= text_.size() || !(text_[pos_] >= '0' && text_[pos_] <= '9')) return fail_bool("digit expected after '.'");
            while (pos_ < text_.size() && text_[pos_] >= '0' && text_[pos_] <= '9') ++pos_;
        }
        if (pos_ < text_.size() && (text_[pos_] == 'e' || text_[pos_] == 'E')) {
            ++pos_;
            if (pos_ < text_.size() && (text_[pos_] == '+' || text_[pos_] == '-')) ++pos_;
            if (pos_ >= text_.size() || !(text_[pos_] >= '0' && text_[pos_] <= '9')) return fail_bool("digit expected in exponent");
            while (pos_ < text_.size() && text_[pos_] >= '0' && text_[pos_] <= '9') ++pos_;
        }
        if (pos_ - start > 400) return fail_bool("number too long");
        const std::string s(text_.substr(start, pos_ - start));
        errno = 0;
        const double d = std::strtod(s.c_str(), nullptr);
        if (!std::isfinite(d)) return fail_bool("number out of range");
        v->type = JsonValue::Type::number;
        v->number = d;
        return true;
    }

    std::string_view text_;
    const JsonLimits& limits_;
    std::size_t pos_ = 0;
    std::size_t elements_ = 0;
    Status error_;
};

}  // namespace

Status parse_json(std::string_view text, JsonValue* out, const JsonLimits& limits) {
    *out = JsonValue{};
    return Reader(text, limits).run(out);
}

}  // namespace tallyproof
