// zcorr evaluation layer: one metered volume at line conditions converted to
// base conditions, with energy and mass.
//
//   C = (p_f/p_b)(T_b/T_f)(Z_b/Z_f),  V_b = C V_f,
//   E = V_b * Hs_v(t1; T_b, p_b)   (ISO 6976 volumetric gross calorific value
//                                   at metering conditions equal to the base)
//   m = rho_f V_f                  (rho_f from the line method, or p M/(Z R T))
//
// Z_f comes from a line method, or is given by the caller (and the result says
// which). Z_b comes from the same line method at base conditions, or from the
// ISO 6976 summation-factor method, or is given. A Converter is built once per
// (method, gas, base); convert() does not allocate and does not throw.
#pragma once

#include <optional>
#include <string_view>

#include "core/base_conditions.hpp"
#include "eval/line_method.hpp"
#include "methods/iso6976.hpp"

namespace zcorr {

enum class ZbSource { method, iso6976, given };

struct ConverterSetup {
  const LineMethod* method = nullptr;              // prepared line method (may be null when Z_f is given)
  std::optional<Fractions<double>> gas;            // analysis (needed for energy, mass, Z_b by ISO 6976)
  BaseConditions base = base_presets[0];
  iso6976::CombustionRef combustion = iso6976::CombustionRef::t15C;
  ZbSource zb_source = ZbSource::method;
  double Zb_given = 0.0;                           // when zb_source == given
  EvalOptions eval{};
};

struct Conversion {
  double Z_f = 0.0, Z_b = 0.0;
  CorrectionFactors<double> factors{};
  double V_f_m3 = 0.0, V_b_m3 = 0.0;
  double Hs_MJ_per_m3 = 0.0;  // at base conditions; NaN when unavailable
  double energy_MJ = 0.0;     // NaN when unavailable
  double rho_f_kg_per_m3 = 0.0;
  double mass_kg = 0.0;       // NaN when unavailable
  Status status{};            // of the line state (Z_f)
  std::string_view z_f_source;
  std::string_view z_b_source;
};

// Maps a base temperature to ISO 6976's metering reference temperatures
// (0, 15, 15.55 = 60 F, 20 degC); nullopt for any other.
[[nodiscard]] std::optional<iso6976::MeteringRef> metering_ref_for(double T_K) noexcept;
// The usual combustion reference paired with a base temperature (common practice:
// 25/0 degC, 15/15 degC, 60/60 degF, 25/20 degC).
[[nodiscard]] iso6976::CombustionRef default_combustion_for(double T_K) noexcept;
[[nodiscard]] std::string_view combustion_ref_name(iso6976::CombustionRef r) noexcept;

class Converter {
 public:
  // Precomputes Z_b, Hs_v and the molar mass. Check status() before use.
  explicit Converter(const ConverterSetup& setup) noexcept;
  [[nodiscard]] const Status& status() const noexcept { return setup_status_; }
  [[nodiscard]] std::string_view setup_message() const noexcept { return setup_message_; }
  [[nodiscard]] double Z_b() const noexcept { return Z_b_; }
  [[nodiscard]] double Hs_MJ_per_m3() const noexcept { return Hs_v_; }
  [[nodiscard]] const ConverterSetup& setup() const noexcept { return setup_; }
  // Converts one volume. Z_f_given overrides the line method.
  [[nodiscard]] Conversion convert(double V_f_m3, double T_f_K, double p_f_Pa,
                                   std::optional<double> Z_f_given = std::nullopt) const noexcept;

 private:
  ConverterSetup setup_;
  Status setup_status_{};
  std::string_view setup_message_;
  double Z_b_ = 0.0;
  double Hs_v_ = 0.0;
  double M_g_per_mol_ = 0.0;
  std::string_view z_b_source_;
};

}  // namespace zcorr
