// zcorr validation: comparing reported figures with recomputed ones.
//
// The quantities a flow computer reports and zcorr can recompute: Z at line
// conditions (Z_f), Z at base conditions (Z_b), the conversion factor
// C = (p_f/p_b)(T_b/T_f)(Z_b/Z_f) and the base volume V_b = C V_f.
//
// Each is compared as a relative deviation in parts per million,
//   dev_ppm = (reported - recomputed) / recomputed * 1e6,
// against a tolerance per quantity. The default, 50 ppm, is the
// recalculation bar of API MPMS Chapter 21.1 (a quantity transaction record
// must allow recalculation within 50 ppm; 43 CFR 3175 also asks reference
// software to agree within 50 ppm), as summarised in the project's standards
// notes. A deviation exactly at the tolerance is within it.
//
// Plain data and arithmetic; no I/O.
#pragma once

#include <array>
#include <cstddef>
#include <limits>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/status.hpp"

namespace zcorr::validate {

enum class Checked : std::size_t { Z_f, Z_b, C, V_b, count };
inline constexpr std::size_t checked_count = static_cast<std::size_t>(Checked::count);
inline constexpr std::array<std::string_view, checked_count> checked_names{"Z_f", "Z_b", "C", "V_b"};

[[nodiscard]] std::optional<Checked> checked_from_name(std::string_view s) noexcept;

// API MPMS 21.1 recalculation bar (see the file comment).
inline constexpr double default_tolerance_ppm = 50.0;

struct Tolerances {
  std::array<double, checked_count> ppm{default_tolerance_ppm, default_tolerance_ppm, default_tolerance_ppm,
                                        default_tolerance_ppm};
  [[nodiscard]] double operator[](Checked q) const noexcept { return ppm[static_cast<std::size_t>(q)]; }
  double& operator[](Checked q) noexcept { return ppm[static_cast<std::size_t>(q)]; }
};

struct QuantityCheck {
  bool compared = false;  // a reported value was present and a recomputed one available
  double reported = std::numeric_limits<double>::quiet_NaN();
  double recomputed = std::numeric_limits<double>::quiet_NaN();
  double dev_ppm = std::numeric_limits<double>::quiet_NaN();
  bool within = true;  // meaningful when compared
};

// Compares one figure. A non-finite reported value is not compared.
[[nodiscard]] QuantityCheck compare_value(double reported, double recomputed, double tolerance_ppm) noexcept;

struct RowResult {
  std::size_t row = 0;   // 1-based data row (header excluded)
  long line = 0;         // line in the file where the row starts
  std::string label;     // the time stamp of an export row, the point id of a test point
  bool recomputed = false;  // false: the row could not be recomputed (see problem)
  std::string problem;      // why not (empty when recomputed)
  Status status{};          // of the line state
  std::array<QuantityCheck, checked_count> q{};

  [[nodiscard]] const QuantityCheck& operator[](Checked k) const noexcept { return q[static_cast<std::size_t>(k)]; }
  QuantityCheck& operator[](Checked k) noexcept { return q[static_cast<std::size_t>(k)]; }
  [[nodiscard]] bool any_compared() const noexcept;
  [[nodiscard]] bool all_within() const noexcept;  // every compared quantity within tolerance
};

struct QuantitySummary {
  std::size_t compared = 0;
  std::size_t outside = 0;
  double max_abs_ppm = std::numeric_limits<double>::quiet_NaN();
  std::size_t max_row = 0;  // data row of the largest |deviation|
  double median_abs_ppm = std::numeric_limits<double>::quiet_NaN();
  double mean_ppm = std::numeric_limits<double>::quiet_NaN();  // signed: shows a systematic offset
};

struct ToleranceReport {
  std::vector<RowResult> rows;
  std::array<QuantitySummary, checked_count> summary{};
  Tolerances tolerances{};
  std::size_t not_recomputed = 0;  // rows that could not be recomputed
  std::size_t unanswered = 0;      // rows with nothing reported to compare

  [[nodiscard]] const QuantitySummary& operator[](Checked k) const noexcept {
    return summary[static_cast<std::size_t>(k)];
  }
  [[nodiscard]] std::size_t rows_outside() const noexcept;
  // True when at least one figure was compared, every compared figure is
  // within tolerance, every row was recomputed and every row had something
  // to compare.
  [[nodiscard]] bool passed() const noexcept;
};

// Fills summary, not_recomputed and unanswered from rows.
void summarise(ToleranceReport& report);

}  // namespace zcorr::validate
