// Cyclic Jacobi eigenvalues of a symmetric matrix (Golub and Van Loan 2013, s. 8.5.2-8.5.3;
// the rotation of Rutishauser's 1971 Handbook procedure, which keeps it stable).
#include "symmetric_eigenvalues.hpp"

#include <algorithm>
#include <cmath>
#include <functional>

namespace tallyproof {

std::vector<double> symmetric_eigenvalues(const SquareMatrix& m) {
    const std::size_t n = m.k;
    if (m.v.size() != n * n) return {};
    for (double x : m.v)
        if (!std::isfinite(x)) return {};
    std::vector<double> a = m.v;
    auto A = [&](std::size_t i, std::size_t j) -> double& { return a[i * n + j]; };
    double total = 0;
    for (double x : a) total += x * x;
    for (int sweep = 0; sweep < 100; ++sweep) {
        double off = 0;
        for (std::size_t i = 0; i < n; ++i)
            for (std::size_t j = i + 1; j < n; ++j) off += 2 * A(i, j) * A(i, j);
        if (off <= 1e-30 * total || off == 0) break;
        for (std::size_t p = 0; p < n; ++p)
            for (std::size_t q = p + 1; q < n; ++q) {
                const double apq = A(p, q);
                if (apq == 0) continue;
                const double theta = (A(q, q) - A(p, p)) / (2 * apq);
                const double t = (theta >= 0 ? 1.0 : -1.0) / (std::fabs(theta) + std::sqrt(theta * theta + 1));
                const double c = 1 / std::sqrt(t * t + 1), s = t * c;
                for (std::size_t r = 0; r < n; ++r) {  // columns p and q
                    const double arp = A(r, p), arq = A(r, q);
                    A(r, p) = c * arp - s * arq;
                    A(r, q) = s * arp + c * arq;
                }
                for (std::size_t r = 0; r < n; ++r) {  // rows p and q
                    const double apr = A(p, r), aqr = A(q, r);
                    A(p, r) = c * apr - s * aqr;
                    A(q, r) = s * apr + c * aqr;
                }
            }
    }
    std::vector<double> ev(n);
    for (std::size_t i = 0; i < n; ++i) ev[i] = A(i, i);
    std::sort(ev.begin(), ev.end(), std::greater<double>());
    return ev;
}

}  // namespace tallyproof
