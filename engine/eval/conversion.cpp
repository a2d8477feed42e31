#include "eval/conversion.hpp"

#include <cmath>
#include <limits>

namespace zcorr {
namespace {
constexpr double nan = std::numeric_limits<double>::quiet_NaN();
// ISO 6976 gas constant, used only for the p M / (Z R T) fallback density.
constexpr double R_iso6976 = iso6976::data::R_J_per_mol_K;
}  // namespace

std::optional<iso6976::MeteringRef> metering_ref_for(double T_K) noexcept {
  for (auto r : iso6976::all_metering_refs)
    if (std::abs(T_K - iso6976::temperature_K(r)) < 0.005) return r;
  return std::nullopt;
}

iso6976::CombustionRef default_combustion_for(double T_K) noexcept {
  auto m = metering_ref_for(T_K);
  if (!m) return iso6976::CombustionRef::t25C;
  switch (*m) {
    case iso6976::MeteringRef::t0C: return iso6976::CombustionRef::t25C;
    case iso6976::MeteringRef::t15C: return iso6976::CombustionRef::t15C;
    case iso6976::MeteringRef::t15_55C: return iso6976::CombustionRef::t15_55C;
    case iso6976::MeteringRef::t20C: return iso6976::CombustionRef::t25C;
  }
  return iso6976::CombustionRef::t25C;
}

std::string_view combustion_ref_name(iso6976::CombustionRef r) noexcept {
  switch (r) {
    case iso6976::CombustionRef::t0C: return "0 degC";
    case iso6976::CombustionRef::t15C: return "15 degC";
    case iso6976::CombustionRef::t15_55C: return "15.55 degC (60 degF)";
    case iso6976::CombustionRef::t20C: return "20 degC";
    case iso6976::CombustionRef::t25C: return "25 degC";
  }
  return "?";
}

Converter::Converter(const ConverterSetup& setup) noexcept : setup_(setup) {
  Hs_v_ = nan;
  M_g_per_mol_ = nan;
  Z_b_ = nan;
  const auto mref = metering_ref_for(setup_.base.T_K);
  std::optional<iso6976::Properties<double>> props;
  if (setup_.gas && mref) {
    auto p = iso6976::properties<double>(*setup_.gas, setup_.combustion, *mref, setup_.base.p_Pa);
    if (p.status.ok()) props = p;
  }
  if (props) {
    Hs_v_ = props->Hs_MJ_per_m3;
    M_g_per_mol_ = props->M_g_per_mol;
  }
  switch (setup_.zb_source) {
    case ZbSource::given:
      Z_b_ = setup_.Zb_given;
      z_b_source_ = "given";
      break;
    case ZbSource::iso6976:
      if (!props) {
        setup_status_ = make_status(Code::invalid_input);
        setup_message_ = "Z_b by ISO 6976 needs a gas analysis and a base temperature of 0, 15, 15.55 (60 F) or 20 degC";
        return;
      }
      Z_b_ = props->Z;
      z_b_source_ = "ISO 6976 summation factors at base conditions";
      break;
    case ZbSource::method: {
      if (!setup_.method) {
        setup_status_ = make_status(Code::invalid_input);
        setup_message_ = "Z_b from the line method needs a method";
        return;
      }
      auto out = setup_.method->state(setup_.base.T_K, setup_.base.p_Pa, setup_.eval);
      if (!out.status.ok()) {
        setup_status_ = out.status;
        setup_message_ = "the line method cannot compute Z at base conditions";
        return;
      }
      Z_b_ = out[Quantity::Z];
      if (std::isnan(M_g_per_mol_) && out.has(Quantity::M_g_per_mol)) M_g_per_mol_ = out[Quantity::M_g_per_mol];
      z_b_source_ = method_name(setup_.method->id());
      break;
    }
  }
}

Conversion Converter::convert(double V_f_m3, double T_f_K, double p_f_Pa, std::optional<double> Z_f_given) const noexcept {
  Conversion c;
  c.V_f_m3 = V_f_m3;
  c.Z_b = Z_b_;
  c.z_b_source = z_b_source_;
  c.Hs_MJ_per_m3 = Hs_v_;
  c.energy_MJ = nan;
  c.mass_kg = nan;
  c.rho_f_kg_per_m3 = nan;
  if (!setup_status_.ok()) {
    c.status = setup_status_;
    return c;
  }
  if (Z_f_given) {
    c.Z_f = *Z_f_given;
    c.z_f_source = "given";
  } else if (setup_.method) {
    auto out = setup_.method->state(T_f_K, p_f_Pa, setup_.eval);
    c.status = out.status;
    if (!out.status.ok()) return c;
    c.Z_f = out[Quantity::Z];
    if (out.has(Quantity::rho_kg_per_m3)) c.rho_f_kg_per_m3 = out[Quantity::rho_kg_per_m3];
    c.z_f_source = method_name(setup_.method->id());
  } else {
    c.status = make_status(Code::invalid_input);
    return c;
  }
  c.factors = correction_factors(p_f_Pa, T_f_K, c.Z_f, setup_.base.p_Pa, setup_.base.T_K, c.Z_b);
  if (!c.factors.status.ok()) {
    c.status = c.factors.status;
    return c;
  }
  c.V_b_m3 = c.factors.C * V_f_m3;
  if (!std::isnan(Hs_v_)) c.energy_MJ = c.V_b_m3 * Hs_v_;
  if (std::isnan(c.rho_f_kg_per_m3) && !std::isnan(M_g_per_mol_))
    c.rho_f_kg_per_m3 = p_f_Pa * M_g_per_mol_ * 1e-3 / (c.Z_f * R_iso6976 * T_f_K);
  if (!std::isnan(c.rho_f_kg_per_m3)) c.mass_kg = c.rho_f_kg_per_m3 * V_f_m3;
  return c;
}

}  // namespace zcorr
