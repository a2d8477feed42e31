// zcorr evaluation layer: GERG-2008 (engine/methods/gerg2008.hpp) behind LineMethod.
#include <memory>

#include "eval/line_method.hpp"
#include "methods/gerg2008.hpp"

namespace zcorr {
namespace {

class Gerg2008Method final : public LineMethod {
 public:
  [[nodiscard]] MethodId id() const noexcept override { return MethodId::gerg2008; }

  Status prepare(const Fractions<double>& x) noexcept override { return gerg2008::prepare(x, prepared_); }

  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    StateOutput out;
    const auto s = gerg2008::state(prepared_, T_K, p_Pa, opt.solve, opt.derived);
    out.status = s.status;
    out.iterations = s.iterations;
    const bool usable = s.status.ok() || s.status.code == Code::no_convergence;
    if (!usable) return out;
    out[Quantity::Z] = s.Z;
    out[Quantity::rho_mol_per_L] = s.rho_mol_per_m3 / 1000.0;
    out[Quantity::rho_kg_per_m3] = s.rho_kg_per_m3;
    out[Quantity::M_g_per_mol] = s.M_g_per_mol;
    out[Quantity::B_cm3_per_mol] = s.B_m3_per_mol * 1.0e6;
    out[Quantity::C_cm6_per_mol2] = s.C_m6_per_mol2 * 1.0e12;
    out[Quantity::Z_virial2] = s.Z_virial2;
    if (opt.derived) {
      out[Quantity::dZdP_per_kPa] = s.dZdp_per_Pa * 1000.0;
      out[Quantity::dZdT_per_K] = s.dZdT_per_K;
      out[Quantity::w_m_per_s] = s.w_m_per_s;
      out[Quantity::kappa] = s.kappa;
      out[Quantity::mu_JT_K_per_kPa] = s.mu_JT_K_per_Pa * 1000.0;
      out[Quantity::cp_J_per_mol_K] = s.cp_J_per_mol_K;
      out[Quantity::cv_J_per_mol_K] = s.cv_J_per_mol_K;
    }
    return out;
  }

 private:
  gerg2008::Prepared<double> prepared_{};
};

}  // namespace

std::unique_ptr<LineMethod> make_gerg2008_method() { return std::make_unique<Gerg2008Method>(); }

}  // namespace zcorr
