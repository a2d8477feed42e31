// zcorr evaluation layer: SGERG-88 (ISO 12213-3) and the AGA8 gross methods 1
// and 2 behind the LineMethod interface.
//
// prepare_gross() takes the gross inputs at each method's reference
// conditions:
//   sgerg88: Hs_MJ_per_m3 (25 degC combustion; 0 degC, 101.325 kPa metering),
//            d (0 degC, 101.325 kPa), x_CO2, x_H2 (missing = 0);
//   gross1:  Hs_MJ_per_m3 = HV (60 degF combustion; 60 degF, 14.73 psia),
//            d = Gr (60 degF, 14.73 psia), x_CO2, x_H2 (missing = 0);
//   gross2:  d = Gr (60 degF, 14.73 psia), x_N2, x_CO2, x_H2 (missing = 0).
// prepare(composition) reduces a full analysis to those inputs with ISO 6976
// (methods/iso6976.hpp) at the same reference conditions, and takes the CO2,
// N2 and H2 fractions from the analysis. The other components enter only
// through Hs and d (they are lumped into the equivalent hydrocarbon and N2,
// as the method does). With a full analysis the state is also checked with the GERG-2008
// phase test (eval/phase_check.hpp): a state that test finds two-phase (or cannot decide)
// keeps the method's own status code and Z, with the flag dew_point_suspected; a single-phase state near the dew point gets
// near_dew_point (EvalOptions::dew_margin_K).
#include <cmath>
#include <memory>

#include "core/units.hpp"
#include "eval/line_method.hpp"
#include "eval/phase_check.hpp"
#include "methods/aga8_gross.hpp"
#include "methods/iso6976.hpp"
#include "methods/sgerg88.hpp"

namespace zcorr {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

double or_zero(double v) { return std::isnan(v) ? 0.0 : v; }

class GrossLineMethod : public LineMethod {
 public:
  explicit GrossLineMethod(MethodId id) : id_(id) {}
  [[nodiscard]] MethodId id() const noexcept override { return id_; }

  Status prepare_gross(const GrossInputs& g) noexcept override {
    from_composition_ = false;
    return characterize(g, Status{});
  }

  Status prepare(const Fractions<double>& x) noexcept override {
    ready_ = false;
    from_composition_ = true;
    const Status cs = check_fractions(x);
    if (!cs.ok()) return cs;
    const double sum = fraction_sum(x);
    GrossInputs g;
    g.x_CO2 = x[index(Component::carbon_dioxide)] / sum;
    g.x_N2 = x[index(Component::nitrogen)] / sum;
    g.x_H2 = x[index(Component::hydrogen)] / sum;
    if (g.x_H2 > 0.0) return make_status(Code::coefficients_missing, static_cast<std::uint8_t>(index(Component::hydrogen)));
    iso6976::Properties<double> pr{};
    if (id_ == MethodId::sgerg88)
      pr = iso6976::properties(x, iso6976::CombustionRef::t25C, iso6976::MeteringRef::t0C, units::standard_atmosphere_Pa);
    else
      pr = iso6976::properties(x, iso6976::CombustionRef::t15_55C, iso6976::MeteringRef::t15_55C,
                               aga8_gross::data::p_ref_kPa * 1000.0);
    if (!pr.status.ok()) return pr.status;
    g.Hs_MJ_per_m3 = pr.Hs_MJ_per_m3;
    g.d = pr.d;
    Status carry;
    carry.flags = pr.status.flags;
    const Status st = characterize(g, carry);
    if (st.ok()) (void)phase_.prepare(x);
    return st;
  }

  [[nodiscard]] GrossInputs gross_inputs() const noexcept override { return ready_ ? inputs_ : GrossInputs{}; }

  [[nodiscard]] std::string_view reduction_note() const noexcept override {
    if (!from_composition_) return {};
    return id_ == MethodId::sgerg88
               ? "gross inputs from the analysis by ISO 6976:2016: Hs at 25 degC combustion, 0 degC and 101.325 kPa "
                 "metering; d at 0 degC and 101.325 kPa; x_CO2 and x_H2 from the analysis"
           : id_ == MethodId::gross1
               ? "gross inputs from the analysis by ISO 6976:2016: HV at 60 degF combustion, 60 degF and 14.73 psia "
                 "metering; Gr at 60 degF and 14.73 psia; x_CO2 from the analysis"
               : "gross inputs from the analysis by ISO 6976:2016: Gr at 60 degF and 14.73 psia; x_N2 and x_CO2 "
                 "from the analysis";
  }

  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions& opt) const noexcept override {
    StateOutput out;
    if (!ready_) {
      out.status = make_status(Code::invalid_input);
      return out;
    }
    const auto s = id_ == MethodId::sgerg88 ? sgerg88::z_factor(mix_, T_K, p_Pa, opt.solve)
                                            : aga8_gross::z_factor(mix_, T_K, p_Pa, opt.solve);
    out.status = s.status;
    out.status.flags |= carry_flags_;
    out.iterations = s.iterations;
    if (!s.status.ok()) return out;
    if (from_composition_ && opt.phase_check) {
      const auto pc = phase_.check(T_K, p_Pa, opt.dew_margin_K);
      const auto v = pc.verdict;
      if (v == PhaseVerdict::two_phase || v == PhaseVerdict::undecided) out.status.flags |= flag::dew_point_suspected;
      if (v == PhaseVerdict::single_phase && pc.near_dew) out.status.flags |= flag::near_dew_point;
      out.two_phase = v == PhaseVerdict::two_phase;
    }
    const double rho = s.rho_mol_per_L;  // kmol/m3 = mol/L
    out[Quantity::Z] = s.Z;
    out[Quantity::rho_mol_per_L] = rho;
    out[Quantity::M_g_per_mol] = mix_.M_kg_per_kmol;
    out[Quantity::rho_kg_per_m3] = rho * mix_.M_kg_per_kmol;
    out[Quantity::B_cm3_per_mol] = s.B_cm3_per_mol;
    out[Quantity::C_cm6_per_mol2] = s.C_cm6_per_mol2;
    out[Quantity::Z_virial2] = s.Z_virial2;
    if (opt.derived) {
      // dZ/dp at constant T from p = rho R T (1 + B rho + C rho^2), B and C
      // in m3/kmol and m6/kmol2, p in kPa.
      const double B = s.B_cm3_per_mol * 1e-3, C = s.C_cm6_per_mol2 * 1e-6;
      const double dZdrho = B + 2.0 * C * rho;
      const double dpdrho = sgerg88::data::R * T_K * (1.0 + 2.0 * B * rho + 3.0 * C * rho * rho);
      out[Quantity::dZdP_per_kPa] = dZdrho / dpdrho;
    }
    return out;
  }

 private:
  Status characterize(const GrossInputs& g, Status carry) noexcept {
    ready_ = false;
    carry_flags_ = carry.flags;
    sgerg88::Mixture<double> m;
    switch (id_) {
      case MethodId::sgerg88:
        m = sgerg88::prepare(sgerg88::GrossInput<double>{g.Hs_MJ_per_m3, g.d, g.x_CO2, or_zero(g.x_H2)});
        break;
      case MethodId::gross1:
        m = aga8_gross::prepare_method1(aga8_gross::Method1Input<double>{g.Hs_MJ_per_m3, g.d, g.x_CO2, or_zero(g.x_H2)});
        break;
      default:
        m = aga8_gross::prepare_method2(aga8_gross::Method2Input<double>{g.d, g.x_N2, g.x_CO2, or_zero(g.x_H2)});
        break;
    }
    Status st = m.status;
    st.flags |= carry.flags;
    if (!m.status.ok()) return st;
    mix_ = m;
    inputs_ = g;
    if (id_ == MethodId::gross2) inputs_.Hs_MJ_per_m3 = nan;
    else inputs_.x_N2 = m.x[1];  // derived
    if (id_ == MethodId::gross1 || id_ == MethodId::gross2) inputs_.x_H2 = or_zero(g.x_H2);
    ready_ = true;
    return st;
  }

  MethodId id_;
  sgerg88::Mixture<double> mix_{};
  GrossInputs inputs_{};
  std::uint16_t carry_flags_ = 0;
  bool ready_ = false;
  bool from_composition_ = false;
  mutable PhaseCheck phase_{};  // with a full analysis only
};

}  // namespace

std::unique_ptr<LineMethod> make_sgerg88_line_method() { return std::make_unique<GrossLineMethod>(MethodId::sgerg88); }
std::unique_ptr<LineMethod> make_gross1_line_method() { return std::make_unique<GrossLineMethod>(MethodId::gross1); }
std::unique_ptr<LineMethod> make_gross2_line_method() { return std::make_unique<GrossLineMethod>(MethodId::gross2); }

}  // namespace zcorr
