// Compiled with -fno-exceptions -fno-rtti (see engine/CMakeLists.txt): if any
// core or method header used throw, try or typeid on its compute path, this
// translation unit would not build. tests/core_headers_test.cmake checks that
// no core or method header includes an I/O header.
#include "core/base_conditions.hpp"
#include "core/components.hpp"
#include "core/composition.hpp"
#include "core/scalar.hpp"
#include "core/solve_options.hpp"
#include "core/status.hpp"
#include "core/units.hpp"
#include "data/iso6976_data.hpp"
#include "data/sgerg88_data.hpp"
#include "methods/aga8_gross.hpp"
#include "methods/iso6976.hpp"
#include "methods/gerg2008.hpp"
#include "methods/gerg2008_phase.hpp"
#include "methods/sgerg88.hpp"
#include "methods/detail.hpp"

namespace zcorr {

// Instantiate the templates in double so their bodies are compiled.
template Status check_fractions<double>(const Fractions<double>&, double) noexcept;
template CorrectionFactors<double> correction_factors<double>(double, double, double, double, double, double) noexcept;
template Status gerg2008::prepare<double>(const Fractions<double>&, gerg2008::Prepared<double>&) noexcept;
template gerg2008::Properties<double> gerg2008::state<double>(const gerg2008::Prepared<double>&, const double&, const double&,
                                                              const SolveOptions&, bool) noexcept;
template gerg2008::Properties<double> gerg2008::properties_at_density<double>(const gerg2008::Prepared<double>&, const double&,
                                                                              const double&) noexcept;
template ZResult<double> gerg2008::z_factor<double>(const gerg2008::Prepared<double>&, const double&, const double&,
                                                    const SolveOptions&) noexcept;
template gerg2008::Residual<double> gerg2008::alphar<double>(const gerg2008::Prepared<double>&, const double&, const double&) noexcept;
template Status gerg2008::phase::evaluate_phase<double>(const Fractions<double>&, const double&, const double&,
                                                       gerg2008::phase::Root, gerg2008::phase::PhaseState<double>&,
                                                       const SolveOptions&, bool) noexcept;
template gerg2008::phase::Stability<double> gerg2008::phase::stability<double>(const gerg2008::Prepared<double>&,
                                                                               const double&, const double&,
                                                                               const gerg2008::phase::PhaseOptions&, bool) noexcept;
template gerg2008::phase::Flash<double> gerg2008::phase::flash<double>(const gerg2008::Prepared<double>&, const double&,
                                                                       const double&,
                                                                       const gerg2008::phase::Stability<double>&,
                                                                       const gerg2008::phase::PhaseOptions&) noexcept;
template gerg2008::phase::Saturation<double> gerg2008::phase::saturation_pressure<double>(
    const gerg2008::Prepared<double>&, const double&, const gerg2008::phase::PhaseOptions&) noexcept;
template gerg2008::phase::Saturation<double> gerg2008::phase::saturation_temperature<double>(
    const gerg2008::Prepared<double>&, const double&, const gerg2008::phase::PhaseOptions&) noexcept;
template gerg2008::phase::DewPoint<double> gerg2008::phase::dew_temperature<double>(
    const gerg2008::Prepared<double>&, const double&, const gerg2008::phase::PhaseOptions&,
    const gerg2008::phase::DewOptions&, const double*) noexcept;
template gerg2008::phase::EnvelopeBounds<double> gerg2008::phase::envelope_bounds<double>(
    const gerg2008::Prepared<double>&, const gerg2008::phase::PhaseOptions&, const gerg2008::phase::DewOptions&) noexcept;
template gerg2008::phase::Cricondentherm<double> gerg2008::phase::cricondentherm<double>(
    const gerg2008::Prepared<double>&, const gerg2008::phase::PhaseOptions&, const gerg2008::phase::DewOptions&,
    double) noexcept;
template Status gerg2008::phase::prepare_dry<double>(const Fractions<double>&, gerg2008::Prepared<double>&) noexcept;
template double gerg2008::pressure_Pa<double>(const gerg2008::Prepared<double>&, const double&, const double&) noexcept;
template sgerg88::Mixture<double> sgerg88::prepare<double>(const sgerg88::GrossInput<double>&,
                                                           const sgerg88::CharacterizationOptions&) noexcept;
template sgerg88::State<double> sgerg88::z_factor<double>(const sgerg88::Mixture<double>&, const double&, const double&,
                                                          const SolveOptions&) noexcept;
template sgerg88::Virial<double> sgerg88::virial<double>(const sgerg88::Mixture<double>&, const double&) noexcept;
template sgerg88::GrossBack<double> sgerg88::gross_of<double>(const sgerg88::Mixture<double>&) noexcept;
template sgerg88::Mixture<double> aga8_gross::prepare_method1<double>(const aga8_gross::Method1Input<double>&,
                                                                      const aga8_gross::ReferenceConditions&,
                                                                      const sgerg88::CharacterizationOptions&) noexcept;
template sgerg88::Mixture<double> aga8_gross::prepare_method2<double>(const aga8_gross::Method2Input<double>&,
                                                                      const aga8_gross::ReferenceConditions&,
                                                                      const sgerg88::CharacterizationOptions&) noexcept;
template sgerg88::State<double> aga8_gross::z_factor<double>(const sgerg88::Mixture<double>&, const double&,
                                                             const double&, const SolveOptions&) noexcept;


namespace iso6976 {
template Properties<double> properties<double>(const Fractions<double>&, CombustionRef, MeteringRef, double) noexcept;
template DoubtfulRows doubtful_components<double>(const Fractions<double>&, CombustionRef) noexcept;
template DoubtfulRows doubtful_components<double>(const Fractions<double>&, CombustionRef, MeteringRef) noexcept;
}  // namespace iso6976
template Status aga8_detail::prepare<double>(const Fractions<double>&, aga8_detail::Prepared<double>&) noexcept;
template aga8_detail::StateResult<double> aga8_detail::evaluate<double>(const aga8_detail::Prepared<double>&, const double&, const double&, const SolveOptions&, bool) noexcept;

}  // namespace zcorr
