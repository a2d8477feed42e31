// A test double for LineMethod: an invented two-term virial gas,
//   Z = 1 + B(T) p / (R T),  B(T) = b0 - b1 / T,
// with made-up constants chosen only to give natural-gas-like Z (about 0.9
// at 6 MPa, 288 K). It is NOT a published method and is used only where the
// record layer is tested for its own arithmetic (averaging, integration,
// registers, chain), never to check a physical value.
#pragma once

#include <cmath>

#include "core/composition.hpp"
#include "eval/line_method.hpp"

namespace zcorr::testing {

class VirialTestGas final : public LineMethod {
 public:
  static constexpr double R = 8.314462618;      // J/(mol K), only for this invented model
  static constexpr double b0_m3_per_mol = 5e-5;  // invented
  static constexpr double b1_m3_K_per_mol = 0.035;  // invented
  static constexpr double M_kg_per_mol = 0.0175;    // invented

  [[nodiscard]] MethodId id() const noexcept override { return MethodId::gerg2008; }
  Status prepare(const Fractions<double>& x) noexcept override {
    prepared_ = check_fractions(x).ok();
    return prepared_ ? Status{} : make_status(Code::invalid_composition);
  }
  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions&) const noexcept override {
    StateOutput o;
    if (!prepared_) { o.status = make_status(Code::invalid_composition); return o; }
    if (!(T_K > 0) || !std::isfinite(T_K)) { o.status = make_status(Code::invalid_temperature); return o; }
    if (!(p_Pa > 0) || !std::isfinite(p_Pa)) { o.status = make_status(Code::invalid_pressure); return o; }
    if (p_Pa > refuse_above_Pa) { o.status = make_status(Code::out_of_range); return o; }
    const double B = b0_m3_per_mol - b1_m3_K_per_mol / T_K;
    const double Z = 1.0 + B * p_Pa / (R * T_K);
    o[Quantity::Z] = Z;
    const double rho_mol_per_m3 = p_Pa / (Z * R * T_K);
    o[Quantity::rho_mol_per_L] = rho_mol_per_m3 / 1000.0;
    o[Quantity::rho_kg_per_m3] = rho_mol_per_m3 * M_kg_per_mol;
    return o;
  }
  double refuse_above_Pa = 1e9;  // tests set this to make the method refuse states

 private:
  bool prepared_ = false;
};

}  // namespace zcorr::testing
