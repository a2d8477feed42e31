// zcorr interval log: checked register arithmetic.
//
// Registers and their sums are 64-bit integers. A sum never wraps and never
// overflows (signed overflow is undefined behaviour): it saturates at the
// int64 limit and says so, and the caller flags what it saturated.
#pragma once

#include <cmath>
#include <cstdint>
#include <limits>

namespace zcorr::record {

// The largest register value one interval may hold (|value| / quantum): above
// it the register saturates and the interval is flagged `overflow`.
inline constexpr double register_limit = 9.0e18;

// a += b; on overflow a is set to the limit in the direction of b and true is returned.
[[nodiscard]] inline bool sat_add(std::int64_t& a, std::int64_t b) noexcept {
  if (__builtin_add_overflow(a, b, &a)) {
    a = b > 0 ? std::numeric_limits<std::int64_t>::max() : std::numeric_limits<std::int64_t>::min();
    return true;
  }
  return false;
}

// Whether value / quantum is outside what a register holds (non-finite included).
[[nodiscard]] inline bool register_out_of_range(double value, double quantum) noexcept {
  const double r = value / quantum;
  return !std::isfinite(r) || std::fabs(r) >= register_limit;
}

}  // namespace zcorr::record
