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
#include "methods/iso6976.hpp"

namespace zcorr {

// Instantiate the templates in double so their bodies are compiled.
template Status check_fractions<double>(const Fractions<double>&, double) noexcept;
template CorrectionFactors<double> correction_factors<double>(double, double, double, double, double, double) noexcept;


namespace iso6976 {
template Properties<double> properties<double>(const Fractions<double>&, CombustionRef, MeteringRef, double) noexcept;
template DoubtfulRows doubtful_components<double>(const Fractions<double>&, CombustionRef) noexcept;
template DoubtfulRows doubtful_components<double>(const Fractions<double>&, CombustionRef, MeteringRef) noexcept;
}  // namespace iso6976

}  // namespace zcorr
