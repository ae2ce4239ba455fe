// Neumaier's (1974, ZAMM 54:39) compensated summation: a running sum whose rounding error does
// not grow with the number of terms (error about 2 eps |sum| + n eps^2 sum |terms|).
#pragma once
#include <cmath>

namespace tallyproof {

struct CompensatedSum {
    double sum = 0, compensation = 0;
    void add(double v) {
        const double t = sum + v;
        if (std::fabs(sum) >= std::fabs(v)) compensation += (sum - t) + v;
        else compensation += (v - t) + sum;
        sum = t;
    }
    double value() const { return sum + compensation; }
};

}  // namespace tallyproof
