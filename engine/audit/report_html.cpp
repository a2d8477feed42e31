// zcorr audit report: the collector of time-bucketed series and the HTML
// writer (see report_html.hpp). The layout and the charts are our own.
#include "audit/report_html.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <ostream>
#include <sstream>

#include "record/quantities.hpp"
#include "record/timeutil.hpp"

namespace zcorr::audit {

// ---------------------------------------------------------------- collector

void ReportBucket::merge(const ReportBucket& o) noexcept {
  intervals += o.intervals;
  effective += o.effective;
  replayed += o.replayed;
  not_comparable += o.not_comparable;
  over_bar += o.over_bar;
  V_b_um3_logged += o.V_b_um3_logged;
  V_b_um3_recomputed += o.V_b_um3_recomputed;
  V_b_um3_as_recorded += o.V_b_um3_as_recorded;
  worst_ppm = std::max(worst_ppm, o.worst_ppm);
}

ReportCollector::ReportCollector(std::size_t max_buckets) : max_buckets_(std::max<std::size_t>(max_buckets, 2)) {}

std::function<void(const LoggedInterval&, const IntervalReplay&, bool)> ReportCollector::observer() {
  return [this](const LoggedInterval& iv, const IntervalReplay& r, bool effective) { observe(iv, r, effective); };
}

void ReportCollector::observe(const LoggedInterval& iv, const IntervalReplay& r, bool effective) {
  ReportBucket b;
  b.intervals = 1;
  if (effective) {
    b.effective = 1;
    b.V_b_um3_logged = iv.V_b_um3;
    if (r.replayed) b.V_b_um3_recomputed = r.V_b_um3;
  }
  if (iv.corrects_seq == 0) b.V_b_um3_as_recorded = iv.V_b_um3;
  if (r.replayed) {
    b.replayed = 1;
    const double w = r.worst_ppm();
    if (!std::isfinite(w)) {
      b.not_comparable = 1;
    } else {
      b.worst_ppm = w;
      if (w > recalculation_bar_ppm) b.over_bar = 1;
    }
  }

  ReportSeries* s = nullptr;
  if (last_ < series_.size() && series_[last_].point == iv.point) {
    s = &series_[last_];
  } else {
    for (std::size_t i = 0; i < series_.size(); ++i)
      if (series_[i].point == iv.point) {
        s = &series_[i];
        last_ = i;
        break;
      }
    if (!s) {
      if (series_.size() >= max_points) {
        ++uncharted_;
        return;
      }
      series_.push_back(ReportSeries{iv.point, initial_width_s, 0, {}, {}});
      last_ = series_.size() - 1;
      s = &series_.back();
    }
  }
  add(*s, iv.start_utc_s, b);
}

void ReportCollector::add(ReportSeries& s, std::int64_t t, const ReportBucket& b) {
  s.total.merge(b);
  std::int64_t idx = record::floor_div(t, s.width_s);
  if (s.buckets.empty()) {
    s.first_index = idx;
    s.buckets.push_back(b);
    return;
  }
  const auto max = static_cast<std::int64_t>(max_buckets_);
  // Each pass either fits idx into the buckets or halves their span (bounded
  // by the 63 doublings an int64 width can take).
  for (int pass = 0; pass < 64; ++pass) {
    const std::int64_t lo = std::min(s.first_index, idx);
    const std::int64_t hi = std::max(s.first_index + static_cast<std::int64_t>(s.buckets.size()) - 1, idx);
    if (hi - lo + 1 <= max) {
      if (idx < s.first_index) {
        s.buckets.insert(s.buckets.begin(), static_cast<std::size_t>(s.first_index - idx), ReportBucket{});
        s.first_index = idx;
      } else if (idx >= s.first_index + static_cast<std::int64_t>(s.buckets.size())) {
        s.buckets.resize(static_cast<std::size_t>(idx - s.first_index + 1));
      }
      s.buckets[static_cast<std::size_t>(idx - s.first_index)].merge(b);
      return;
    }
    // Merge adjacent pairs (aligned to the epoch) and double the width.
    const std::int64_t new_first = record::floor_div(s.first_index, 2);
    const std::int64_t old_last = s.first_index + static_cast<std::int64_t>(s.buckets.size()) - 1;
    std::vector<ReportBucket> merged(static_cast<std::size_t>(record::floor_div(old_last, 2) - new_first + 1));
    for (std::size_t i = 0; i < s.buckets.size(); ++i)
      merged[static_cast<std::size_t>(record::floor_div(s.first_index + static_cast<std::int64_t>(i), 2) - new_first)].merge(
          s.buckets[i]);
    s.buckets = std::move(merged);
    s.first_index = new_first;
    s.width_s *= 2;
    idx = record::floor_div(t, s.width_s);
  }
}

// ---------------------------------------------------------------- text helpers

std::string_view report_safety_note() noexcept {
  return "Custody-transfer figures carry money. Check every result in this report against the contract, local "
         "legal-metrology rules and licensed measurement practice before relying on it. The audit recomputes the log "
         "with the configuration and gas analysis each interval names; it cannot know whether those were right.";
}

std::string html_escape(std::string_view text) {
  std::string o;
  o.reserve(text.size() + text.size() / 8);
  for (char c : text) {
    switch (c) {
      case '&': o += "&amp;"; break;
      case '<': o += "&lt;"; break;
      case '>': o += "&gt;"; break;
      case '"': o += "&quot;"; break;
      case '\'': o += "&#39;"; break;
      default:
        if (static_cast<unsigned char>(c) < 0x20 && c != '\n' && c != '\t') break;
        if (c == 0x7f) break;
        o += c;
    }
  }
  return o;
}

namespace {

using record::format_time_utc;

std::string esc(std::string_view s) { return html_escape(s); }

std::string printf_num(double v, int digits) {
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", digits, v);
  return buf;
}

// Groups the integer part of a plain decimal text in threes with a thin space.
std::string grouped(const std::string& s) {
  std::size_t begin = (!s.empty() && (s[0] == '-' || s[0] == '+')) ? 1 : 0;
  std::size_t end = s.find('.');
  if (end == std::string::npos) end = s.size();
  if (end - begin <= 4) return s;
  std::string o = s.substr(0, begin);
  for (std::size_t i = begin; i < end; ++i) {
    o += s[i];
    const std::size_t left = end - i - 1;
    if (left > 0 && left % 3 == 0) o += "\u2009";
  }
  return o + s.substr(end);
}

std::string reg(std::int64_t v) { return grouped(record::decimal(v, 6)); }
std::string num(double v, int digits) {
  if (std::isnan(v)) return "\u2014";
  if (std::isinf(v)) return v > 0 ? "\u221e" : "\u2212\u221e";
  return grouped(printf_num(v, digits));
}
std::string ppm_text(double v) {
  if (std::isnan(v)) return "\u2014";
  if (std::isinf(v)) return "\u221e";
  const double a = std::fabs(v);
  return num(v, a >= 100 ? 0 : (a >= 1 ? 2 : (a >= 1e-3 ? 4 : 6)));
}
std::string rel_ppm(std::int64_t re, std::int64_t logged) {
  if (logged == 0) return re == 0 ? "0" : "\u221e";
  return ppm_text((static_cast<double>(re) - static_cast<double>(logged)) / static_cast<double>(logged) * 1e6);
}
std::string t_or_dash(std::int64_t t) { return t ? format_time_utc(t) : std::string("\u2014"); }

std::string duration_text(std::int64_t s) {
  if (s % 86400 == 0) return std::to_string(s / 86400) + " d";
  if (s % 3600 == 0) return std::to_string(s / 3600) + " h";
  if (s >= 3600) return std::to_string(s / 3600) + " h " + std::to_string(s % 3600 / 60) + " min";
  if (s % 60 == 0) return std::to_string(s / 60) + " min";
  return std::to_string(s) + " s";
}

std::string svg_num(double v) {
  char buf[32];
  std::snprintf(buf, sizeof buf, "%.1f", v);
  return buf;
}

// ---------------------------------------------------------------- charts

constexpr double chart_w = 960, chart_h = 300;
constexpr double m_left = 84, m_right = 18, m_top = 34, m_bottom = 50;
constexpr double plot_w = chart_w - m_left - m_right, plot_h = chart_h - m_top - m_bottom;

struct TimeAxis {
  std::int64_t t0 = 0, t1 = 1;
  [[nodiscard]] double x(double t) const {
    return m_left + (t - static_cast<double>(t0)) / static_cast<double>(t1 - t0) * plot_w;
  }
};

void time_ticks(std::ostream& o, const TimeAxis& ax) {
  static constexpr std::int64_t steps[] = {60,        120,       300,        600,        900,        1800,       3600,
                                           7200,      10800,     21600,      43200,      86400,      2 * 86400,  7 * 86400,
                                           14 * 86400, 28 * 86400, 91 * 86400, 182 * 86400, 364 * 86400, 728 * 86400};
  const std::int64_t span = ax.t1 - ax.t0;
  std::int64_t step = steps[std::size(steps) - 1];
  for (std::int64_t s : steps)
    if (span / s <= 8) {
      step = s;
      break;
    }
  while (span / step > 8) step *= 2;  // spans beyond the ladder
  const std::int64_t first = (record::floor_div(ax.t0 - 1, step) + 1) * step;
  std::string last_date;
  o << "<g class=\"ticks\">";
  for (std::int64_t t = first; t <= ax.t1; t += step) {
    const double x = ax.x(static_cast<double>(t));
    const std::string text = format_time_utc(t);  // 2026-03-02T06:00:00Z
    const std::string date = text.substr(0, 10), hm = text.substr(11, 5);
    o << "<line class=\"grid\" x1=\"" << svg_num(x) << "\" x2=\"" << svg_num(x) << "\" y1=\"" << m_top << "\" y2=\""
      << m_top + plot_h << "\"/>";
    const double y = m_top + plot_h + 16;
    if (step % 86400 == 0) {
      o << "<text class=\"tl\" x=\"" << svg_num(x) << "\" y=\"" << y << "\">" << date << "</text>";
    } else {
      o << "<text class=\"tl\" x=\"" << svg_num(x) << "\" y=\"" << y << "\">" << hm << "</text>";
      if (date != last_date) o << "<text class=\"tl date\" x=\"" << svg_num(x) << "\" y=\"" << y + 14 << "\">" << date << "</text>";
    }
    last_date = date;
  }
  o << "</g><text class=\"axis-title\" x=\"" << m_left + plot_w << "\" y=\"" << chart_h - 4 << "\" text-anchor=\"end\">time (UTC)</text>";
}

void frame(std::ostream& o) {
  o << "<rect class=\"plot\" x=\"" << m_left << "\" y=\"" << m_top << "\" width=\"" << plot_w << "\" height=\"" << plot_h << "\"/>";
}

struct LegendItem {
  std::string cls, label;
  bool line;  // a line sample, else a block
};
void legend(std::ostream& o, const std::vector<LegendItem>& items) {
  double x = m_left;
  o << "<g class=\"legend\">";
  for (const auto& it : items) {
    if (it.line)
      o << "<line class=\"" << it.cls << "\" x1=\"" << x << "\" x2=\"" << x + 22 << "\" y1=\"14\" y2=\"14\"/>";
    else
      o << "<rect class=\"" << it.cls << "\" x=\"" << x + 6 << "\" y=\"7\" width=\"10\" height=\"12\"/>";
    o << "<text x=\"" << x + 28 << "\" y=\"18\">" << esc(it.label) << "</text>";
    x += 44 + 6.9 * static_cast<double>(it.label.size());
  }
  o << "</g>";
}

// The decade label of 10^k ppm.
std::string decade_label(int k) {
  std::string s;
  if (k < 0) {
    s = "0.";
    for (int i = k + 1; i < 0; ++i) s += '0';
    s += '1';
  } else if (k <= 5) {
    s = "1";
    for (int i = 0; i < k; ++i) s += '0';
  } else {
    s = "1e" + std::to_string(k);
  }
  return s;
}

constexpr int ppm_floor_decade = -4;  // 0.0001 ppm

void deviation_chart(std::ostream& o, const ReportSeries& s, int chart_no) {
  const std::size_t n = s.buckets.size();
  TimeAxis ax{s.bucket_start(0), s.bucket_start(n)};
  double worst = 0;
  for (const auto& b : s.buckets) worst = std::max(worst, b.worst_ppm);
  int top = 3;  // at least up to 1000 ppm so that the 50 ppm bar is always inside
  if (worst > 0) top = std::max(top, static_cast<int>(std::ceil(std::log10(worst) - 1e-9)));
  top = std::min(top, 15);
  const double lo = ppm_floor_decade, hi = top;
  auto y = [&](double v) {
    const double l = v > 0 ? std::clamp(std::log10(v), lo, hi) : lo;
    return m_top + plot_h - (l - lo) / (hi - lo) * plot_h;
  };
  o << "<svg class=\"chart\" id=\"chart-" << chart_no << "\" viewBox=\"0 0 " << chart_w << ' ' << chart_h
    << "\" role=\"img\" aria-labelledby=\"chart-" << chart_no << "-t\"><title id=\"chart-" << chart_no << "-t\">Replay deviation, "
    << esc(s.point) << "</title>";
  frame(o);
  time_ticks(o, ax);
  o << "<g class=\"vticks\">";
  for (int k = ppm_floor_decade; k <= top; ++k) {
    const double yy = y(std::pow(10.0, k));
    o << "<line class=\"grid\" x1=\"" << m_left << "\" x2=\"" << m_left + plot_w << "\" y1=\"" << svg_num(yy) << "\" y2=\""
      << svg_num(yy) << "\"/>";
    if ((top - ppm_floor_decade) <= 10 || (k - ppm_floor_decade) % 2 == 0)
      o << "<text class=\"vl\" x=\"" << m_left - 6 << "\" y=\"" << svg_num(yy + 4) << "\">" << decade_label(k) << "</text>";
  }
  o << "</g><text class=\"axis-title\" transform=\"translate(14 " << m_top + plot_h / 2
    << ") rotate(-90)\" text-anchor=\"middle\">|deviation|, ppm (log)</text>";

  const double slot = plot_w / static_cast<double>(n);
  const double sw = std::clamp(slot * 0.7, 1.0, 8.0);
  std::ostringstream within, over, nc;
  const double y0 = m_top + plot_h;
  for (std::size_t i = 0; i < n; ++i) {
    const auto& b = s.buckets[i];
    const double x = ax.x(static_cast<double>(s.bucket_start(i)) + static_cast<double>(s.width_s) / 2);
    if (b.replayed > b.not_comparable) {
      // Zero and sub-floor deviations get a short stub so the bucket still shows as recomputed.
      const double yy = std::min(y(b.worst_ppm), y0 - 3);
      (b.over_bar ? over : within) << 'M' << svg_num(x) << ' ' << svg_num(y0) << 'V' << svg_num(yy);
    }
    if (b.not_comparable) nc << 'M' << svg_num(x) << ' ' << svg_num(m_top) << 'v' << 10;
  }
  if (!within.str().empty())
    o << "<path class=\"dev\" stroke-width=\"" << svg_num(sw) << "\" d=\"" << within.str() << "\"/>";
  if (!over.str().empty())
    o << "<path class=\"dev-over\" stroke-width=\"" << svg_num(std::max(sw, 2.0)) << "\" d=\"" << over.str() << "\"/>";
  if (!nc.str().empty()) o << "<path class=\"dev-nc\" stroke-width=\"" << svg_num(std::max(sw, 2.0)) << "\" d=\"" << nc.str() << "\"/>";
  if (s.total.replayed == 0)
    o << "<text class=\"plot-note warn\" x=\"" << m_left + plot_w / 2 << "\" y=\"" << svg_num(m_top + plot_h / 2)
      << "\" text-anchor=\"middle\">no interval of this point could be recomputed (see the not_replayed findings)</text>";
  else if (s.total.replayed > s.total.not_comparable && worst < std::pow(10.0, ppm_floor_decade))
    o << "<text class=\"plot-note\" x=\"" << m_left + plot_w / 2 << "\" y=\"" << svg_num(y0 - 14)
      << "\" text-anchor=\"middle\">every recomputed interval matches the log to below 0.0001 ppm</text>";
  const double yb = y(recalculation_bar_ppm);
  o << "<line class=\"bar\" x1=\"" << m_left << "\" x2=\"" << m_left + plot_w << "\" y1=\"" << svg_num(yb) << "\" y2=\""
    << svg_num(yb) << "\"/><text class=\"bar-label\" x=\"" << m_left + plot_w - 4 << "\" y=\"" << svg_num(yb - 5)
    << "\" text-anchor=\"end\">" << printf_num(recalculation_bar_ppm, 0) << " ppm bar</text>";
  legend(o, {{"dev", "largest |deviation| in the bucket", false},
             {"dev-over", "bucket with an interval over the bar", false},
             {"dev-nc", "not comparable", false},
             {"bar", "recalculation bar", true}});
  o << "</svg>";
}

struct NiceScale {
  double top = 1, step = 1;
};
NiceScale nice_scale(double max) {
  if (!(max > 0)) return {1, 0.2};
  const double raw = max / 5;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  double step = 10 * mag;
  for (double m : {1.0, 2.0, 2.5, 5.0, 10.0})
    if (m * mag >= raw) {
      step = m * mag;
      break;
    }
  return {std::ceil(max / step - 1e-9) * step, step};
}
std::string tick_text(double v, double step) {
  int digits = 0;
  while (digits < 6 && std::fabs(step * std::pow(10.0, digits) - std::round(step * std::pow(10.0, digits))) > 1e-6) ++digits;
  return grouped(printf_num(v, digits));
}

bool shows_as_recorded(const ReportSeries& s) {
  for (const auto& b : s.buckets)
    if (b.V_b_um3_as_recorded != b.V_b_um3_logged) return true;
  return false;
}

void volume_chart(std::ostream& o, const ReportSeries& s, int chart_no) {
  const std::size_t n = s.buckets.size();
  TimeAxis ax{s.bucket_start(0), s.bucket_start(n)};
  const bool as_rec = shows_as_recorded(s);
  double vmax = 0;
  for (const auto& b : s.buckets)
    vmax = std::max({vmax, static_cast<double>(b.V_b_um3_logged), static_cast<double>(b.V_b_um3_recomputed),
                     as_rec ? static_cast<double>(b.V_b_um3_as_recorded) : 0.0});
  vmax *= record::volume_quantum_m3;
  const NiceScale sc = nice_scale(vmax);
  auto y = [&](double v_m3) { return m_top + plot_h - std::clamp(v_m3 / sc.top, 0.0, 1.0) * plot_h; };

  o << "<svg class=\"chart\" id=\"chart-" << chart_no << "\" viewBox=\"0 0 " << chart_w << ' ' << chart_h
    << "\" role=\"img\" aria-labelledby=\"chart-" << chart_no << "-t\"><title id=\"chart-" << chart_no << "-t\">Base volume per bucket, "
    << esc(s.point) << "</title>";
  frame(o);
  time_ticks(o, ax);
  o << "<g class=\"vticks\">";
  const int nticks = static_cast<int>(std::lround(sc.top / sc.step));
  for (int k = 0; k <= nticks; ++k) {
    const double v = k * sc.step, yy = y(v);
    o << "<line class=\"grid\" x1=\"" << m_left << "\" x2=\"" << m_left + plot_w << "\" y1=\"" << svg_num(yy) << "\" y2=\""
      << svg_num(yy) << "\"/><text class=\"vl\" x=\"" << m_left - 6 << "\" y=\"" << svg_num(yy + 4) << "\">" << tick_text(v, sc.step)
      << "</text>";
  }
  o << "</g><text class=\"axis-title\" transform=\"translate(14 " << m_top + plot_h / 2
    << ") rotate(-90)\" text-anchor=\"middle\">V_b per bucket, m\u00b3</text>";

  // One path per line, broken where a bucket has nothing to show.
  auto line = [&](const char* cls, auto value, auto present) {
    std::ostringstream d;
    bool pen = false;
    for (std::size_t i = 0; i < n; ++i) {
      const auto& b = s.buckets[i];
      if (!present(b)) {
        pen = false;
        continue;
      }
      const double x = ax.x(static_cast<double>(s.bucket_start(i)) + static_cast<double>(s.width_s) / 2);
      d << (pen ? 'L' : 'M') << svg_num(x) << ' ' << svg_num(y(static_cast<double>(value(b)) * record::volume_quantum_m3));
      pen = true;
    }
    if (!d.str().empty()) o << "<path class=\"" << cls << "\" d=\"" << d.str() << "\"/>";
  };
  if (as_rec)
    line("v-asrec", [](const ReportBucket& b) { return b.V_b_um3_as_recorded; }, [](const ReportBucket& b) { return b.intervals > 0; });
  line("v-logged", [](const ReportBucket& b) { return b.V_b_um3_logged; }, [](const ReportBucket& b) { return b.effective > 0; });
  line("v-recomp", [](const ReportBucket& b) { return b.V_b_um3_recomputed; },
       [](const ReportBucket& b) { return b.effective > 0 && b.replayed > 0; });
  if (as_rec)
    legend(o, {{"v-asrec", "as first recorded", true}, {"v-logged", "in force (corrected)", true}, {"v-recomp", "recomputed", true}});
  else
    legend(o, {{"v-logged", "logged", true}, {"v-recomp", "recomputed", true}});
  o << "</svg>";
}

// Corrected minus as first recorded, per bucket (drawn only when they differ):
// at the scale of the volume chart a correction of a few hundred ppm would not show.
void correction_chart(std::ostream& o, const ReportSeries& s, int chart_no) {
  const std::size_t n = s.buckets.size();
  TimeAxis ax{s.bucket_start(0), s.bucket_start(n)};
  double dmin = 0, dmax = 0;
  for (const auto& b : s.buckets) {
    const double d = static_cast<double>(b.V_b_um3_logged - b.V_b_um3_as_recorded) * record::volume_quantum_m3;
    dmin = std::min(dmin, d);
    dmax = std::max(dmax, d);
  }
  const NiceScale sc = nice_scale(std::max(dmax - dmin, 1e-6));
  const double lo = std::floor(dmin / sc.step - 1e-9) * sc.step, hi = std::max(lo + sc.step, std::ceil(dmax / sc.step - 1e-9) * sc.step);
  auto y = [&](double v) { return m_top + plot_h - (std::clamp(v, lo, hi) - lo) / (hi - lo) * plot_h; };
  o << "<svg class=\"chart\" id=\"chart-" << chart_no << "\" viewBox=\"0 0 " << chart_w << ' ' << chart_h
    << "\" role=\"img\" aria-labelledby=\"chart-" << chart_no << "-t\"><title id=\"chart-" << chart_no
    << "-t\">Corrected minus as first recorded, " << esc(s.point) << "</title>";
  frame(o);
  time_ticks(o, ax);
  o << "<g class=\"vticks\">";
  const int nticks = static_cast<int>(std::lround((hi - lo) / sc.step));
  for (int k = 0; k <= nticks; ++k) {
    const double v = lo + k * sc.step, yy = y(v);
    o << "<line class=\"" << (std::fabs(v) < sc.step * 1e-6 ? "zero" : "grid") << "\" x1=\"" << m_left << "\" x2=\"" << m_left + plot_w
      << "\" y1=\"" << svg_num(yy) << "\" y2=\"" << svg_num(yy) << "\"/><text class=\"vl\" x=\"" << m_left - 6 << "\" y=\""
      << svg_num(yy + 4) << "\">" << tick_text(std::fabs(v) < sc.step * 1e-6 ? 0.0 : v, sc.step) << "</text>";
  }
  o << "</g><text class=\"axis-title\" transform=\"translate(14 " << m_top + plot_h / 2
    << ") rotate(-90)\" text-anchor=\"middle\">\u0394V_b per bucket, m\u00b3</text>";
  const double slot = plot_w / static_cast<double>(n);
  const double sw = std::clamp(slot * 0.7, 1.0, 8.0);
  std::ostringstream d;
  for (std::size_t i = 0; i < n; ++i) {
    const auto& b = s.buckets[i];
    if (b.V_b_um3_logged == b.V_b_um3_as_recorded) continue;
    const double x = ax.x(static_cast<double>(s.bucket_start(i)) + static_cast<double>(s.width_s) / 2);
    d << 'M' << svg_num(x) << ' ' << svg_num(y(0)) << 'V'
      << svg_num(y(static_cast<double>(b.V_b_um3_logged - b.V_b_um3_as_recorded) * record::volume_quantum_m3));
  }
  if (!d.str().empty()) o << "<path class=\"v-diff\" stroke-width=\"" << svg_num(sw) << "\" d=\"" << d.str() << "\"/>";
  legend(o, {{"v-diff", "corrected \u2212 as first recorded", false}});
  o << "</svg>";
}

// ---------------------------------------------------------------- page

constexpr const char* page_css = R"css(
:root{--ink:#1f2b33;--muted:#5b6b75;--rule:#d5dde2;--paper:#fbfcfc;--band:#eef3f5;--accent:#176b69;
--crit:#a4262c;--warn:#9a5b00;--notice:#3c5d7a;--ok:#2d6a3a}
*{box-sizing:border-box}
body{margin:0 auto;max-width:1180px;padding:20px 28px 40px;background:var(--paper);color:var(--ink);
font:14px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,"DejaVu Sans",sans-serif}
h1{font-size:22px;margin:0 0 6px;color:var(--accent)}
h2{font-size:17px;margin:26px 0 8px;padding-bottom:3px;border-bottom:2px solid var(--accent)}
h3{font-size:15px;margin:18px 0 6px}
code,.mono{font-family:"DejaVu Sans Mono",Menlo,Consolas,monospace;font-size:12.5px}
dd.mono,h1 code{overflow-wrap:anywhere}
.scroll{overflow-x:auto}
td.kind{white-space:nowrap}
table.findings,table.sets{font-size:12.5px}table.findings th,table.sets th{white-space:normal;vertical-align:bottom}
table.findings td,table.findings th,table.sets td,table.sets th{padding-left:6px;padding-right:6px}
table.findings tr.finding td,table.sets tr.set td{border-bottom:none;padding-bottom:1px}
table.findings tr.detail td,table.sets tr.detail td{padding-top:0;color:#34444e;font-size:12.5px}
tbody.finding-group:nth-of-type(even) td,tbody.set-group:nth-of-type(even) td{background:#f4f7f8}
tbody.finding-group,tbody.set-group{break-inside:avoid}
dl.meta{display:grid;grid-template-columns:max-content 1fr;gap:2px 16px;margin:8px 0 12px}
dl.meta dt{color:var(--muted)}dl.meta dd{margin:0}
nav{font-size:13px;margin:6px 0 10px}nav a{color:var(--accent);margin-right:14px;text-decoration:none}
.note{border:1px solid #d8b76a;border-left:6px solid #c48a00;background:#fff8e6;padding:8px 12px;margin:12px 0}
.verdict{font-size:16px;font-weight:600;padding:8px 12px;margin:12px 0;border-radius:3px}
.verdict.clean{background:#e7f3ea;color:var(--ok);border:1px solid #b8d8c0}
.verdict.found{background:#fbeaea;color:var(--crit);border:1px solid #e3b9bb}
.verdict span{font-weight:400;color:var(--ink);margin-left:10px}
table{border-collapse:collapse;margin:6px 0 10px;font-size:13px}
th,td{padding:4px 9px;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}
th{background:var(--band);font-weight:600;white-space:nowrap}
td.n,th.n{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
td.t{white-space:nowrap;font-variant-numeric:tabular-nums}
tbody:not(.finding-group):not(.set-group) tr:nth-child(even) td{background:#f4f7f8}
table.wide{width:100%}
tr.sev-critical td:first-child{border-left:5px solid var(--crit)}
tr.sev-warning td:first-child{border-left:5px solid var(--warn)}
tr.sev-notice td:first-child{border-left:5px solid var(--notice)}
@media print{tr.sev-critical td:first-child,tr.sev-warning td:first-child,tr.sev-notice td:first-child{print-color-adjust:exact;-webkit-print-color-adjust:exact}}
.sev{font-weight:600}.sev.critical{color:var(--crit)}.sev.warning{color:var(--warn)}.sev.notice{color:var(--notice)}
p.none{font-style:italic;color:var(--muted)}
p.small,figcaption{font-size:12.5px;color:var(--muted)}
figure{margin:10px 0 18px;padding:8px 10px;border:1px solid var(--rule);background:#fff;break-inside:avoid}
svg.chart{display:block;width:100%;height:auto}
svg .plot{fill:#fff;stroke:#9aa8b0;stroke-width:1}
svg .grid{stroke:#e3e9ec;stroke-width:1}
svg text{font-size:12px;fill:var(--ink);font-family:system-ui,"DejaVu Sans",sans-serif}
svg .tl{text-anchor:middle;fill:var(--muted)}svg .tl.date{font-size:11px}
svg .vl{text-anchor:end;fill:var(--muted)}
svg .axis-title{font-size:11.5px;fill:var(--muted)}
svg .dev{stroke:#3f7fa6;fill:none}svg rect.dev{fill:#3f7fa6;stroke:none}
svg .dev-over{stroke:var(--crit);fill:none}svg rect.dev-over{fill:var(--crit);stroke:none}
svg .dev-nc{stroke:#d08300;fill:none}svg rect.dev-nc{fill:#d08300;stroke:none}
svg .bar{stroke:var(--crit);stroke-width:1.5;stroke-dasharray:7 4}
svg .bar-label{fill:var(--crit);font-size:11.5px}
svg .plot-note{fill:var(--ok);font-size:12.5px}svg .plot-note.warn{fill:var(--warn)}
svg .v-logged{stroke:#1d5f8a;stroke-width:2;fill:none}
svg .v-recomp{stroke:#e08a1e;stroke-width:1.6;stroke-dasharray:5 4;fill:none}
svg .v-asrec{stroke:#9aa3a8;stroke-width:4;fill:none;opacity:.8}
svg .v-diff{stroke:#6b4fa0;fill:none}svg rect.v-diff{fill:#6b4fa0;stroke:none}
svg .zero{stroke:#7d8b93;stroke-width:1.2}
footer{margin-top:30px;padding-top:8px;border-top:1px solid var(--rule);font-size:12px;color:var(--muted)}
@media print{body{max-width:none;padding:0;background:#fff;font-size:10.5pt}nav{display:none}.scroll{overflow:visible}
h2{break-after:avoid}thead{display:table-header-group}tr{break-inside:avoid}figure{border:none;padding:0}
tbody tr:nth-child(even) td{background:none}}
)css";

// Runs after the page is laid out; it changes nothing but the body's data-render-check.
constexpr const char* render_check_js = R"js(
(function () {
  function check() {
    var body = document.body, why = [];
    var want = parseInt(body.getAttribute('data-charts') || '0', 10);
    var charts = document.querySelectorAll('svg.chart');
    if (charts.length !== want) why.push('charts ' + charts.length + ' of ' + want);
    for (var i = 0; i < charts.length; i++) {
      var r = charts[i].getBoundingClientRect();
      if (!(r.width > 0 && r.height > 0)) why.push('chart ' + (i + 1) + ' has no size');
    }
    var f = document.getElementById('findings');
    if (!f) why.push('no findings section');
    else if (!f.querySelector('table.findings, p.none')) why.push('findings neither listed nor stated empty');
    if (!document.getElementById('summary')) why.push('no summary');
    body.setAttribute('data-render-check', why.length ? 'fail: ' + why.join('; ') : 'ok');
  }
  check();
  window.addEventListener('load', check);
})();
)js";

void totals_row(std::ostream& o, const char* what, std::int64_t a, std::int64_t b) {
  o << "<tr><th>" << what << "</th><td class=\"n\">" << reg(a) << "</td><td class=\"n\">" << reg(b) << "</td><td class=\"n\">"
    << reg(b - a) << "</td><td class=\"n\">" << rel_ppm(b, a) << "</td></tr>";
}

void summary_section(std::ostream& o, const AuditResult& r, const ReportHeader& h) {
  const ReplayTotals& t = r.replay;
  o << "<section id=\"summary\"><h2>Totals</h2>"
    << "<table><tbody>"
    << "<tr><th>Intervals in the selection</th><td class=\"n\">" << t.intervals << "</td></tr>"
    << "<tr><th>Recomputed by the replay</th><td class=\"n\">" << t.replayed << "</td></tr>"
    << "<tr><th>Not recomputed</th><td class=\"n\">" << t.not_replayed << "</td></tr>"
    << "<tr><th>Missing the " << printf_num(recalculation_bar_ppm, 0) << " ppm recalculation bar</th><td class=\"n\">" << t.over_bar
    << "</td></tr>"
    << "</tbody></table>";
  o << "<h3>Logged against recomputed</h3><p class=\"small\">Over the " << t.replayed
    << " recomputed intervals (records that a correction replaces are not recomputed). Base volume in m\u00b3 at the "
       "configured base conditions, energy in MJ.</p>"
    << "<table><thead><tr><th></th><th class=\"n\">logged</th><th class=\"n\">recomputed</th><th class=\"n\">difference</th>"
       "<th class=\"n\">ppm</th></tr></thead><tbody>";
  totals_row(o, "base volume, m\u00b3", t.V_b_um3_logged, t.V_b_um3_replayed);
  totals_row(o, "energy, MJ", t.E_J_logged, t.E_J_replayed);
  o << "</tbody></table>"
    << "<table><thead><tr><th>largest deviation, ppm</th><th class=\"n\">Z_f</th><th class=\"n\">Z_b</th><th class=\"n\">C</th>"
       "<th class=\"n\">V_b</th><th class=\"n\">E</th></tr></thead><tbody><tr><th>|recomputed \u2212 logged| / logged</th>"
    << "<td class=\"n\">" << ppm_text(t.max_dZ_f_ppm) << "</td><td class=\"n\">" << ppm_text(t.max_dZ_b_ppm) << "</td><td class=\"n\">"
    << ppm_text(t.max_dC_ppm) << "</td><td class=\"n\">" << ppm_text(t.max_dV_b_ppm) << "</td><td class=\"n\">"
    << ppm_text(t.max_dE_ppm) << "</td></tr></tbody></table>";

  if (r.what_if_run) {
    o << "<h3>What-if</h3><p class=\"small\">" << (h.what_if.empty() ? std::string("Recomputed with other settings") : esc(h.what_if))
      << "; " << r.what_if.replayed << " of " << r.what_if.intervals
      << " intervals recomputed. Not written to the log.</p><table><thead><tr><th></th><th class=\"n\">logged</th>"
         "<th class=\"n\">what-if</th><th class=\"n\">difference</th><th class=\"n\">ppm</th></tr></thead><tbody>";
    totals_row(o, "base volume, m\u00b3", r.what_if.V_b_um3_logged, r.what_if.V_b_um3_replayed);
    totals_row(o, "energy, MJ", r.what_if.E_J_logged, r.what_if.E_J_replayed);
    o << "</tbody></table><p class=\"small\">" << esc(r.what_if_combustion) << ".</p>";
    if (r.what_if_steps.size() > 1) {
      o << "<table><thead><tr><th>change, applied in this order</th><th class=\"n\">\u0394V_b, m\u00b3</th><th class=\"n\">\u0394E, MJ</th>"
           "</tr></thead><tbody>";
      for (const auto& st : r.what_if_steps)
        o << "<tr><th>" << esc(st.cause) << "</th><td class=\"n\">" << reg(st.V_b_um3) << "</td><td class=\"n\">" << reg(st.E_J) << "</td></tr>";
      o << "</tbody></table>";
    }
  }

  o << "<h3>The log's totals in the selection</h3>";
  if (r.corrections.empty()) {
    o << "<table><tbody><tr><th>base volume, m\u00b3</th><td class=\"n\">" << reg(r.V_b_um3) << "</td></tr><tr><th>energy, MJ</th>"
      << "<td class=\"n\">" << reg(r.E_J) << "</td></tr></tbody></table><p class=\"small\">No correction set in the selection.</p>";
  } else {
    o << "<table><thead><tr><th></th><th class=\"n\">as first recorded</th><th class=\"n\">corrected</th><th class=\"n\">difference</th>"
         "<th class=\"n\">ppm</th></tr></thead><tbody>";
    totals_row(o, "base volume, m\u00b3", r.V_b_um3_as_recorded, r.V_b_um3);
    totals_row(o, "energy, MJ", r.E_J_as_recorded, r.E_J);
    o << "</tbody></table>";
    if (std::any_of(r.corrections.begin(), r.corrections.end(), [](const CorrectionSetSummary& c) { return c.change.find("base_") != std::string::npos; }))
      o << "<p class=\"small\">A correction set here changes the base conditions: its corrected volume is stated at other base "
           "conditions than the volume as first recorded, so the volume difference is mostly that change of reference, not "
           "more or less gas. The energy does not depend on the base conditions and compares directly.</p>";
  }
  o << "</section>";

  if (!r.corrections.empty()) {
    // Each set is a tbody of two rows: its figures, then when, what and why.
    o << "<section id=\"corrections\"><h2>Correction sets</h2><div class=\"scroll\"><table class=\"sets wide\"><thead><tr>"
         "<th class=\"n\">seq</th><th>point</th><th>from</th><th>to</th><th class=\"n\">intervals</th>"
         "<th class=\"n\">V_b replaced, m\u00b3</th><th class=\"n\">V_b corrected, m\u00b3</th><th class=\"n\">\u0394V_b, m\u00b3</th>"
         "<th class=\"n\">\u0394V_b, ppm</th><th class=\"n\">\u0394E, MJ</th></tr></thead>";
    for (const auto& c : r.corrections)
      o << "<tbody class=\"set-group\"><tr class=\"set\"><td class=\"n\">" << c.seq << "</td><td>" << esc(c.point)
        << "</td><td class=\"t\">" << t_or_dash(c.from_utc_s) << "</td><td class=\"t\">" << t_or_dash(c.to_utc_s)
        << "</td><td class=\"n\">" << c.intervals << "</td><td class=\"n\">" << reg(c.V_b_um3_replaced) << "</td><td class=\"n\">"
        << reg(c.V_b_um3_corrected) << "</td><td class=\"n\">" << reg(c.V_b_um3_corrected - c.V_b_um3_replaced)
        << "</td><td class=\"n\">" << rel_ppm(c.V_b_um3_corrected, c.V_b_um3_replaced) << "</td><td class=\"n\">"
        << reg(c.E_J_corrected - c.E_J_replaced) << "</td></tr><tr class=\"detail\"><td></td><td class=\"detail\" colspan=\"9\">"
        << "written " << t_or_dash(c.created_utc_s) << "; energy " << reg(c.E_J_replaced) << " MJ replaced, " << reg(c.E_J_corrected)
        << " MJ corrected; change: " << esc(c.change) << "; reason: " << esc(c.reason) << "</td></tr></tbody>";
    o << "</table></div></section>";
  }
}

void findings_section(std::ostream& o, const AuditResult& r) {
  o << "<section id=\"findings\"><h2>Findings</h2>";
  if (r.findings.empty()) {
    o << "<p class=\"none\">The audit found nothing: no finding of any kind in the selection.</p></section>";
    return;
  }
  // Each finding is a tbody of two rows: its figures, then its detail across the table.
  o << "<div class=\"scroll\"><table class=\"findings wide\"><thead><tr><th class=\"n\">#</th><th>kind</th><th>severity</th>"
       "<th>point</th><th>from</th><th>to</th><th class=\"n\">intervals</th><th class=\"n\">seq</th>"
       "<th class=\"n\">V_b affected, m\u00b3</th><th class=\"n\">E affected, MJ</th><th class=\"n\">\u0394V_b, m\u00b3</th>"
       "<th class=\"n\">\u0394V_b, ppm</th><th class=\"n\">\u0394E, MJ</th><th class=\"n\">worst, ppm</th></tr></thead>";
  std::size_t no = 0;
  for (const auto& f : r.findings) {
    const std::string sev(severity_name(f.severity));
    const std::string est = f.difference_estimated ? "\u2248\u2009" : "";
    auto diff = [&](double v) { return std::isnan(v) ? std::string("not known") : est + num(v, 6); };
    o << "<tbody class=\"finding-group\"><tr class=\"finding sev-" << sev << "\"><td class=\"n\">" << ++no
      << "</td><td class=\"mono kind\">" << esc(kind_name(f.kind)) << "</td><td class=\"sev " << sev << "\">" << sev << "</td><td>"
      << (f.point.empty() ? std::string("\u2014") : esc(f.point)) << "</td><td class=\"t\">" << t_or_dash(f.from_utc_s)
      << "</td><td class=\"t\">" << t_or_dash(f.to_utc_s) << "</td><td class=\"n\">" << f.intervals << "</td><td class=\"n\">"
      << f.first_seq;
    if (f.last_seq != f.first_seq) o << "\u2013" << f.last_seq;
    o << "</td><td class=\"n\">" << num(f.V_b_affected_m3, 6) << "</td><td class=\"n\">" << num(f.E_affected_MJ, 6)
      << "</td><td class=\"n\">" << diff(f.V_b_difference_m3) << "</td><td class=\"n\">" << ppm_text(f.V_b_difference_ppm())
      << "</td><td class=\"n\">" << diff(f.E_difference_MJ) << "</td><td class=\"n\">"
      << (f.kind == Kind::calc_difference ? ppm_text(f.worst_ppm) : std::string("\u2014")) << "</td></tr><tr class=\"detail sev-"
      << sev << "\"><td></td><td class=\"detail\" colspan=\"13\">" << esc(f.detail);
    if (f.kind == Kind::alarm || f.kind == Kind::two_phase)
      o << "; " << f.alarm_time_s << " s in alarm, fault volume " << num(f.V_fault_m3, 6) << " m\u00b3 (line)";
    o << ". <em>Difference:</em> " << esc(f.difference_basis) << (f.difference_estimated ? " (an estimate)" : "") << "</td></tr></tbody>";
  }
  o << "</table></div>";
  o << "<p class=\"small\">Affected: the logged base volume and energy of the records a finding concerns. \u0394: the signed "
       "difference, recomputed or estimated minus logged (\u2248 marks an estimate; negative: the log states too much), its ppm "
       "of the affected volume. Worst: a calculation difference's largest deviation of Z_f, Z_b, C, V_b or energy.</p></section>";
}

void over_bar_section(std::ostream& o, const AuditResult& r) {
  o << "<section id=\"over-bar\"><h2>Intervals over the " << printf_num(recalculation_bar_ppm, 0) << " ppm recalculation bar</h2>";
  if (r.over_bar.empty()) {
    o << "<p class=\"none\">No recomputed interval misses the bar.</p></section>";
    return;
  }
  o << "<div class=\"scroll\"><table class=\"over-bar wide\"><thead><tr><th class=\"n\">seq</th><th>point</th><th>start</th><th>end</th>"
       "<th class=\"n\">Z_f logged</th><th class=\"n\">Z_f recomputed</th><th class=\"n\">V_b logged, m\u00b3</th>"
       "<th class=\"n\">V_b recomputed, m\u00b3</th><th class=\"n\">worst, ppm</th></tr></thead><tbody>";
  for (const auto& [iv, rp] : r.over_bar)
    o << "<tr><td class=\"n\">" << iv.seq << "</td><td>" << esc(iv.point) << "</td><td class=\"t\">" << format_time_utc(iv.start_utc_s)
      << "</td><td class=\"t\">" << format_time_utc(iv.end_utc_s) << "</td><td class=\"n\">" << num(iv.Z_f, 9) << "</td><td class=\"n\">"
      << num(rp.Z_f, 9) << "</td><td class=\"n\">" << num(iv.V_b_m3, 6) << "</td><td class=\"n\">" << num(rp.V_b_m3, 6)
      << "</td><td class=\"n\">" << ppm_text(rp.worst_ppm()) << "</td></tr>";
  o << "</tbody></table></div>";
  const auto shown = static_cast<std::int64_t>(r.over_bar.size());
  if (r.over_bar_total > shown)
    o << "<p class=\"small\">The first " << shown << " are listed; " << (r.over_bar_total - shown) << " more miss the bar.</p>";
  o << "</section>";
}

int charts_section(std::ostream& o, const ReportCollector& c) {
  o << "<section id=\"charts\"><h2>Charts</h2>";
  int chart_no = 0;
  if (c.series().empty()) o << "<p class=\"none\">No interval in the selection; nothing to chart.</p>";
  for (const auto& s : c.series()) {
    const std::string w = duration_text(s.width_s);
    o << "<h3>Point " << esc(s.point) << "</h3>";
    o << "<figure>";
    deviation_chart(o, s, ++chart_no);
    o << "<figcaption>Replay deviation of " << esc(s.point) << ": per bucket of " << w
      << ", the largest |recomputed \u2212 logged| / logged over Z_f, Z_b, C, V_b and E of the intervals recomputed ("
      << s.total.replayed << " intervals, " << s.total.over_bar << " over the " << printf_num(recalculation_bar_ppm, 0)
      << " ppm bar). Logarithmic scale from 0.0001 ppm: a deviation below it (an exact replay gives 0) is drawn as a stub on "
         "the bottom line, so one large value does not flatten the rest. Intervals that cannot be compared (one side has "
         "no figure: infinite deviation) are marked along the top and counted apart: "
      << s.total.not_comparable << ".</figcaption></figure>";
    o << "<figure>";
    volume_chart(o, s, ++chart_no);
    o << "<figcaption>Base volume of " << esc(s.point) << " per bucket of " << w
      << " (the sum of the intervals starting in it; the last bucket may be partly filled). Logged: the intervals in force; "
         "recomputed: the same intervals as the replay recomputed them (only those it could)";
    if (shows_as_recorded(s)) o << "; as first recorded: the original records, before the correction sets replaced some of them";
    o << ". An empty bucket breaks the line. Totals: logged " << reg(s.total.V_b_um3_logged) << " m\u00b3, recomputed "
      << reg(s.total.V_b_um3_recomputed) << " m\u00b3";
    if (shows_as_recorded(s)) o << ", as first recorded " << reg(s.total.V_b_um3_as_recorded) << " m\u00b3";
    o << ".</figcaption></figure>";
    if (shows_as_recorded(s)) {
      o << "<figure>";
      correction_chart(o, s, ++chart_no);
      o << "<figcaption>What the correction sets changed for " << esc(s.point) << ": per bucket of " << w
        << ", the base volume in force minus the base volume as first recorded (linear scale, m\u00b3; buckets the corrections "
           "leave alone draw nothing). In total "
        << reg(s.total.V_b_um3_logged - s.total.V_b_um3_as_recorded) << " m\u00b3 ("
        << rel_ppm(s.total.V_b_um3_logged, s.total.V_b_um3_as_recorded) << " ppm of the volume as first recorded).</figcaption></figure>";
    }
  }
  if (c.uncharted_intervals() > 0)
    o << "<p class=\"small\">Only the first " << ReportCollector::max_points << " points are charted; " << c.uncharted_intervals()
      << " intervals of further points are in the totals and findings only.</p>";
  o << "</section>";
  return chart_no;
}

// The engine versions that wrote the intervals, with their counts.
std::string written_by_html(const AuditResult& r) {
  if (r.engine_versions.empty()) return "no intervals in the selection";
  std::string o;
  for (const auto& [v, n] : r.engine_versions)
    o += (o.empty() ? "" : "; ") + esc(v) + ": " + std::to_string(n) + " interval" + (n == 1 ? "" : "s");
  return o;
}

}  // namespace

void write_html_report(std::ostream& out, const AuditResult& r, const ReportCollector& charts, const ReportHeader& h) {
  // The body is written first so that the chart count is known for <body data-charts>.
  std::ostringstream body;
  int crit = 0, warn = 0, notice = 0;
  for (const auto& f : r.findings) (f.severity == Severity::critical ? crit : f.severity == Severity::warning ? warn : notice)++;

  body << "<header><h1>Audit of interval log <code>" << esc(h.log_file) << "</code></h1><dl class=\"meta\">"
       << "<dt>log id</dt><dd class=\"mono\">" << esc(r.log_id) << "</dd>"
       << "<dt>head hash</dt><dd class=\"mono\">" << esc(r.head_hash_hex) << "</dd>"
       << "<dt>chained records</dt><dd>" << r.records << "</dd>"
       << "<dt>written by</dt><dd>" << written_by_html(r) << "</dd>"
       << "<dt>replayed by</dt><dd>" << esc(record::engine_version())
       << (written_by_another_engine(r) ? " <strong>(another engine version or revision than wrote the log: a difference may be "
                                          "due to the change)</strong>"
                                        : "")
       << "</dd>"
       << "<dt>selection</dt><dd>" << esc(h.selection.empty() ? std::string("the whole log") : h.selection) << "</dd>"
       << "<dt>tolerance</dt><dd>calc_difference beyond " << ppm_text(h.tolerance_ppm) << " ppm; the recalculation bar is "
       << printf_num(recalculation_bar_ppm, 0) << " ppm</dd>"
       << "<dt>produced</dt><dd>" << format_time_utc(h.produced_utc_s) << (h.produced_by.empty() ? "" : " by ") << esc(h.produced_by)
       << "</dd></dl>"
       << "<nav><a href=\"#summary\">Totals</a>" << (r.corrections.empty() ? "" : "<a href=\"#corrections\">Correction sets</a>")
       << "<a href=\"#findings\">Findings</a><a href=\"#over-bar\">Over the bar</a><a href=\"#charts\">Charts</a></nav></header>";
  body << "<p class=\"note\" role=\"note\"><strong>Check before use.</strong> " << esc(report_safety_note()) << "</p>";
  if (r.findings.empty())
    body << "<p class=\"verdict clean\" id=\"verdict\">Nothing found<span>" << r.replay.intervals
         << " intervals audited; the audit's exit status is 0.</span></p>";
  else if (r.counting() == 0)
    body << "<p class=\"verdict clean\" id=\"verdict\">Nothing above a notice<span>" << r.replay.intervals << " intervals audited; "
         << notice << " notice" << (notice == 1 ? "" : "s") << " listed below; the audit's exit status is 0.</span></p>";
  else
    body << "<p class=\"verdict found\" id=\"verdict\">" << r.findings.size() << " finding" << (r.findings.size() == 1 ? "" : "s")
         << "<span>" << crit << " critical, " << warn << " warning, " << notice << " notice; the audit's exit status is 1.</span></p>";
  summary_section(body, r, h);
  findings_section(body, r);
  over_bar_section(body, r);
  const int n_charts = charts_section(body, charts);
  body << "<footer>Written by zcorr audit as one self-contained file: the charts are drawn as inline SVG, nothing is loaded "
          "from anywhere else, and the page reads the same with scripts off. Times are UTC. "
       << esc(report_safety_note()) << "</footer>";

  out << "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
      << "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; style-src 'unsafe-inline'; "
         "script-src 'unsafe-inline'\">"
      << "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">"
      << "<title>zcorr audit \u2014 " << esc(h.log_file) << "</title><style>" << page_css << "</style></head>\n"
      << "<body data-render-check=\"pending\" data-charts=\"" << n_charts << "\">\n"
      << body.str() << "\n<script>" << render_check_js << "</script>\n</body></html>\n";
}

}  // namespace zcorr::audit
