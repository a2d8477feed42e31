// zcorr engine core: base (reference) conditions and the line-to-base
// volume correction.
//
//   C = Fp * Ft * Fz,  Fp = p_f / p_b,  Ft = T_b / T_f,  Fz = Z_b / Z_f,
//   V_b = C * V_f,     F_pv = sqrt(Z_b / Z_f)
// (AGA Report No. 7 for the volume correction and AGA Report No. 3 for
// F_pv, both from memory, medium-high; the ideal-gas-law identity itself is
// common practice.)
//
// Does not throw, does not allocate, does no I/O.
#pragma once

#include <array>
#include <string_view>

#include "core/scalar.hpp"
#include "core/status.hpp"
#include "core/units.hpp"

namespace zcorr {

struct BaseConditions {
  std::string_view name;  // stable id of the preset, or "custom"
  double T_K;
  double p_Pa;
  std::string_view description;
};

// Named presets (common practice; see standards-notes in DEVELOPERS.md):
inline constexpr std::array<BaseConditions, 4> base_presets{{
    {"iso15", 288.15, 101325.0, "15 degC, 101.325 kPa (ISO 13443 standard reference conditions)"},
    {"normal0", 273.15, 101325.0, "0 degC, 101.325 kPa ('normal' conditions)"},
    {"us60f_14.73", (60.0 + 459.67) / 1.8, 14.73 * units::psi, "60 degF, 14.73 psia (US contracts, AGA reports)"},
    {"us60f_14.696", (60.0 + 459.67) / 1.8, 14.696 * units::psi, "60 degF, 14.696 psia (GPA)"},
}};

[[nodiscard]] constexpr const BaseConditions* find_base_preset(std::string_view name) noexcept {
  for (const auto& b : base_presets)
    if (b.name == name) return &b;
  return nullptr;
}

template <class S>
struct CorrectionFactors {
  S Fp{};   // pressure factor p_f / p_b
  S Ft{};   // temperature factor T_b / T_f
  S Fz{};   // compressibility factor Z_b / Z_f
  S C{};    // total conversion factor Fp * Ft * Fz
  S Fpv{};  // supercompressibility factor sqrt(Z_b / Z_f)
  Status status{};
};

template <class S>
[[nodiscard]] CorrectionFactors<S> correction_factors(S p_f_Pa, S T_f_K, S Z_f, S p_b_Pa, S T_b_K, S Z_b) noexcept {
  CorrectionFactors<S> r;
  auto bad = [](const S& v) { return !num::isfinite_(v) || !(v > S(0)); };
  if (bad(T_f_K) || bad(T_b_K)) { r.status = make_status(Code::invalid_temperature); return r; }
  if (bad(p_f_Pa) || bad(p_b_Pa)) { r.status = make_status(Code::invalid_pressure); return r; }
  if (bad(Z_f) || bad(Z_b)) { r.status = make_status(Code::invalid_input); return r; }
  r.Fp = p_f_Pa / p_b_Pa;
  r.Ft = T_b_K / T_f_K;
  r.Fz = Z_b / Z_f;
  r.C = r.Fp * r.Ft * r.Fz;
  r.Fpv = num::sqrt_(r.Fz);
  return r;
}

}  // namespace zcorr
