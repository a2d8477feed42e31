// Recording end to end: alarms and events, bad input rows, resuming on
// overlapping input, configuration changes, pulses, and a process killed
// with SIGKILL in the middle of a recording. The gas is the invented test
// double; the checks are of the log's consistency and completeness.
#include <gtest/gtest.h>

#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <chrono>
#include <random>
#include <thread>

#include "methods/iso6976.hpp"
#include "record/verify.hpp"
#include "support/record_fixture.hpp"

using namespace zcorr;
using namespace zcorr::record;
using zcorr::testing::scalar;

namespace {

const std::int64_t t0 = *parse_time_utc("2026-03-02T06:00:00Z");

void expect_clean(const std::filesystem::path& p) {
  Log log(p, {OpenMode::read_only});
  auto r = verify_log(log);
  for (const auto& f : r.findings) ADD_FAILURE() << f.table << " seq " << f.seq << " " << f.kind << ": " << f.detail;
}

std::string with_rows(std::string csv, const std::vector<std::pair<std::size_t, std::string>>& replace) {
  // Replaces data rows (1-based after the header) by the given text.
  std::vector<std::string> lines;
  std::istringstream in(csv);
  for (std::string l; std::getline(in, l);) lines.push_back(l);
  for (const auto& [i, text] : replace) lines.at(i) = text;
  std::string out;
  for (const auto& l : lines) out += l + "\n";
  return out;
}

}  // namespace

TEST(Recorder, TransmitterSpikeRaisesAnAlarmAndStopsTheConvertedRegister) {
  auto p = zcorr::testing::temp_log("spike");
  auto csv = zcorr::testing::sample_csv(t0, 60);
  csv = with_rows(csv, {{20, std::to_string(t0 + 200) + ",9500,12,1.0"}, {21, std::to_string(t0 + 210) + ",9400,12,1.0"}});
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0));
  }
  expect_clean(p);
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='alarm_begin' AND input_line=21 AND value=9.5e6 AND limit_value=8e6"), 1);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='alarm_end' AND input_line=23"), 1);
  // The interval from t0+180 holds the two spiked rows: 2 m3 in the fault register.
  EXPECT_EQ(scalar(log.db(), "SELECT V_fault_um3 FROM interval WHERE start_utc_s=" + std::to_string(t0 + 180)), 2000000);
  EXPECT_EQ(scalar(log.db(), "SELECT flags & " + std::to_string(iflag::alarm | iflag::p_out_of_range) +
                                 " FROM interval WHERE start_utc_s=" + std::to_string(t0 + 180)),
            iflag::alarm | iflag::p_out_of_range);
  EXPECT_EQ(scalar(log.db(), "SELECT alarm_time_s FROM interval WHERE start_utc_s=" + std::to_string(t0 + 180)), 20);
  EXPECT_EQ(scalar(log.db(), "SELECT sum(V_fault_um3) FROM interval"), 2000000);
}

TEST(Recorder, BadRowsAreLoggedAsEventsNeverDropped) {
  auto p = zcorr::testing::temp_log("bad_rows");
  auto csv = zcorr::testing::sample_csv(t0, 60);
  csv = with_rows(csv, {{5, "garbage"},
                        {10, "not-a-time,5000,12,1.0"},
                        {15, std::to_string(t0 + 150) + ",5000,12,lots"},
                        {25, std::to_string(t0 + 250) + ",,12,1.5"}});
  RecordStats st;
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    st = zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0));
  }
  EXPECT_EQ(st.bad_rows, 3);
  EXPECT_EQ(st.rows, 60);
  expect_clean(p);
  Log log(p, {OpenMode::read_only});
  // Lines of the file: the header is line 1, data row i is line i + 1.
  Stmt s(log.db(), "SELECT group_concat(input_line, ' ') FROM (SELECT input_line FROM event WHERE kind='bad_input' ORDER BY seq)");
  ASSERT_TRUE(s.step());
  EXPECT_EQ(s.text(0), "6 11 16");
  // The row with no pressure is a transmitter failure: its 1.5 m3 counts in the fault register.
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='alarm_begin' AND input_line=26 AND detail LIKE 'transmitter failure%'"), 1);
  EXPECT_EQ(scalar(log.db(), "SELECT sum(V_fault_um3) FROM interval"), 1500000);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE flags & " + std::to_string(iflag::bad_input)), 3);
}

TEST(Recorder, ResumingOnOverlappingInputEqualsOneRun) {
  const auto csv = zcorr::testing::sample_csv(t0, 6 * 60 * 5);  // 5 h of 10-s rows
  auto one = zcorr::testing::temp_log("one_run");
  {
    Log log(one, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0));
  }
  auto parts = zcorr::testing::temp_log("parts");
  std::vector<std::string> lines;
  {
    std::istringstream in(csv);
    for (std::string l; std::getline(in, l);) lines.push_back(l);
  }
  // Three runs over overlapping slices, cutting inside intervals.
  const std::vector<std::pair<std::size_t, std::size_t>> slices{{1, 700}, {650, 1333}, {1000, lines.size()}};
  for (const auto& [a, b] : slices) {
    std::string part = lines[0] + "\n";
    for (std::size_t i = a; i < b; ++i) part += lines[i] + "\n";
    Log log(parts, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, part, zcorr::testing::analysis_csv(t0));
  }
  expect_clean(parts);
  Log l1(one, {OpenMode::read_only}), l2(parts, {OpenMode::read_only});
  for (const char* q : {"SELECT count(*) FROM interval", "SELECT count(DISTINCT start_utc_s) FROM interval", "SELECT sum(V_b_um3) FROM interval",
                        "SELECT sum(E_J) FROM interval", "SELECT count(*) FROM qtr", "SELECT sum(V_b_um3) FROM qtr WHERE period='hour'",
                        "SELECT max(cum_E_J) FROM qtr", "SELECT count(*) FROM gas_analysis", "SELECT count(*) FROM point_config"})
    EXPECT_EQ(scalar(l1.db(), q), scalar(l2.db(), q)) << q;
  EXPECT_EQ(scalar(l2.db(), "SELECT count(*) FROM event WHERE kind='recording_start'"), 3);
}

TEST(Recorder, ConfigurationChangeIsARecordAnEventAndAnExtraHourlyRecord) {
  auto p = zcorr::testing::temp_log("config_change");
  const auto csv = zcorr::testing::sample_csv(t0, 6 * 60 * 2);
  std::vector<std::string> lines;
  {
    std::istringstream in(csv);
    for (std::string l; std::getline(in, l);) lines.push_back(l);
  }
  std::string a = lines[0] + "\n", b = lines[0] + "\n";
  for (std::size_t i = 1; i < lines.size(); ++i) (i <= 270 ? a : b) += lines[i] + "\n";  // change at t0 + 45 min
  auto cfg = zcorr::testing::test_config();
  zcorr::testing::VirialTestGas gas;
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::record_text(log, cfg, gas, a, zcorr::testing::analysis_csv(t0));
  }
  cfg.meter_factor = 1.002;
  cfg.note = "meter proved, factor 1.002";
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::record_text(log, cfg, gas, b, "");
  }
  expect_clean(p);
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM point_config"), 2);
  EXPECT_EQ(scalar(log.db(), "SELECT valid_from_utc_s FROM point_config ORDER BY seq DESC LIMIT 1"), t0 + 2700);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='config_change' AND instr(detail, 'changed: meter_factor note') > 0"), 1);
  // Hourly records: 06:00-06:45 (closed at the change), 06:45-07:00, 07:00-08:00.
  Stmt s(log.db(), "SELECT start_utc_s, end_utc_s FROM qtr WHERE period='hour' ORDER BY seq");
  std::vector<std::pair<std::int64_t, std::int64_t>> got;
  while (s.step()) got.emplace_back(s.i64(0) - t0, s.i64(1) - t0);
  const std::vector<std::pair<std::int64_t, std::int64_t>> want{{0, 2700}, {2700, 3600}, {3600, 7200}};
  EXPECT_EQ(got, want);
  // Intervals name the configuration in force.
  EXPECT_EQ(scalar(log.db(), "SELECT count(DISTINCT config_seq) FROM interval"), 2);
}

TEST(Recorder, PulsesWithAKFactor) {
  auto p = zcorr::testing::temp_log("pulses");
  auto cfg = zcorr::testing::test_config();
  cfg.pulses = true;
  cfg.k_factor_per_m3 = 400.0;
  std::string csv = "time,p_kPa,T_degC,pulses\n";
  for (int i = 1; i <= 12; ++i) csv += std::to_string(t0 + i * 10) + ",5000,12," + std::to_string(300 + i) + "\n";
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, cfg, gas, csv, zcorr::testing::analysis_csv(t0));
  }
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT pulses FROM interval ORDER BY seq LIMIT 1"), 6 * 300 + 21);
  EXPECT_EQ(scalar(log.db(), "SELECT V_f_um3 FROM interval ORDER BY seq LIMIT 1"), std::llround((6 * 300 + 21) / 400.0 * 1e6));
}

TEST(Recorder, KilledMidRecordingLosesNothingCommittedAndResumes) {
  // A long recording is killed with SIGKILL at random moments, then resumed on
  // the same input; the result equals an uninterrupted recording.
  const auto csv = zcorr::testing::sample_csv(t0, 6 * 60 * 24 * 6);  // 6 days of 10-s rows, 8640 intervals
  auto ref = zcorr::testing::temp_log("kill_ref");
  const auto t_start = std::chrono::steady_clock::now();
  {
    Log log(ref, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0), 5);
  }
  const auto run_ms = std::chrono::duration_cast<std::chrono::milliseconds>(std::chrono::steady_clock::now() - t_start).count();
  auto p = zcorr::testing::temp_log("killed");
  std::mt19937 rng(20261202);
  std::int64_t committed = 0;
  int kills = 0;
  for (int round = 0; round < 4; ++round) {
    const pid_t pid = ::fork();
    ASSERT_GE(pid, 0);
    if (pid == 0) {
      try {
        Log log(p, {OpenMode::writer});
        zcorr::testing::VirialTestGas gas;
        zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0), 5);
      } catch (...) {
        ::_exit(3);
      }
      ::_exit(0);
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(std::uniform_int_distribution<long>(run_ms / 20 + 1, run_ms / 3 + 2)(rng)));
    ::kill(pid, SIGKILL);
    int status = 0;
    ::waitpid(pid, &status, 0);
    if (WIFSIGNALED(status)) ++kills;
    else EXPECT_EQ(WEXITSTATUS(status), 0);
    // Nothing committed is lost, and what is there verifies. A kill before
    // the first commit (likelier on a loaded machine) leaves an empty file,
    // which the next run takes up: nothing was committed, nothing to check.
    if (committed == 0 && (std::filesystem::file_size(p) == 0 || [&] {
          try { Log probe(p, {OpenMode::read_only}); return scalar(probe.db(), "SELECT count(*) FROM log_header") <= 0; }
          catch (const std::exception&) { return true; }
        }()))
      continue;
    Log log(p, {OpenMode::read_only});
    auto r = verify_log(log);
    for (const auto& f : r.findings) ADD_FAILURE() << "after kill " << round << ": " << f.table << " seq " << f.seq << " " << f.detail;
    const auto n = scalar(log.db(), "SELECT count(*) FROM interval");
    EXPECT_GE(n, committed) << "committed intervals disappeared";
    committed = n;
  }
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0), 5);
  }
  expect_clean(p);
  Log a(ref, {OpenMode::read_only}), b(p, {OpenMode::read_only});
  for (const char* q : {"SELECT count(*) FROM interval", "SELECT count(DISTINCT start_utc_s) FROM interval", "SELECT sum(V_b_um3) FROM interval",
                        "SELECT sum(E_J) FROM interval", "SELECT sum(mass_mg) FROM interval", "SELECT count(*) FROM qtr",
                        "SELECT max(cum_V_b_um3) FROM qtr", "SELECT sum(V_b_um3) FROM qtr WHERE period='day'"})
    EXPECT_EQ(scalar(a.db(), q), scalar(b.db(), q)) << q;
  RecordProperty("kills", kills);
  std::cout << "kill test: " << kills << " kills (uninterrupted run " << run_ms << " ms), " << committed
            << " of 8640 intervals committed before the final run\n";
  EXPECT_GE(kills, 2) << "the recording finished before it could be killed; make it longer";
}

TEST(Recorder, AnalysesApplyAtIntervalBoundariesAndHsComesFromIso6976WhenMissing) {
  auto p = zcorr::testing::temp_log("analyses");
  const std::string analyses =
      "valid_from,source,methane,ethane,nitrogen,carbon_dioxide\n" + std::to_string(t0) + ",GC a,0.93,0.04,0.02,0.01\n" +
      std::to_string(t0 + 125) + ",GC b,0.92,0.05,0.02,0.01\n";  // not on a boundary: in force from t0 + 180
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, zcorr::testing::sample_csv(t0, 60), analyses);
  }
  expect_clean(p);
  Log log(p, {OpenMode::read_only});
  const auto a2 = scalar(log.db(), "SELECT seq FROM gas_analysis WHERE source='GC b'");
  EXPECT_EQ(scalar(log.db(), "SELECT min(start_utc_s) FROM interval WHERE analysis_seq=" + std::to_string(a2)), t0 + 180);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='analysis_change'"), 2);
  // Hs of the interval: ISO 6976 (this project's implementation) at 15 degC / 15 degC, 101.325 kPa.
  Fractions<double> x{};
  x[index(Component::methane)] = 0.93;
  x[index(Component::ethane)] = 0.04;
  x[index(Component::nitrogen)] = 0.02;
  x[index(Component::carbon_dioxide)] = 0.01;
  const auto props = iso6976::properties(x, iso6976::CombustionRef::t15C, iso6976::MeteringRef::t15C, 101325.0);
  Stmt s(log.db(), "SELECT Hs_MJ_per_m3, E_MJ, V_b_m3 FROM interval ORDER BY seq LIMIT 1");
  ASSERT_TRUE(s.step());
  EXPECT_DOUBLE_EQ(s.f64(0), props.Hs_MJ_per_m3);
  EXPECT_DOUBLE_EQ(s.f64(1), s.f64(2) * props.Hs_MJ_per_m3);
}

TEST(Recorder, MissingDataIsAGapEvent) {
  auto p = zcorr::testing::temp_log("gap");
  std::string csv = "time,p_kPa,T_degC,V_m3\n";
  for (int i = 1; i <= 30; ++i)
    if (i <= 12 || i > 20) csv += std::to_string(t0 + i * 10) + ",5000,12,1.0\n";  // rows 13..20 missing
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, csv, zcorr::testing::analysis_csv(t0));
  }
  expect_clean(p);
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind='gap'"), 1);
  EXPECT_EQ(scalar(log.db(), "SELECT start_utc_s FROM interval WHERE flags & " + std::to_string(iflag::gap)), t0 + 180);
  // The interval from t0 + 120 has no row at all and is not written; the one after the gap holds 4 rows.
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval"), 4);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE start_utc_s=" + std::to_string(t0 + 120)), 0);
  EXPECT_EQ(scalar(log.db(), "SELECT samples FROM interval WHERE start_utc_s=" + std::to_string(t0 + 180)), 4);
}
