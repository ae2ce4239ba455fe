// Helpers shared by the unit tests that read reference tables under tests/reference/.
#pragma once
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace tallyproof_test {

// A CSV field holding a list, "1;2.5;3", as numbers.
inline std::vector<double> split_numbers(const std::string& field) {
    std::vector<double> v;
    std::stringstream ss(field);
    std::string item;
    while (std::getline(ss, item, ';')) v.push_back(std::stod(item));
    return v;
}

// The data rows of tests/reference/NAME: '#' comment lines, blank lines and the header row are
// skipped; each row is split on commas (a trailing empty field is kept).
inline std::vector<std::vector<std::string>> reference_rows(const std::string& name) {
    std::ifstream in(std::string(TALLYPROOF_REFERENCE_DIR) + "/" + name);
    std::vector<std::vector<std::string>> rows;
    std::string line;
    bool header = true;
    while (std::getline(in, line)) {
        if (line.empty() || line[0] == '#') continue;
        if (header) { header = false; continue; }
        std::vector<std::string> fields;
        std::size_t start = 0;
        for (std::size_t i = 0; i <= line.size(); ++i) {
            if (i == line.size() || line[i] == ',') {
                fields.push_back(line.substr(start, i - start));
                start = i + 1;
            }
        }
        rows.push_back(std::move(fields));
    }
    return rows;
}

}  // namespace tallyproof_test
