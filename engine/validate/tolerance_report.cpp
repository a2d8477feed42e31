#include "validate/tolerance_report.hpp"

#include <algorithm>
#include <cmath>

namespace zcorr::validate {

std::optional<Checked> checked_from_name(std::string_view s) noexcept {
  for (std::size_t i = 0; i < checked_count; ++i)
    if (checked_names[i] == s) return static_cast<Checked>(i);
  return std::nullopt;
}

QuantityCheck compare_value(double reported, double recomputed, double tolerance_ppm) noexcept {
  QuantityCheck c;
  c.reported = reported;
  c.recomputed = recomputed;
  if (!std::isfinite(reported) || !std::isfinite(recomputed) || recomputed == 0.0) return c;
  c.compared = true;
  c.dev_ppm = (reported - recomputed) / recomputed * 1e6;
  c.within = std::abs(c.dev_ppm) <= tolerance_ppm;
  return c;
}

bool RowResult::any_compared() const noexcept {
  return std::any_of(q.begin(), q.end(), [](const QuantityCheck& c) { return c.compared; });
}

bool RowResult::all_within() const noexcept {
  return std::all_of(q.begin(), q.end(), [](const QuantityCheck& c) { return !c.compared || c.within; });
}

std::size_t ToleranceReport::rows_outside() const noexcept {
  return static_cast<std::size_t>(std::count_if(rows.begin(), rows.end(), [](const RowResult& r) { return !r.all_within(); }));
}

bool ToleranceReport::passed() const noexcept {
  std::size_t compared = 0;
  for (const auto& s : summary) compared += s.compared;
  return compared > 0 && rows_outside() == 0 && not_recomputed == 0 && unanswered == 0;
}

void summarise(ToleranceReport& report) {
  report.not_recomputed = 0;
  report.unanswered = 0;
  for (const auto& r : report.rows) {
    if (!r.recomputed) ++report.not_recomputed;
    else if (!r.any_compared()) ++report.unanswered;
  }
  std::vector<double> abs_dev;
  for (std::size_t k = 0; k < checked_count; ++k) {
    QuantitySummary s;
    abs_dev.clear();
    double sum = 0.0;
    for (const auto& r : report.rows) {
      const auto& c = r.q[k];
      if (!c.compared) continue;
      ++s.compared;
      if (!c.within) ++s.outside;
      const double a = std::abs(c.dev_ppm);
      if (abs_dev.empty() || a > s.max_abs_ppm) {
        s.max_abs_ppm = a;
        s.max_row = r.row;
      }
      abs_dev.push_back(a);
      sum += c.dev_ppm;
    }
    if (!abs_dev.empty()) {
      std::sort(abs_dev.begin(), abs_dev.end());
      const std::size_t n = abs_dev.size();
      s.median_abs_ppm = n % 2 == 1 ? abs_dev[n / 2] : 0.5 * (abs_dev[n / 2 - 1] + abs_dev[n / 2]);
      s.mean_ppm = sum / static_cast<double>(n);
    }
    report.summary[k] = s;
  }
}

}  // namespace zcorr::validate
