// The benchmarks' invented 1-minute samples of one meter run: smooth swings
// of line pressure (5 MPa +- 0.4), temperature (285 K +- 4) and volume
// (20 m3 +- 5 per minute). Invented data, for timing only.
#pragma once

#include <cmath>
#include <cstdint>

#include "record/input.hpp"

namespace zcorr::bench {

// Sample i (1, 2, ...) after t0, closing the minute t0 + 60 i.
inline record::RawSample minute_sample(std::int64_t t0, std::int64_t i) {
  record::RawSample s;
  const double ph = static_cast<double>(i) / 60.0;
  s.t_utc_s = t0 + i * 60;
  s.p_Pa = 5.0e6 + 4.0e5 * std::sin(ph);
  s.T_K = 285.0 + 4.0 * std::cos(0.7 * ph);
  s.V_ind_m3 = 20.0 + 5.0 * std::sin(1.3 * ph);
  s.line = i + 1;
  return s;
}

}  // namespace zcorr::bench
