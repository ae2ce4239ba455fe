// XML read as a stream of events (start of an element with its attributes, text, end) by expat,
// with namespaces resolved: each name is its namespace URI and local name, so a prefix chosen by
// the writer ("x:c", "table:table-cell") does not matter (Namespaces in XML 1.0, section 4).
// A document type declaration is refused: workbook parts have none, and it is where entity
// expansion attacks live.
#pragma once
#include <string>
#include <string_view>

#include "status.hpp"

namespace tallyproof {

struct XmlName {
    std::string_view uri;    // "" when the name has no namespace
    std::string_view local;  // "c", "table-cell"
};

class XmlAttributes {
public:
    explicit XmlAttributes(const char** pairs) : pairs_(pairs) {}
    // The value of the attribute with this local name (and namespace URI, unless `uri` is null), or null.
    const char* find(std::string_view local, const char* uri = nullptr) const;

private:
    const char** pairs_;
};

class XmlEvents {
public:
    virtual ~XmlEvents() = default;
    virtual void start(const XmlName& name, const XmlAttributes& attributes) = 0;
    virtual void end(const XmlName& name) = 0;
    virtual void text(std::string_view) {}
    bool stop = false;  // set to stop parsing (a budget reached); read_xml then returns `stop_status`
    Status stop_status;
};

XmlName split_xml_name(const char* name);  // "uri local" as expat gives it
// Parses `xml` (one part of a workbook, named `part` in messages) into `events`.
Status read_xml(std::string_view xml, std::string_view part, XmlEvents* events);

}  // namespace tallyproof
