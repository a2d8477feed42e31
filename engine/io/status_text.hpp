// zcorr input/output layer: a Status as short text for CSV cells and
// messages: "ok", "ok;range=expanded;extrapolated", "invalid_pressure", ...
#pragma once

#include <string>

#include "core/status.hpp"

namespace zcorr::io {

[[nodiscard]] std::string status_text(const Status& s);

}  // namespace zcorr::io
