// The audit's HTML report: the collector's time buckets (bounded memory,
// totals kept through every merge), and the page itself (escaped text, the
// findings rows, the charts, nothing referenced outside the file). The
// intervals fed here are synthetic (invented for the tests); the log of the
// last test is recorded with the invented test-double gas.
#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <regex>
#include <sstream>

#include "audit/report_html.hpp"
#include "support/record_fixture.hpp"

namespace zcorr {
namespace {

using audit::IntervalReplay;
using audit::LoggedInterval;
using audit::ReportCollector;

LoggedInterval interval(const std::string& point, std::int64_t start, std::int64_t V_b_um3, std::int64_t seq = 1) {
  LoggedInterval iv;
  iv.seq = seq;
  iv.point = point;
  iv.start_utc_s = start;
  iv.end_utc_s = start + 60;
  iv.V_b_um3 = V_b_um3;
  return iv;
}

IntervalReplay replayed(std::int64_t V_b_um3, double dV_b_ppm) {
  IntervalReplay r;
  r.replayed = true;
  r.V_b_um3 = V_b_um3;
  r.dZ_f_ppm = r.dZ_b_ppm = r.dC_ppm = r.dE_ppm = 0;
  r.dV_b_ppm = dV_b_ppm;
  return r;
}

std::size_t count(const std::string& s, const std::string& what) {
  std::size_t n = 0;
  for (std::size_t p = s.find(what); p != std::string::npos; p = s.find(what, p + what.size())) ++n;
  return n;
}

TEST(ReportCollector, PairsMergeExactlyWhenTheSpanOutgrowsTheBuckets) {
  ReportCollector c(4);
  const std::int64_t t0 = 1772431200;  // 2026-03-02T06:00:00Z, a multiple of 240 s
  for (int i = 0; i < 4; ++i) c.observe(interval("P", t0 + 60 * i, 1000 + i), replayed(1000 + i, 0), true);
  ASSERT_EQ(c.series().size(), 1u);
  const auto& s = c.series()[0];
  EXPECT_EQ(s.width_s, 60);
  ASSERT_EQ(s.buckets.size(), 4u);
  EXPECT_EQ(s.bucket_start(0), t0);
  // The fifth minute does not fit: pairs merge, the width doubles.
  c.observe(interval("P", t0 + 240, 1004), replayed(1004, 0), true);
  EXPECT_EQ(s.width_s, 120);
  ASSERT_EQ(s.buckets.size(), 3u);
  EXPECT_EQ(s.bucket_start(0), t0);
  EXPECT_EQ(s.buckets[0].intervals, 2);
  EXPECT_EQ(s.buckets[0].V_b_um3_logged, 1000 + 1001);
  EXPECT_EQ(s.buckets[1].V_b_um3_logged, 1002 + 1003);
  EXPECT_EQ(s.buckets[2].V_b_um3_logged, 1004);
  // A jump far ahead merges as often as needed; the empty buckets between stay empty.
  c.observe(interval("P", t0 + 60 * 100, 7), replayed(7, 0), true);
  EXPECT_LE(s.buckets.size(), 4u);
  EXPECT_EQ(s.width_s, 60 * 32);  // span 101 minutes in at most 4 buckets of 60 * 2^k s, epoch-aligned
  EXPECT_EQ(s.buckets.back().V_b_um3_logged, 7);
  std::int64_t sum = 0;
  for (const auto& b : s.buckets) sum += b.V_b_um3_logged;
  EXPECT_EQ(sum, 1000 + 1001 + 1002 + 1003 + 1004 + 7);
}

TEST(ReportCollector, LongSeriesStaysBoundedAndKeepsItsTotals) {
  constexpr std::size_t max_buckets = 500;
  ReportCollector c(max_buckets);
  const std::int64_t t0 = 1772431200;
  constexpr std::int64_t n = 200000;  // 1-minute intervals: about 139 days per point
  std::int64_t fed_logged[2] = {0, 0}, fed_recomputed[2] = {0, 0};
  std::int64_t over = 0, not_comparable = 0;
  double worst = 0;
  std::size_t largest_seen = 0;
  for (std::int64_t i = 0; i < n; ++i) {
    for (int p = 0; p < 2; ++p) {
      const std::int64_t v = 50'000'000 + (i * 7919 + p * 104729) % 3'000'000;  // invented, varying volumes (um3)
      double d = static_cast<double>((i * 31 + p) % 1000) * 1e-3;                // ppm, mostly tiny
      if (i % 9973 == 0) d = 120.0 + static_cast<double>(i % 17);                // now and then over the bar
      if (i % 50021 == 0) d = std::numeric_limits<double>::infinity();           // and a few not comparable
      const std::string point = p == 0 ? "A" : "B";
      // The log is streamed point by point; feeding the two interleaved is harder on the series lookup and equally valid.
      c.observe(interval(point, t0 + 60 * i, v, i), replayed(v + 1, d), true);
      fed_logged[p] += v;
      fed_recomputed[p] += v + 1;
      if (std::isinf(d)) {
        ++not_comparable;
      } else {
        worst = std::max(worst, d);
        if (d > audit::recalculation_bar_ppm) ++over;
      }
    }
    if (i % 997 == 0)
      for (const auto& s : c.series()) largest_seen = std::max(largest_seen, s.buckets.size());
  }
  ASSERT_EQ(c.series().size(), 2u);
  EXPECT_LE(largest_seen, max_buckets);
  std::int64_t over_sum = 0, nc_sum = 0;
  double worst_seen = 0;
  for (int p = 0; p < 2; ++p) {
    const auto& s = c.series()[static_cast<std::size_t>(p)];
    EXPECT_EQ(s.point, p == 0 ? "A" : "B");
    EXPECT_LE(s.buckets.size(), max_buckets);
    EXPECT_GT(s.buckets.size(), max_buckets / 4);  // merged no more than needed
    // The width is 60 s * 2^k and covers the whole span.
    std::int64_t w = 60;
    while (w < s.width_s) w *= 2;
    EXPECT_EQ(w, s.width_s);
    EXPECT_LE(s.bucket_start(0), t0);
    EXPECT_GT(s.bucket_start(s.buckets.size()), t0 + 60 * (n - 1));
    std::int64_t intervals = 0, logged = 0, recomputed = 0;
    for (const auto& b : s.buckets) {
      intervals += b.intervals;
      logged += b.V_b_um3_logged;
      recomputed += b.V_b_um3_recomputed;
      over_sum += b.over_bar;
      nc_sum += b.not_comparable;
      worst_seen = std::max(worst_seen, b.worst_ppm);
    }
    EXPECT_EQ(intervals, n);
    EXPECT_EQ(logged, fed_logged[p]);
    EXPECT_EQ(recomputed, fed_recomputed[p]);
    EXPECT_EQ(s.total.V_b_um3_logged, fed_logged[p]);
    EXPECT_EQ(s.total.V_b_um3_as_recorded, fed_logged[p]);  // no correction fed
  }
  EXPECT_EQ(over_sum, over);
  EXPECT_EQ(nc_sum, not_comparable);
  EXPECT_DOUBLE_EQ(worst_seen, worst);
}

TEST(ReportCollector, CorrectedOriginalsCountAsRecordedNotInForce) {
  ReportCollector c;
  const std::int64_t t = 1772431200;
  LoggedInterval original = interval("P", t, 1000, 10);
  LoggedInterval correction = interval("P", t, 1100, 20);
  correction.corrects_seq = 10;
  IntervalReplay not_replayed;
  not_replayed.why_not = "unknown method";
  IntervalReplay replaced;  // the audit does not recompute a record a correction replaces
  replaced.why_not = "replaced by a correction";
  c.observe(original, replaced, false);
  c.observe(correction, replayed(1100, 0), true);
  c.observe(interval("P", t + 60, 500, 11), not_replayed, true);
  const auto& s = c.series().at(0);
  EXPECT_EQ(s.total.intervals, 3);
  EXPECT_EQ(s.total.effective, 2);
  EXPECT_EQ(s.total.replayed, 1);
  EXPECT_EQ(s.total.V_b_um3_logged, 1100 + 500);
  EXPECT_EQ(s.total.V_b_um3_recomputed, 1100);  // the not replayed interval has no recomputed figure
  EXPECT_EQ(s.total.V_b_um3_as_recorded, 1000 + 500);
}

TEST(ReportHtml, EscapesText) {
  EXPECT_EQ(audit::html_escape("a<b>&\"c\"'d'"), "a&lt;b&gt;&amp;&quot;c&quot;&#39;d&#39;");
  EXPECT_EQ(audit::html_escape(std::string("x\x01y\tz\n", 6)), "xy\tz\n");
}

audit::AuditResult sample_result() {
  audit::AuditResult r;
  r.log_id = "log-<id>";
  r.head_hash_hex = "ab12";
  r.records = 42;
  r.replay.intervals = 3;
  r.replay.replayed = 3;
  r.replay.over_bar = 1;
  r.replay.V_b_um3_logged = 123456789;
  r.replay.V_b_um3_replayed = 123456800;
  audit::AuditFinding f;
  f.kind = audit::Kind::calc_difference;
  f.severity = audit::Severity::critical;
  f.point = "P<1>";
  f.from_utc_s = 1772431200;
  f.to_utc_s = 1772431260;
  f.intervals = 1;
  f.first_seq = 7;
  f.last_seq = 7;
  f.worst_ppm = 99.5;
  f.detail = "Z_f <changed> & \"odd\" <script>alert('x')</script>";
  r.findings.push_back(f);
  f.kind = audit::Kind::gap;
  f.severity = audit::Severity::warning;
  f.detail = "no interval recorded";
  r.findings.push_back(f);
  LoggedInterval iv = interval("P<1>", 1772431200, 1000, 7);
  r.over_bar.emplace_back(iv, replayed(1000, 99.5));
  r.over_bar_total = 1;
  return r;
}

std::string page(const audit::AuditResult& r, const ReportCollector& c) {
  audit::ReportHeader h;
  h.log_file = "station \"A\" <test>.db";
  h.produced_utc_s = 1772431200;
  h.selection = "point P<1>";
  std::ostringstream o;
  audit::write_html_report(o, r, c, h);
  return o.str();
}

TEST(ReportHtml, ContainsFindingsChartsAndNothingFromOutside) {
  ReportCollector c;
  for (int i = 0; i < 300; ++i)
    c.observe(interval("P<1>", 1772431200 + 60 * i, 1000 + i), replayed(1000 + i, i == 150 ? 99.5 : 1e-3), true);
  c.observe(interval("Q&2", 1772431200, 500), replayed(500, 0), true);
  const auto r = sample_result();
  const std::string html = page(r, c);

  EXPECT_EQ(html.rfind("<!DOCTYPE html>", 0), 0u);
  EXPECT_NE(html.find("</html>"), std::string::npos);
  // Text from the log is escaped wherever it appears.
  EXPECT_EQ(html.find("<script>alert"), std::string::npos);
  EXPECT_NE(html.find("Z_f &lt;changed&gt; &amp; &quot;odd&quot; &lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;"), std::string::npos);
  EXPECT_EQ(html.find("P<1>"), std::string::npos);
  EXPECT_EQ(html.find("Q&2"), std::string::npos);
  EXPECT_NE(html.find("Q&amp;2"), std::string::npos);
  EXPECT_NE(html.find("station &quot;A&quot; &lt;test&gt;.db"), std::string::npos);
  EXPECT_NE(html.find("log-&lt;id&gt;"), std::string::npos);
  // One script only: the render self-check.
  EXPECT_EQ(count(html, "<script"), 1u);
  // The findings rows, in order, with their figures.
  EXPECT_EQ(count(html, "<tr class=\"finding "), 2u);
  const auto calc = html.find("<tr class=\"finding sev-critical\">");
  const auto gap = html.find("<tr class=\"finding sev-warning\">");
  ASSERT_NE(calc, std::string::npos);
  ASSERT_NE(gap, std::string::npos);
  EXPECT_LT(calc, gap);
  EXPECT_NE(html.find("calc_difference", calc), std::string::npos);
  EXPECT_NE(html.find(">99.50<", calc), std::string::npos);
  EXPECT_NE(html.find("2026-03-02T06:00:00Z"), std::string::npos);
  EXPECT_NE(html.find("2 findings"), std::string::npos);
  // The interval over the bar.
  EXPECT_NE(html.find("<table class=\"over-bar wide\">"), std::string::npos);
  // Two charts per point, each a drawn SVG with the bar line, ticks and a caption naming the bucket width.
  EXPECT_NE(html.find("data-charts=\"4\""), std::string::npos);
  EXPECT_EQ(count(html, "<svg class=\"chart\""), 4u);
  EXPECT_EQ(count(html, "</svg>"), 4u);
  EXPECT_EQ(count(html, " ppm bar</text>"), 2u);
  EXPECT_EQ(count(html, "<path class=\"dev-over\""), 1u);  // only P<1> has a bucket over the bar
  EXPECT_EQ(count(html, "<path class=\"v-logged\""), 2u);
  EXPECT_NE(html.find("per bucket of 1 min"), std::string::npos);
  EXPECT_NE(html.find("time (UTC)"), std::string::npos);
  // The safety note.
  EXPECT_NE(html.find(std::string(audit::report_safety_note())), std::string::npos);
  EXPECT_NE(html.find("legal-metrology"), std::string::npos);

  // Nothing outside the file: no URL, no src, no stylesheet link, no CSS url(); href only to anchors in the page.
  EXPECT_EQ(html.find("http://"), std::string::npos);
  EXPECT_EQ(html.find("https://"), std::string::npos);
  EXPECT_EQ(html.find("src="), std::string::npos);
  EXPECT_EQ(html.find("<link"), std::string::npos);
  EXPECT_EQ(html.find("url("), std::string::npos);
  EXPECT_EQ(html.find("@import"), std::string::npos);
  EXPECT_EQ(html.find("xlink:"), std::string::npos);
  const std::regex href("href=\"([^\"]*)\"");
  std::size_t hrefs = 0;
  for (auto it = std::sregex_iterator(html.begin(), html.end(), href); it != std::sregex_iterator(); ++it, ++hrefs) {
    const std::string target = (*it)[1];
    ASSERT_FALSE(target.empty());
    EXPECT_EQ(target[0], '#') << target;
    EXPECT_NE(html.find("id=\"" + target.substr(1) + "\""), std::string::npos) << target;
  }
  EXPECT_GE(hrefs, 4u);
  EXPECT_NE(html.find("default-src 'none'"), std::string::npos);
}

TEST(ReportHtml, AnEmptyFindingListSaysSo) {
  audit::AuditResult r;
  r.replay.intervals = 0;
  const std::string html = page(r, ReportCollector{});
  EXPECT_NE(html.find("The audit found nothing"), std::string::npos);
  EXPECT_NE(html.find("Nothing found"), std::string::npos);
  EXPECT_EQ(count(html, "<tr class=\"finding "), 0u);
  EXPECT_NE(html.find("data-charts=\"0\""), std::string::npos);
  EXPECT_NE(html.find("nothing to chart"), std::string::npos);
}

TEST(ReportHtml, APointWithNothingRecomputedSaysSoInItsChart) {
  ReportCollector c;
  IntervalReplay not_replayed;
  not_replayed.why_not = "method 'x' is not available in this build";
  for (int i = 0; i < 10; ++i) c.observe(interval("P", 1772431200 + 60 * i, 1000), not_replayed, true);
  const std::string html = page(audit::AuditResult{}, c);
  EXPECT_NE(html.find("no interval of this point could be recomputed"), std::string::npos);
  EXPECT_EQ(count(html, "<path class=\"dev"), 0u);       // no deviation drawn
  EXPECT_EQ(count(html, "<path class=\"v-logged\""), 1u);  // the logged volume still is
  EXPECT_EQ(count(html, "<path class=\"v-recomp\""), 0u);
}

TEST(ReportHtml, WhatIfAndCorrectionSetsAreShownSideBySide) {
  auto r = sample_result();
  r.what_if_run = true;
  r.what_if.intervals = 3;
  r.what_if.replayed = 3;
  r.what_if.V_b_um3_logged = 3'000'000;
  r.what_if.V_b_um3_replayed = 2'999'000;
  r.V_b_um3_as_recorded = 5'000'000;
  r.V_b_um3 = 5'250'000;
  audit::CorrectionSetSummary cs;
  cs.seq = 99;
  cs.point = "P<1>";
  cs.reason = "meter factor & <typo>";
  cs.change = "base_p 101560 Pa";
  cs.V_b_um3_replaced = 1'000'000;
  cs.V_b_um3_corrected = 1'250'000;
  r.corrections.push_back(cs);

  ReportCollector c;
  const std::int64_t t = 1772431200;
  LoggedInterval orig = interval("P<1>", t, 1'000'000, 5), corr = interval("P<1>", t, 1'250'000, 99);
  corr.corrects_seq = 5;
  c.observe(orig, replayed(1'000'000, 0), false);
  c.observe(corr, replayed(1'250'000, 0), true);
  c.observe(interval("P<1>", t + 60, 4'000'000, 6), replayed(4'000'000, 0), true);

  audit::ReportHeader h;
  h.what_if = "Recomputed with base temperature 60 degF";
  std::ostringstream o;
  audit::write_html_report(o, r, c, h);
  const std::string html = o.str();
  EXPECT_NE(html.find("<h3>What-if</h3>"), std::string::npos);
  EXPECT_NE(html.find("Recomputed with base temperature 60 degF"), std::string::npos);
  EXPECT_NE(html.find(">-0.001000<"), std::string::npos);  // what-if minus logged, m3
  EXPECT_NE(html.find("<section id=\"corrections\">"), std::string::npos);
  EXPECT_NE(html.find("meter factor &amp; &lt;typo&gt;"), std::string::npos);
  EXPECT_NE(html.find(">0.250000<"), std::string::npos);  // corrected minus replaced, and corrected minus as recorded
  EXPECT_NE(html.find("as first recorded"), std::string::npos);
  // The volume chart draws the as-recorded line beside the corrected one.
  EXPECT_EQ(count(html, "<path class=\"v-asrec\""), 1u);
  // And a third chart shows the difference: +0.25 m3 in the first bucket (the only one corrected).
  EXPECT_NE(html.find("data-charts=\"3\""), std::string::npos);
  EXPECT_EQ(count(html, "<path class=\"v-diff\""), 1u);
  EXPECT_NE(html.find("In total 0.250000 m\u00b3 (50\u2009000 ppm of the volume as first recorded)"), std::string::npos);
}

// Through the real audit: the observer sees every interval, and the charted totals are the audit's own.
TEST(ReportCollector, FedByTheAuditMatchesItsTotals) {
  const std::int64_t t0 = *record::parse_time_utc("2026-03-02T06:00:00Z");
  const auto file = testing::temp_log("report_collector_audit");
  {
    record::Log log(file, {record::OpenMode::writer});
    testing::VirialTestGas gas;
    testing::record_text(log, testing::test_config(), gas, testing::sample_csv(t0, 6 * 60 * 6), testing::analysis_csv(t0));
  }
  ReportCollector c(50);
  audit::AuditOptions o;
  o.observe = c.observer();
  record::Log log(file, {record::OpenMode::read_only});
  const auto r = audit::run_audit(log, o, [](const std::string& name) -> std::unique_ptr<LineMethod> {
    if (name == "virial_test_gas") return std::make_unique<testing::VirialTestGas>();
    return nullptr;
  });
  ASSERT_EQ(c.series().size(), 1u);
  const auto& s = c.series()[0];
  EXPECT_EQ(s.point, "TEST-1");
  EXPECT_EQ(s.total.intervals, r.replay.intervals);
  EXPECT_EQ(s.total.intervals, 6 * 60);
  EXPECT_EQ(s.total.replayed, r.replay.replayed);
  EXPECT_EQ(s.total.V_b_um3_logged, r.V_b_um3);
  EXPECT_EQ(s.total.V_b_um3_recomputed, r.replay.V_b_um3_replayed);
  EXPECT_LE(s.buckets.size(), 50u);
  EXPECT_EQ(s.width_s, 480);  // 360 minutes in at most 50 buckets: 60 s * 2^3
  std::ostringstream html;
  audit::write_html_report(html, r, c, {});
  EXPECT_NE(html.str().find("The audit found nothing"), std::string::npos);
  EXPECT_NE(html.str().find("per bucket of 8 min"), std::string::npos);
}

}  // namespace
}  // namespace zcorr
