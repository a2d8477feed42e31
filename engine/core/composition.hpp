// zcorr engine core: mole-fraction vectors over the 21 canonical components.
//
// Text parsing lives in engine/io; here only the checks that a compute path
// needs. Does not throw, does not allocate, does no I/O.
#pragma once

#include <array>
#include <cstddef>

#include "core/components.hpp"
#include "core/scalar.hpp"
#include "core/status.hpp"

namespace zcorr {

template <class S>
using Fractions = std::array<S, max_components>;

// Absolute tolerance on |sum - 1| accepted without normalisation.
inline constexpr double default_sum_tolerance = 1e-4;

// Checks that every fraction is finite and >= 0, and that the sum is within
// tol of 1. Returns invalid_composition naming the first offending component
// (component == no_component when the sum is at fault).
template <class S>
[[nodiscard]] Status check_fractions(const Fractions<S>& x, double tol = default_sum_tolerance) noexcept {
  S sum(0);
  for (std::size_t i = 0; i < max_components; ++i) {
    if (!num::isfinite_(x[i]) || x[i] < S(0)) return make_status(Code::invalid_composition, static_cast<std::uint8_t>(i));
    sum += x[i];
  }
  if (!(num::abs_(S(sum - S(1))) <= S(tol))) return make_status(Code::invalid_composition);
  Status s;
  if (sum != S(1)) s.flags |= flag::sum_not_unity;
  return s;
}

template <class S>
[[nodiscard]] S fraction_sum(const Fractions<S>& x) noexcept {
  S sum(0);
  for (const auto& v : x) sum += v;
  return sum;
}

// Converts a double-valued composition to another scalar type.
template <class S>
[[nodiscard]] Fractions<S> convert_fractions(const Fractions<double>& x) noexcept {
  Fractions<S> out{};
  for (std::size_t i = 0; i < max_components; ++i) out[i] = S(x[i]);
  return out;
}

}  // namespace zcorr
