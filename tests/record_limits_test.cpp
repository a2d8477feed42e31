// Impossible numbers at the log's edges: configurations refused where they
// enter, a volume above the point's maximum flow an alarm and never a
// register, registers that saturate and say so instead of wrapping, and a
// verifier that checks stored values and the log's triggers. The gas is the
// invented test double; the limits are our own (documented in
// engine/record/config.hpp and schema/005_max_flow.sql).
#include <gtest/gtest.h>

#include <limits>
#include <regex>

#include "io/input_error.hpp"
#include "io/text.hpp"
#include "record/checked.hpp"
#include "record/interval_calc.hpp"
#include "record/verify.hpp"
#include "support/record_fixture.hpp"
#include "support/tamper.hpp"

using namespace zcorr;
using namespace zcorr::record;
using zcorr::testing::scalar;

namespace {

const std::int64_t t0 = *parse_time_utc("2026-03-02T06:00:00Z");

const std::string good_config =
    "point = LIM-1\nmethod = virial_test_gas\nbase = iso15\ninterval = 60\np_min = 1 MPa\np_max = 8 MPa\n"
    "T_min = -10 degC\nT_max = 50 degC\n";

// The message of the InputError parsing `text` throws ("" when it parses).
std::string refusal(const std::string& text) {
  try {
    (void)parse_point_config(text, "limits.conf");
  } catch (const io::InputError& e) {
    return e.what();
  }
  return "";
}

std::vector<Finding> verify(const std::filesystem::path& p) {
  Log log(p, {OpenMode::read_only});
  return verify_log(log).findings;
}

}  // namespace

TEST(ConfigLimits, ImpossibleBaseConditionsAreRefusedNamingTheField) {
  EXPECT_EQ(refusal(good_config), "");
  const std::string ranges = "point = LIM-1\nmethod = virial_test_gas\np_min = 1 MPa\np_max = 8 MPa\nT_min = -10 degC\nT_max = 50 degC\n";
  // base_p = 0 Pa once gave V_b = Inf with calc_status ok.
  const auto zero_p = refusal(ranges + "base_T = 15 degC\nbase_p = 0 Pa\n");
  EXPECT_NE(zero_p.find("base_p"), std::string::npos) << zero_p;
  EXPECT_NE(zero_p.find("10 kPa to 1 MPa"), std::string::npos) << zero_p;
  const auto hot = refusal(ranges + "base_T = 1000 K\nbase_p = 101.325 kPa\n");
  EXPECT_NE(hot.find("base_T"), std::string::npos) << hot;
  EXPECT_NE(hot.find("200 K to 400 K"), std::string::npos) << hot;
  EXPECT_NE(refusal(ranges + "base_T = 15 degC\nbase_p = 5 MPa\n").find("base_p"), std::string::npos);
  // Every preset is inside the bounds.
  for (const char* b : {"iso15", "normal0", "us60f_14.73", "us60f_14.696"})
    EXPECT_EQ(refusal(ranges + "base = " + b + "\n"), "") << b;
}

TEST(ConfigLimits, MaxFlowIsReadCheckedAndDefaulted) {
  EXPECT_EQ(parse_point_config(good_config, "c").max_flow_m3_per_h, default_max_flow_m3_per_h);
  EXPECT_EQ(parse_point_config(good_config + "max_flow = 2500 m3/h\n", "c").max_flow_m3_per_h, 2500.0);
  EXPECT_EQ(parse_point_config(good_config + "max_flow = 40\n", "c").max_flow_m3_per_h, 40.0);
  for (const char* bad : {"0", "-5 m3/h", "2e9", "lots"}) {
    const auto m = refusal(good_config + "max_flow = " + bad + "\n");
    EXPECT_NE(m.find("max_flow"), std::string::npos) << bad << ": " << m;
  }
  // A configuration that differs only in max_flow is a new configuration.
  auto a = parse_point_config(good_config, "c"), b = parse_point_config(good_config + "max_flow = 10\n", "c");
  EXPECT_EQ(a.differences(b), std::vector<std::string>{"max_flow"});
}

TEST(ConfigLimits, DewMarginIsReadCheckedAndDefaulted) {
  EXPECT_EQ(parse_point_config(good_config, "c").dew_margin_K, 5.0);
  EXPECT_EQ(parse_point_config(good_config + "dew_margin = 2.5 K\n", "c").dew_margin_K, 2.5);
  EXPECT_EQ(parse_point_config(good_config + "dew_margin = 0\n", "c").dew_margin_K, 0.0);
  for (const char* bad : {"-1", "51 K", "warm"})
    EXPECT_NE(refusal(good_config + "dew_margin = " + bad + "\n").find("dew_margin"), std::string::npos) << bad;
}

TEST(ConfigLimits, PointIdMustBeUtf8TextWithoutControlCharacters) {
  const std::string rest = "method = virial_test_gas\nbase = iso15\np_min = 1 MPa\np_max = 8 MPa\nT_min = -10 degC\nT_max = 50 degC\n";
  EXPECT_EQ(refusal("point = Zählerstrang-Ø\n" + rest), "");
  const auto m = refusal("point = ST\xff\xfe-1\n" + rest);
  EXPECT_NE(m.find("\\xff\\xfe"), std::string::npos) << m;
  EXPECT_TRUE(io::valid_utf8(m)) << m;
  EXPECT_NE(refusal(std::string("point = ST\x01-1\n") + rest).find("\\x01"), std::string::npos);
}

TEST(Messages, EchoedValuesAreOneLineCutAndEscaped) {
  const std::string huge(100000, 'x');
  const io::InputError e("--p", huge + "\nsecond line", "a pressure");
  const std::string w = e.what();
  EXPECT_EQ(w.find('\n'), std::string::npos);
  EXPECT_LT(w.size(), 400u) << w.size();
  EXPECT_NE(w.find("(100012 bytes)"), std::string::npos) << w;
  EXPECT_EQ(e.value().size(), 100012u);  // the value itself is kept whole
  EXPECT_EQ(io::printable("a\tb\r\nc\x7f"), "a\\tb\\r\\nc\\x7f");
  EXPECT_EQ(io::printable("\xc3\xa9t\xc3\xa9"), "\xc3\xa9t\xc3\xa9");        // UTF-8 kept
  EXPECT_EQ(io::printable("\xc0\xaf"), "\\xc0\\xaf");                        // overlong: not UTF-8
  EXPECT_EQ(io::printable("\xed\xa0\x80"), "\\xed\\xa0\\x80");               // a surrogate
  EXPECT_FALSE(io::valid_utf8("\xf4\x90\x80\x80"));                          // above U+10FFFF
}

TEST(Registers, SumsSaturateAndSayWhenTheyDo) {
  std::int64_t a = std::numeric_limits<std::int64_t>::max() - 5;
  EXPECT_FALSE(sat_add(a, 5));
  EXPECT_EQ(a, std::numeric_limits<std::int64_t>::max());
  EXPECT_TRUE(sat_add(a, 1));
  EXPECT_EQ(a, std::numeric_limits<std::int64_t>::max());
  std::int64_t b = std::numeric_limits<std::int64_t>::min() + 1;
  EXPECT_TRUE(sat_add(b, -2));
  EXPECT_EQ(b, std::numeric_limits<std::int64_t>::min());
  // A quantity beyond a register's range becomes the register's limit, never an undefined conversion.
  EXPECT_EQ(to_register(1e300, 1e-6), static_cast<std::int64_t>(register_limit));
  EXPECT_EQ(to_register(-1e300, 1e-6), -static_cast<std::int64_t>(register_limit));
  EXPECT_EQ(to_register(std::numeric_limits<double>::infinity(), 1e-6), static_cast<std::int64_t>(register_limit));
  EXPECT_EQ(to_register(std::numeric_limits<double>::quiet_NaN(), 1e-6), 0);
  EXPECT_EQ(to_register(12.5, 1e-6), 12500000);
}

TEST(RecorderLimits, AVolumeAboveMaxFlowIsAnAlarmAndEntersNoRegister) {
  auto cfg = zcorr::testing::test_config();
  cfg.max_flow_m3_per_h = 1000.0;  // 16.7 m3 in a 60 s interval
  auto csv = zcorr::testing::sample_csv(t0, 6 * 10);
  auto plain = csv;
  // Row 20 (file line 21) brings 1e13 m3 in 10 s: once wrapped the registers to -9.2e18.
  std::istringstream in(csv);
  std::string out, line;
  for (int i = 0; std::getline(in, line); ++i) out += (i == 20 ? std::to_string(t0 + 200) + ",5000,12,1e13" : line) + "\n";
  const auto p = zcorr::testing::temp_log("max_flow");
  const auto q = zcorr::testing::temp_log("max_flow_plain");
  RecordStats st;
  zcorr::testing::VirialTestGas gas;
  {
    Log log(p, {OpenMode::writer});
    st = zcorr::testing::record_text(log, cfg, gas, out, zcorr::testing::analysis_csv(t0));
  }
  {
    Log log(q, {OpenMode::writer});
    zcorr::testing::record_text(log, cfg, gas, plain, zcorr::testing::analysis_csv(t0));
  }
  EXPECT_EQ(st.bad_rows, 1);
  EXPECT_TRUE(verify(p).empty());
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind = 'bad_input' AND severity = 'alarm' AND input_line = 21 AND "
                             "value = 1e13 AND abs(limit_value - 1000.0 * 60 / 3600) < 1e-9"),
            1);
  const std::string iv = "FROM interval WHERE start_utc_s = " + std::to_string(t0 + 180);
  EXPECT_EQ(scalar(log.db(), "SELECT flags & " + std::to_string(iflag::bad_input | iflag::alarm) + " " + iv),
            iflag::bad_input | iflag::alarm);
  // Every register is what the recording without that row holds, less the volume of the row it replaced.
  Log other(q, {OpenMode::read_only});
  const auto total = [](const Log& l) { return scalar(l.db(), "SELECT sum(V_f_um3) FROM interval"); };
  EXPECT_GT(total(log), 0);
  EXPECT_LT(total(log), total(other));
  EXPECT_GT(total(log), total(other) - 2'000'000);  // the replaced row held about 1 m3
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE V_f_um3 < 0 OR V_b_um3 < 0 OR E_J < 0"), 0);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM qtr WHERE V_f_um3 < 0 OR E_J < 0 OR cum_V_b_um3 < 0 OR cum_E_J < 0"), 0);
}

TEST(RecorderLimits, AGapAllowsTheVolumeOfTheTimeItCovers) {
  auto cfg = zcorr::testing::test_config();
  cfg.max_flow_m3_per_h = 600.0;  // 10 m3 a minute
  // One sample an hour after the previous one, with 300 m3: 30 minutes at max_flow, inside the limit for 3600 s.
  const std::string csv = "time,p_kPa,T_degC,V_m3\n" + std::to_string(t0 + 60) + ",5000,12,5\n" + std::to_string(t0 + 3660) +
                          ",5000,12,300\n" + std::to_string(t0 + 3720) + ",5000,12,5\n";
  const auto p = zcorr::testing::temp_log("max_flow_gap");
  RecordStats st;
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    st = zcorr::testing::record_text(log, cfg, gas, csv, zcorr::testing::analysis_csv(t0));
  }
  EXPECT_EQ(st.bad_rows, 0);
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT sum(V_f_um3) FROM interval"), 310'000'000);
}

TEST(RecorderLimits, PulsesAboveMaxFlowAreRefusedToo) {
  // 1e10 m3 by pulses once made the energy register -9.2e18 J with every command clean.
  auto cfg = zcorr::testing::test_config();
  cfg.pulses = true;
  cfg.k_factor_per_m3 = 10.0;
  std::string csv = "time,p_kPa,T_degC,pulses\n";
  for (int i = 1; i <= 12; ++i) csv += std::to_string(t0 + i * 10) + ",5000,12," + (i == 4 ? "100000000000" : "30") + "\n";
  const auto p = zcorr::testing::temp_log("max_flow_pulses");
  RecordStats st;
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    st = zcorr::testing::record_text(log, cfg, gas, csv, zcorr::testing::analysis_csv(t0));
  }
  EXPECT_EQ(st.bad_rows, 1);
  EXPECT_TRUE(verify(p).empty());
  Log log(p, {OpenMode::read_only});
  EXPECT_EQ(scalar(log.db(), "SELECT sum(V_f_um3) FROM interval"), 11 * 3'000'000);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE E_J < 0"), 0);
}

TEST(RecorderLimits, RunningRegistersSaturateFlaggedAndTheLogVerifies) {
  // At the largest max_flow (1e9 m3/h) over hourly intervals, one interval
  // holds 1e9 m3, some 4e16 J: the energy register reading (int64 J, limit
  // 9.2e18) reaches its limit within ten days. It saturates, the interval says
  // so, and the verifier accepts what the recorder wrote.
  auto cfg = zcorr::testing::test_config();
  cfg.max_flow_m3_per_h = 1e9;
  cfg.interval_s = 3600;
  std::string csv = "time,p_kPa,T_degC,V_m3\n";
  for (int h = 1; h <= 14 * 24; ++h) csv += std::to_string(t0 + h * 3600) + ",5000,12,9.9e8\n";
  const auto p = zcorr::testing::temp_log("saturate");
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, cfg, gas, csv, zcorr::testing::analysis_csv(t0));
  }
  Log log(p, {OpenMode::read_only});
  EXPECT_GT(scalar(log.db(), "SELECT count(*) FROM interval WHERE flags & " + std::to_string(iflag::overflow)), 0);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM event WHERE kind = 'register_overflow'"), 1);
  EXPECT_EQ(scalar(log.db(), "SELECT count(*) FROM interval WHERE V_f_um3 < 0 OR E_J < 0"), 0);
  EXPECT_EQ(scalar(log.db(), "SELECT min(cum_E_J) >= 0 FROM qtr"), 1);
  EXPECT_EQ(scalar(log.db(), "SELECT max(cum_E_J) FROM qtr"), std::numeric_limits<std::int64_t>::max());
  const auto f = verify(p);
  for (const auto& x : f) ADD_FAILURE() << x.table << " seq " << x.seq << " " << x.kind << ": " << x.detail;
}

TEST(VerifyLimits, ANegativeRegisterCorrectlyHashedIsAnImpossibleValue) {
  auto cfg = zcorr::testing::test_config();
  const auto p = zcorr::testing::temp_log("negative_register");
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, cfg, gas, zcorr::testing::sample_csv(t0, 60), zcorr::testing::analysis_csv(t0));
  }
  std::int64_t seq = 0;
  {
    const zcorr::testing::OpenDb open(p);
    seq = scalar(open.db, "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 3");
    const zcorr::testing::TriggersAside aside(open.db);
    zcorr::testing::exec_sql(open.db, "UPDATE interval SET V_b_m3 = -V_b_m3, V_b_um3 = -V_b_um3, E_MJ = -E_MJ, E_J = -E_J WHERE seq = " +
                                          std::to_string(seq));
    zcorr::testing::resum_quantity_records(open.db);
    zcorr::testing::rehash_chain(open.db);
  }
  const auto f = verify(p);
  ASSERT_FALSE(f.empty());
  bool found = false;
  for (const auto& x : f) found |= x.seq == seq && x.kind == "impossible_value";
  EXPECT_TRUE(found);
}

TEST(VerifyLimits, AMissingTriggerIsAFinding) {
  const auto p = zcorr::testing::temp_log("missing_trigger");
  {
    Log log(p, {OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, zcorr::testing::sample_csv(t0, 60),
                                zcorr::testing::analysis_csv(t0));
  }
  EXPECT_TRUE(verify(p).empty());
  ASSERT_EQ(zcorr::testing::run_shell(p, "DROP TRIGGER interval_no_update; DROP TRIGGER qtr_no_delete", false), 0);
  const auto f = verify(p);
  ASSERT_EQ(f.size(), 2u);
  for (const auto& x : f) EXPECT_EQ(x.kind, "missing_trigger");
  EXPECT_NE(f[0].detail.find("interval_no_update"), std::string::npos) << f[0].detail;
  EXPECT_NE(f[1].detail.find("qtr_no_delete"), std::string::npos) << f[1].detail;
}
