// Helpers shared by the unit tests that read reference tables under tests/reference/.
#pragma once
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

}  // namespace tallyproof_test
