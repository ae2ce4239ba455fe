// XML events with expat 2.5 (its namespace-aware parser, XML_ParserCreateNS with a separator),
// Namespaces in XML 1.0 (section 4: expanded names). Parsed in pieces so a part over 2 GB would
// never overflow expat's int lengths (the workbook budget keeps parts far smaller).
#include "xml_events.hpp"

#include <cstring>

#include <expat.h>

namespace tallyproof {
namespace {

constexpr char kSeparator = '\x01';

struct Context {
    XmlEvents* events;
    XML_Parser parser;
    bool doctype = false;
};

void on_start(void* data, const XML_Char* name, const XML_Char** attributes) {
    auto* c = static_cast<Context*>(data);
    c->events->start(split_xml_name(name), XmlAttributes(attributes));
    if (c->events->stop) XML_StopParser(c->parser, XML_FALSE);
}
void on_end(void* data, const XML_Char* name) {
    auto* c = static_cast<Context*>(data);
    c->events->end(split_xml_name(name));
    if (c->events->stop) XML_StopParser(c->parser, XML_FALSE);
}
void on_text(void* data, const XML_Char* s, int len) {
    auto* c = static_cast<Context*>(data);
    c->events->text(std::string_view(s, static_cast<std::size_t>(len)));
    if (c->events->stop) XML_StopParser(c->parser, XML_FALSE);
}
void on_doctype(void* data, const XML_Char*, const XML_Char*, const XML_Char*, int) {
    auto* c = static_cast<Context*>(data);
    c->doctype = true;
    XML_StopParser(c->parser, XML_FALSE);
}

}  // namespace

XmlName split_xml_name(const char* name) {
    const char* sep = std::strchr(name, kSeparator);
    if (sep == nullptr) return {std::string_view(), std::string_view(name)};
    return {std::string_view(name, static_cast<std::size_t>(sep - name)), std::string_view(sep + 1)};
}

const char* XmlAttributes::find(std::string_view local, const char* uri) const {
    for (const char** p = pairs_; p != nullptr && *p != nullptr; p += 2) {
        const XmlName n = split_xml_name(p[0]);
        if (n.local == local && (uri == nullptr || n.uri == uri)) return p[1];
    }
    return nullptr;
}

Status read_xml(std::string_view xml, std::string_view part, XmlEvents* events) {
    XML_Parser parser = XML_ParserCreateNS("UTF-8", kSeparator);
    if (parser == nullptr) return Status::failure("The XML reader could not start (out of memory).");
    Context c{events, parser};
    XML_SetUserData(parser, &c);
    XML_SetElementHandler(parser, on_start, on_end);
    XML_SetCharacterDataHandler(parser, on_text);
    XML_SetStartDoctypeDeclHandler(parser, on_doctype);
    constexpr std::size_t kPiece = 1u << 24;
    XML_Status r = XML_STATUS_OK;
    std::size_t at = 0;
    do {
        const std::size_t n = xml.size() - at < kPiece ? xml.size() - at : kPiece;
        const bool last = at + n == xml.size();
        r = XML_Parse(parser, xml.data() + at, static_cast<int>(n), last ? XML_TRUE : XML_FALSE);
        at += n;
    } while (r == XML_STATUS_OK && at < xml.size());
    Status s;
    if (c.doctype) {
        s = Status::failure("The workbook's part " + std::string(part) + " has a document type declaration, which workbooks never have: refused.");
    } else if (events->stop) {
        s = events->stop_status;
    } else if (r != XML_STATUS_OK) {
        s = Status::failure("The workbook's part " + std::string(part) + " is not well-formed XML (line " +
                            std::to_string(XML_GetCurrentLineNumber(parser)) + ": " + XML_ErrorString(XML_GetErrorCode(parser)) +
                            "). Open it in the spreadsheet program and save it again, or copy the cells.");
    }
    XML_ParserFree(parser);
    return s;
}

}  // namespace tallyproof
