// zcorr evaluation layer: GERG-2008 (engine/methods/gerg2008.hpp) behind LineMethod.
//
// A mixture state the density solver finds is also checked for phase stability
// (eval/phase_check.hpp): a state the tangent-plane test finds two-phase gets
// Code::two_phase and no Z; one the test cannot decide keeps its Z with the flag
// dew_point_suspected; a single-phase state within EvalOptions::dew_margin_K above the
// dew temperature at its pressure gets the flag near_dew_point. Pure fluids keep the solver's own rule (two_phase where the
// denser root has the lower Gibbs energy, no_gas_root past the spinodal).
#include <memory>

#include "eval/line_method.hpp"
#include "eval/phase_check.hpp"
#include "methods/gerg2008.hpp"

namespace zcorr {
namespace {

class Gerg2008Method final : public LineMethod {
 public:
  [[nodiscard]] MethodId id() const noexcept override { return MethodId::gerg2008; }

  Status prepare(const Fractions<double>& x) noexcept override {
    const Status st = gerg2008::prepare(x, prepared_);
    if (st.ok()) (void)phase_.prepare(x);
    return st;
  }

  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    StateOutput out;
    const auto s = gerg2008::state(prepared_, T_K, p_Pa, opt.solve, opt.derived);
    out.status = s.status;
    out.iterations = s.iterations;
    out.two_phase = s.status.code == Code::two_phase;  // a pure fluid: the solver's own rule
    if (s.status.ok() && opt.phase_check) {
      const auto pc = phase_.check(T_K, p_Pa, opt.dew_margin_K);
      if (pc.verdict == PhaseVerdict::two_phase) {
        out.status.code = Code::two_phase;
        out.two_phase = true;
        return out;
      }
      if (pc.verdict == PhaseVerdict::undecided) out.status.flags |= flag::dew_point_suspected;
      if (pc.verdict == PhaseVerdict::single_phase && pc.near_dew) out.status.flags |= flag::near_dew_point;
    }
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
  mutable PhaseCheck phase_{};  // lazily cached cricondentherm of the prepared analysis
};

}  // namespace

std::unique_ptr<LineMethod> make_gerg2008_method() { return std::make_unique<Gerg2008Method>(); }

}  // namespace zcorr
