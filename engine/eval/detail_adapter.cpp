// zcorr evaluation layer: the AGA8 detail characterization method
// (methods/detail.hpp) behind the LineMethod interface, in double.
// The full analysis is also checked with the GERG-2008 phase test (eval/phase_check.hpp):
// a state that test finds two-phase (or cannot decide) keeps the method's own status code
// and Z, with the flag dew_point_suspected; a single-phase state near the dew point gets
// near_dew_point (EvalOptions::dew_margin_K).
#include <memory>

#include "eval/line_method.hpp"
#include "eval/phase_check.hpp"
#include "methods/detail.hpp"

namespace zcorr {
namespace {

class DetailMethod final : public LineMethod {
 public:
  [[nodiscard]] MethodId id() const noexcept override { return MethodId::detail; }

  Status prepare(const Fractions<double>& x) noexcept override {
    const Status st = aga8_detail::prepare(x, prepared_);
    if (st.ok()) (void)phase_.prepare(x);
    return st;
  }

  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    StateOutput out;
    const auto r = aga8_detail::evaluate(prepared_, T_K, p_Pa, opt.solve, opt.derived);
    out.status = r.status;
    out.iterations = r.iterations;
    if (r.status.ok() && opt.phase_check) {
      const auto pc = phase_.check(T_K, p_Pa, opt.dew_margin_K);
      const auto v = pc.verdict;
      if (v == PhaseVerdict::two_phase || v == PhaseVerdict::undecided) out.status.flags |= flag::dew_point_suspected;
      if (v == PhaseVerdict::single_phase && pc.near_dew) out.status.flags |= flag::near_dew_point;
      out.two_phase = v == PhaseVerdict::two_phase;
    }
    const Code c = r.status.code;
    // Refused or invalid: no numbers. No convergence: the last iterate, as the status says.
    if (c != Code::ok && c != Code::no_convergence) return out;
    out[Quantity::Z] = r.Z;
    out[Quantity::rho_mol_per_L] = r.rho_mol_per_L;
    out[Quantity::rho_kg_per_m3] = r.rho_kg_per_m3;
    out[Quantity::M_g_per_mol] = r.M_g_per_mol;
    out[Quantity::B_cm3_per_mol] = r.B_cm3_per_mol;
    out[Quantity::C_cm6_per_mol2] = r.C_cm6_per_mol2;
    out[Quantity::Z_virial2] = r.Z_virial2;
    if (opt.derived) {
      out[Quantity::dZdP_per_kPa] = r.dZdp_per_kPa;
      out[Quantity::dZdT_per_K] = r.dZdT_per_K;
    }
    return out;
  }

 private:
  aga8_detail::Prepared<double> prepared_{};
  mutable PhaseCheck phase_{};
};

}  // namespace

std::unique_ptr<LineMethod> make_detail_method() { return std::make_unique<DetailMethod>(); }

}  // namespace zcorr
