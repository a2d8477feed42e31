// zcorr evaluation layer: one runtime interface over every method, in double.
//
// This is the seam between the CLI / interval recorder and the templated
// engine methods. Making a method (make_line_method) allocates once; after
// prepare(), state() does not allocate and does not throw.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <limits>
#include <memory>
#include <optional>
#include <string_view>

#include "core/composition.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"

namespace zcorr {

enum class MethodId { gerg2008, detail, sgerg88, gross1, gross2, iso6976 };

inline constexpr std::array<std::string_view, 6> method_names{"gerg2008", "detail", "sgerg88", "gross1", "gross2", "iso6976"};

[[nodiscard]] constexpr std::string_view method_name(MethodId m) noexcept { return method_names[static_cast<std::size_t>(m)]; }
[[nodiscard]] constexpr std::optional<MethodId> method_from_name(std::string_view s) noexcept {
  for (std::size_t i = 0; i < method_names.size(); ++i)
    if (method_names[i] == s) return static_cast<MethodId>(i);
  return std::nullopt;
}

// Every quantity a method may report for a state. NaN means "not provided".
enum class Quantity : std::size_t {
  Z,
  rho_mol_per_L,
  rho_kg_per_m3,
  M_g_per_mol,
  B_cm3_per_mol,         // mixture second virial coefficient at T
  C_cm6_per_mol2,        // mixture third virial coefficient at T (where the method has one)
  Z_virial2,             // truncated virial Z = 1 + B rho + C rho^2 at the method's density
  dZdP_per_kPa,          // (dZ/dp) at constant T
  dZdT_per_K,            // (dZ/dT) at constant p
  w_m_per_s,             // speed of sound
  kappa,                 // isentropic exponent
  mu_JT_K_per_kPa,       // Joule-Thomson coefficient
  cp_J_per_mol_K,
  cv_J_per_mol_K,
  count
};

inline constexpr std::array<std::string_view, static_cast<std::size_t>(Quantity::count)> quantity_names{
    "Z", "rho_mol_per_L", "rho_kg_per_m3", "M_g_per_mol", "B_cm3_per_mol", "C_cm6_per_mol2", "Z_virial2",
    "dZdP_per_kPa", "dZdT_per_K", "w_m_per_s", "kappa", "mu_JT_K_per_kPa", "cp_J_per_mol_K", "cv_J_per_mol_K"};

struct StateOutput {
  std::array<double, static_cast<std::size_t>(Quantity::count)> q;
  Status status{};
  int iterations = 0;
  // The GERG-2008 phase test (EvalOptions::phase_check) found the state two-phase: gerg2008
  // says so in its code (Code::two_phase, no Z); the other methods keep their code and Z
  // with flag::dew_point_suspected. The recorder stops the conversion for such a state.
  bool two_phase = false;

  StateOutput() { q.fill(std::numeric_limits<double>::quiet_NaN()); }
  [[nodiscard]] double operator[](Quantity k) const noexcept { return q[static_cast<std::size_t>(k)]; }
  double& operator[](Quantity k) noexcept { return q[static_cast<std::size_t>(k)]; }
  [[nodiscard]] bool has(Quantity k) const noexcept { return !std::isnan(q[static_cast<std::size_t>(k)]); }
};

// Gross-characterization inputs (SGERG-88, AGA8 gross methods). NaN = not given.
struct GrossInputs {
  double Hs_MJ_per_m3 = std::numeric_limits<double>::quiet_NaN();  // at the method's reference conditions
  double d = std::numeric_limits<double>::quiet_NaN();             // real-gas relative density
  double x_CO2 = std::numeric_limits<double>::quiet_NaN();
  double x_H2 = std::numeric_limits<double>::quiet_NaN();
  double x_N2 = std::numeric_limits<double>::quiet_NaN();
};

struct EvalOptions {
  SolveOptions solve{};
  bool derived = false;  // also compute the derived properties (dZ/dp, w, kappa, ...)
  // GERG-2008: test mixture states for phase stability (eval/phase_check.hpp); a two-phase
  // state gets Code::two_phase and no Z. Off only for comparisons with the bare equation.
  bool phase_check = true;
  // With the phase check: a single-phase state less than this many kelvin above the
  // hydrocarbon dew temperature at its pressure gets flag::near_dew_point (0: not checked).
  double dew_margin_K = default_dew_margin_K;
  static constexpr double default_dew_margin_K = 5.0;
};

class LineMethod {
 public:
  virtual ~LineMethod() = default;
  [[nodiscard]] virtual MethodId id() const noexcept = 0;
  // Does the composition-dependent work once. The status says whether the
  // composition can be used with this method (and its range class).
  virtual Status prepare(const Fractions<double>& x) noexcept = 0;
  // For gross-characterization methods; others return invalid_input.
  virtual Status prepare_gross(const GrossInputs&) noexcept { return make_status(Code::invalid_input); }
  // Gross-characterization methods: the gross inputs in use after the last
  // successful prepare() or prepare_gross() (NaN fields when not applicable),
  // and a note naming how prepare(composition) reduced the analysis to them
  // (e.g. the ISO 6976 reference conditions). Empty for other methods.
  [[nodiscard]] virtual GrossInputs gross_inputs() const noexcept { return {}; }
  [[nodiscard]] virtual std::string_view reduction_note() const noexcept { return {}; }
  // Evaluates a state after prepare(). Does not allocate, does not throw.
  [[nodiscard]] virtual StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept = 0;
};

// Returns nullptr for a method that this build does not provide.
[[nodiscard]] std::unique_ptr<LineMethod> make_line_method(MethodId m);

}  // namespace zcorr
