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
#include "methods/detail.hpp"

namespace zcorr {

// Instantiate the templates in double so their bodies are compiled.
template Status check_fractions<double>(const Fractions<double>&, double) noexcept;
template CorrectionFactors<double> correction_factors<double>(double, double, double, double, double, double) noexcept;
template Status aga8_detail::prepare<double>(const Fractions<double>&, aga8_detail::Prepared<double>&) noexcept;
template aga8_detail::StateResult<double> aga8_detail::evaluate<double>(const aga8_detail::Prepared<double>&, const double&, const double&, const SolveOptions&, bool) noexcept;

}  // namespace zcorr
