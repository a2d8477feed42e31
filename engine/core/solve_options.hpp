// zcorr engine core: options and result shape shared by every method.
//
// Does not throw, does not allocate, does no I/O.
#pragma once

#include "core/status.hpp"

namespace zcorr {

// Iteration limits as data. Hitting max_iter returns Code::no_convergence
// with the last iterate.
struct SolveOptions {
  int max_iter = 60;
  double rel_tol = 1e-14;
  // Compute states outside the method's expanded range (flagged as extrapolated)
  // instead of refusing them.
  bool allow_outside_range = false;
};

// Result of a (T, p) evaluation: compressibility factor and molar density.
template <class S>
struct ZResult {
  S Z{};
  S rho_mol_per_L{};
  Status status{};
  int iterations = 0;
};

}  // namespace zcorr
