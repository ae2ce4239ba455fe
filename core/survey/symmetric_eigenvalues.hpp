// Eigenvalues of a real symmetric matrix by the cyclic Jacobi method (Golub and Van Loan 2013,
// "Matrix Computations", 4th ed., s. 8.5): rotations until the off-diagonal mass is below
// 1e-30 of the total; eigenvalues accurate to a few ulps of the largest. For the small (k ≤ a
// few hundred) matrices of design effects.
#pragma once
#include <vector>

#include "design_covariance.hpp"

namespace tallyproof {

// Eigenvalues in decreasing order; empty for a matrix that is not square or holds a non-finite value.
std::vector<double> symmetric_eigenvalues(const SquareMatrix& m);

}  // namespace tallyproof
