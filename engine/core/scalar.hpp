// zcorr engine core: helpers that let one templated code path run in
// double and in boost::multiprecision::cpp_bin_float_50.
//
// Does not throw, does not allocate, does no I/O.
#pragma once

#include <cmath>

namespace zcorr::num {

// Unqualified calls so that argument-dependent lookup finds the
// multiprecision overloads; std:: versions serve the built-in types.
template <class S> inline S sqrt_(const S& v) { using std::sqrt; return sqrt(v); }
template <class S> inline S exp_(const S& v) { using std::exp; return exp(v); }
template <class S> inline S log_(const S& v) { using std::log; return log(v); }
template <class S> inline S abs_(const S& v) { using std::abs; return abs(v); }
template <class S> inline S pow_(const S& b, const S& e) { using std::pow; return pow(b, e); }
template <class S> inline S pow_(const S& b, int e) { using std::pow; return pow(b, e); }
template <class S> inline bool isfinite_(const S& v) { using std::isfinite; return static_cast<bool>(isfinite(v)); }

// Converts a double-valued table entry to the scalar type.
template <class S> inline S c(double v) { return S(v); }

// Integer power by repeated multiplication (exact for small exponents, fast in double).
template <class S> inline S ipow(S base, unsigned e) {
  S r(1);
  while (e != 0u) {
    if ((e & 1u) != 0u) r *= base;
    base *= base;
    e >>= 1u;
  }
  return r;
}

}  // namespace zcorr::num
