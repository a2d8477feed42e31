// zcorr evaluation layer: ISO 6976:2016 as a LineMethod, at reference
// conditions only (interface contract: method name `iso6976`). A state is
// accepted when T is one of the metering reference temperatures (0, 15,
// 15.55 = 60 F, 20 degC, within 0.01 K) and p lies in the method's pressure
// window; anything else is refused with Code::out_of_range. Reports Z, molar
// and mass density, molar mass and the second virial coefficient implied by
// the summation factors, B = (Z - 1) R T / p. The doubtful_data flag here
// concerns the Z/s rows only (calorific rows play no part in Z).
#include <cmath>
#include <memory>

#include "eval/line_method.hpp"
#include "methods/iso6976.hpp"

namespace zcorr {
namespace {

class Iso6976Method final : public LineMethod {
 public:
  [[nodiscard]] MethodId id() const noexcept override { return MethodId::iso6976; }

  Status prepare(const Fractions<double>& x) noexcept override {
    x_ = x;
    prepared_ = check_fractions(x_);
    return prepared_;
  }

  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions&) const noexcept override {
    StateOutput out;
    if (!prepared_.ok()) {
      out.status = prepared_;
      return out;
    }
    if (!std::isfinite(T_K) || !(T_K > 0.0)) {
      out.status = make_status(Code::invalid_temperature);
      return out;
    }
    const iso6976::MeteringRef* t2 = nullptr;
    for (const auto& t : iso6976::all_metering_refs)
      if (std::abs(T_K - iso6976::temperature_K(t)) <= 0.01) t2 = &t;
    if (t2 == nullptr) {
      out.status = make_status(Code::out_of_range);
      out.status.range = RangeClass::outside;
      return out;
    }
    const auto r = iso6976::properties(x_, iso6976::CombustionRef::t25C, *t2, p_Pa);
    out.status = r.status;
    if (!r.status.ok()) return out;
    out.status.flags = static_cast<std::uint16_t>(out.status.flags & ~flag::doubtful_data);
    const auto doubt = iso6976::doubtful_components(x_, iso6976::CombustionRef::t25C);
    for (std::size_t i = 0; i < doubt.count; ++i)
      if (doubt.rows[i].zs_doubtful) out.status.flags |= flag::doubtful_data;
    const double T2 = iso6976::temperature_K(*t2);
    const double R = iso6976::data::R_J_per_mol_K;
    const double n_mol_per_m3 = p_Pa / (r.Z * R * T2);
    out[Quantity::Z] = r.Z;
    out[Quantity::rho_mol_per_L] = n_mol_per_m3 / 1000.0;
    out[Quantity::rho_kg_per_m3] = r.rho_kg_per_m3;
    out[Quantity::M_g_per_mol] = r.M_g_per_mol;
    out[Quantity::B_cm3_per_mol] = (r.Z - 1.0) * R * T2 / p_Pa * 1.0e6;
    return out;
  }

 private:
  Fractions<double> x_{};
  Status prepared_ = make_status(Code::invalid_composition);
};

}  // namespace

std::unique_ptr<LineMethod> make_iso6976_line_method() { return std::make_unique<Iso6976Method>(); }

}  // namespace zcorr
