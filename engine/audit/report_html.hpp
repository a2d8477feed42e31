// zcorr audit report: one self-contained HTML5 file with the audit's totals,
// findings, the intervals over the recalculation bar and charts per point
// (replay deviation and base volume over time, and what the correction sets
// changed when there are any), drawn here as inline SVG.
//
// The file needs nothing outside itself: inline CSS, inline SVG, no fonts,
// images or scripts from anywhere else (a Content-Security-Policy of
// default-src 'none' forbids any load). One small inline script only checks
// after loading that the charts and the findings table were laid out and
// marks <body data-render-check="ok"> (or the reason it is not); the report
// reads the same with scripts off.
//
// ReportCollector is fed through AuditOptions::observe while the audit
// replays the log (streamed in (point, start) order, span not known in
// advance). Per point it keeps at most max_buckets time buckets: when a new
// interval falls beyond them, adjacent pairs are merged and the bucket width
// doubles (widths 60 s * 2^k, aligned to the Unix epoch), so its memory does
// not grow with the log. An interval counts in the bucket of its start.
#pragma once

#include <cstdint>
#include <functional>
#include <iosfwd>
#include <string>
#include <string_view>
#include <vector>

#include "audit/audit.hpp"

namespace zcorr::audit {

struct ReportBucket {
  std::int64_t intervals = 0;           // every interval that started in the bucket
  std::int64_t effective = 0;           // of which not replaced by a correction
  std::int64_t replayed = 0;            // of which the replay recomputed (the audit recomputes effective intervals only)
  std::int64_t not_comparable = 0;      // replayed, but a deviation is infinite (one side has no figure)
  std::int64_t over_bar = 0;            // replayed with a finite deviation beyond the recalculation bar
  std::int64_t V_b_um3_logged = 0;      // effective intervals, as logged
  std::int64_t V_b_um3_recomputed = 0;  // effective and replayed intervals, as recomputed
  std::int64_t V_b_um3_as_recorded = 0; // intervals that are not themselves corrections, as logged
  double worst_ppm = 0;                 // largest finite |deviation| of the replayed intervals
  void merge(const ReportBucket& o) noexcept;
};

struct ReportSeries {
  std::string point;
  std::int64_t width_s = 0;      // bucket width
  std::int64_t first_index = 0;  // buckets[i] covers [(first_index + i) * width_s, + width_s)
  std::vector<ReportBucket> buckets;
  ReportBucket total;            // the sum of every bucket (kept as fed, for the captions and the checks)
  [[nodiscard]] std::int64_t bucket_start(std::size_t i) const noexcept {
    return (first_index + static_cast<std::int64_t>(i)) * width_s;
  }
};

class ReportCollector {
 public:
  static constexpr std::size_t default_max_buckets = 720;
  static constexpr std::int64_t initial_width_s = 60;
  static constexpr std::size_t max_points = 64;  // further points are counted, not charted

  explicit ReportCollector(std::size_t max_buckets = default_max_buckets);

  // The AuditOptions::observe callback.
  void observe(const LoggedInterval& iv, const IntervalReplay& r, bool effective);
  // A callable for AuditOptions::observe that feeds this collector (which must outlive the audit).
  [[nodiscard]] std::function<void(const LoggedInterval&, const IntervalReplay&, bool)> observer();

  [[nodiscard]] const std::vector<ReportSeries>& series() const noexcept { return series_; }
  [[nodiscard]] std::size_t max_buckets() const noexcept { return max_buckets_; }
  [[nodiscard]] std::int64_t uncharted_intervals() const noexcept { return uncharted_; }

 private:
  void add(ReportSeries& s, std::int64_t t, const ReportBucket& b);
  std::size_t max_buckets_;
  std::vector<ReportSeries> series_;
  std::size_t last_ = 0;  // the series fed last (the log comes point by point)
  std::int64_t uncharted_ = 0;
};

struct ReportHeader {
  std::string log_file;          // as given on the command line
  std::int64_t produced_utc_s = 0;
  std::string selection;         // in words ("point HF-1, intervals ending after ...", or "the whole log")
  std::string produced_by;       // program and version, e.g. "zcorr 0.1.0"
  std::string what_if;           // the what-if changes in words, when the audit ran one
  double tolerance_ppm = recalculation_bar_ppm;  // AuditOptions::tolerance_ppm (calc_difference findings)
};

// The safety note printed in the report.
[[nodiscard]] std::string_view report_safety_note() noexcept;

// Text with &, <, >, " and ' escaped (control characters other than tab and
// newline dropped), for element content and attribute values alike.
[[nodiscard]] std::string html_escape(std::string_view text);

// Writes the whole report to `out`.
void write_html_report(std::ostream& out, const AuditResult& result, const ReportCollector& charts, const ReportHeader& header);

}  // namespace zcorr::audit
