#include "io/status_text.hpp"

#include "core/components.hpp"

namespace zcorr::io {

std::string status_text(const Status& s) {
  std::string out = code_name(s.code);
  if (s.range == RangeClass::expanded || s.range == RangeClass::outside) out += std::string(";range=") + range_name(s.range);
  if (s.has(flag::extrapolated)) out += ";extrapolated";
  if (s.has(flag::dew_point_suspected)) out += ";dew_point_suspected";
  if (s.has(flag::iteration_cap)) out += ";iteration_cap";
  if (s.has(flag::doubtful_data)) out += ";doubtful_data";
  if (s.has(flag::near_dew_point)) out += ";near_dew_point";
  if (s.component != no_component) out += ";component=" + std::string(component_name(s.component));
  return out;
}

}  // namespace zcorr::io
