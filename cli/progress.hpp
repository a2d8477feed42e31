// zcorr CLI: a progress bar on standard error for long runs (audit, correct).
// Drawn only when standard error is a terminal, at most ten times a second,
// and erased at the end, so a redirected or piped run never sees it.
#pragma once

#include <cstdint>
#include <functional>
#include <string>

namespace zcorr::cli {

// A callback for AuditOptions::progress / CorrectionRequest::progress, or an
// empty function when standard error is not a terminal.
[[nodiscard]] std::function<void(std::int64_t done, std::int64_t total)> stderr_progress(std::string label);

// The bar as drawn for `done` of `total` (exposed for the tests).
[[nodiscard]] std::string progress_line(const std::string& label, std::int64_t done, std::int64_t total, int width = 30);

}  // namespace zcorr::cli
