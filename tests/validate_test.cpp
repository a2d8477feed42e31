// Validation against a flow computer: tolerance arithmetic, the column map,
// export recomputation, test points and their answers.
//
// The logic is tested with a test double (FakeMethod below): an invented
// smooth Z(T, p, x) that is not any published method. It only has to be a
// deterministic LineMethod; no value here is checked against an outside
// source. The WithGerg2008 suite at the end runs the same logic with the real
// GERG-2008 method; the CLI tests are in tests/cli/validate.tests.cmake.
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <sstream>

#include "core/units.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "validate/column_map.hpp"
#include "validate/export_check.hpp"
#include "validate/test_points.hpp"

using namespace zcorr;
using namespace zcorr::validate;

namespace {

// Invented for the tests: Z = exp(-0.02 p/MPa (300 K/T)^2 (1 + 2 (1 - x_CH4))).
class FakeMethod final : public LineMethod {
 public:
  explicit FakeMethod(MethodId id = MethodId::gerg2008) : id_(id) {}
  [[nodiscard]] MethodId id() const noexcept override { return id_; }
  Status prepare(const Fractions<double>& x) noexcept override {
    ++prepares;
    auto s = check_fractions(x);
    if (!s.ok()) return s;
    heavy_ = 1.0 + 2.0 * (1.0 - x[index(Component::methane)]);
    return s;
  }
  [[nodiscard]] StateOutput state(double T_K, double p_Pa, const EvalOptions&) const noexcept override {
    StateOutput o;
    if (!(T_K > 0.0)) { o.status = make_status(Code::invalid_temperature); return o; }
    if (T_K < refuse_below_K || T_K > 500.0 || p_Pa > 40e6) {
      o.status = make_status(Code::out_of_range);
      o.status.range = RangeClass::outside;
      return o;
    }
    const double r = 300.0 / T_K;
    o[Quantity::Z] = std::exp(-0.02 * p_Pa / 1e6 * r * r * heavy_);
    o.status.range = RangeClass::normal;
    return o;
  }
  double refuse_below_K = 0.0;
  int prepares = 0;

 private:
  MethodId id_;
  double heavy_ = 1.0;
};

std::string fmt(double v) { return io::format_number(v); }

// An export in degF, psia and mol %, written from the fake method's own
// answers, with `z_error_ppm` planted in Z_f on the rows listed.
struct ExportFixture {
  std::string csv;
  std::string map;
};

ExportFixture make_export(const std::vector<std::size_t>& planted_rows = {}, double z_error_ppm = 0.0,
                          bool plant_in_C = false) {
  FakeMethod m;
  const BaseConditions base = *find_base_preset("us60f_14.73");
  std::ostringstream out;
  out << "Timestamp,Temp F,Press psia,C1 %,C2 %,N2 %,Zf,Zb,CF,Vol m3,Std Vol m3,Note\n";
  const double tF[] = {40.0, 55.5, 61.25, 70.0, 82.0, 90.0};
  const double pPsia[] = {600.0, 750.0, 812.5, 900.0, 1000.0, 1100.0};
  const double c1[] = {95.0, 95.0, 94.0, 94.0, 93.5, 95.0};
  for (std::size_t i = 0; i < 6; ++i) {
    Fractions<double> x{};
    x[index(Component::methane)] = c1[i] * 0.01;
    x[index(Component::ethane)] = 0.03;
    x[index(Component::nitrogen)] = 1.0 - c1[i] * 0.01 - 0.03;
    const double T = units::fahrenheit_to_K(tF[i]);
    const double p = pPsia[i] * units::psi;
    EXPECT_TRUE(m.prepare(x).ok());
    const double Zf = m.state(T, p, {})[Quantity::Z];
    const double Zb = m.state(base.T_K, base.p_Pa, {})[Quantity::Z];
    const double C = correction_factors(p, T, Zf, base.p_Pa, base.T_K, Zb).C;
    const double Vf = 100.0 + 10.0 * static_cast<double>(i);
    const bool planted = std::find(planted_rows.begin(), planted_rows.end(), i + 1) != planted_rows.end();
    const double k = planted ? 1.0 + z_error_ppm * 1e-6 : 1.0;
    out << "2026-11-0" << i + 1 << " 00:00," << fmt(tF[i]) << ',' << fmt(pPsia[i]) << ',' << fmt(c1[i]) << ",3,"
        << fmt(100.0 - c1[i] - 3.0) << ',' << fmt(plant_in_C ? Zf : Zf * k) << ',' << fmt(Zb) << ','
        << fmt(plant_in_C ? C * k : C) << ',' << fmt(Vf) << ',' << fmt(C * Vf) << ",x\n";
  }
  std::string map =
      "# test export map\n"
      "time = Timestamp\n"
      "T = Temp F [degF]\n"
      "P = Press psia [psia]\n"
      "component.methane = C1 % [mol%]\n"
      "component.C2 = C2 % [mol%]\n"
      "component.N2 = N2 %   [mol%]   # nitrogen\n"
      "Z_f = Zf\n"
      "Z_b = Zb\n"
      "C = CF\n"
      "V_f = Vol m3 [m3]\n"
      "V_b = Std Vol m3 [m3]\n"
      "base = us60f_14.73\n";
  return {out.str(), map};
}

ExportReport run_export(const ExportFixture& f, FakeMethod& m, Tolerances tol = {}) {
  auto map = parse_column_map(f.map, "test.zmap");
  std::istringstream data(f.csv);
  return check_export(data, "test.csv", map, m, *map.base, tol);
}

// Asserts that `body` throws io::InputError whose message contains every part.
template <class F>
void expect_input_error(F body, std::initializer_list<const char*> parts) {
  try {
    body();
    ADD_FAILURE() << "no InputError";
  } catch (const io::InputError& e) {
    const std::string msg = e.what();
    for (const char* p : parts) EXPECT_NE(msg.find(p), std::string::npos) << "'" << p << "' not in: " << msg;
  }
}

}  // namespace

TEST(Tolerance, DeviationIsRelativeInPpmAndTheBoundIsInclusive) {
  auto c = compare_value(1.0001, 1.0, 100.0);
  ASSERT_TRUE(c.compared);
  EXPECT_NEAR(c.dev_ppm, 100.0, 1e-6);
  EXPECT_FALSE(compare_value(0.9998, 1.0, 100.0).within);  // -200 ppm
  EXPECT_NEAR(compare_value(0.9998, 1.0, 100.0).dev_ppm, -200.0, 1e-6);
  EXPECT_TRUE(compare_value(0.99995, 1.0, 50.0 + 1e-9).within);
  EXPECT_FALSE(compare_value(std::nan(""), 1.0, 50.0).compared);
  EXPECT_EQ(default_tolerance_ppm, 50.0);  // API MPMS 21.1 recalculation bar (standards notes)
}

TEST(Tolerance, SummaryGivesCountsMaximumMedianAndMean) {
  ToleranceReport rep;
  const double devs[] = {10.0, -30.0, 5.0, 80.0};
  for (std::size_t i = 0; i < 4; ++i) {
    RowResult r;
    r.row = i + 1;
    r.recomputed = true;
    r[Checked::Z_f] = compare_value(1.0 + devs[i] * 1e-6, 1.0, 50.0);
    rep.rows.push_back(r);
  }
  summarise(rep);
  const auto& s = rep[Checked::Z_f];
  EXPECT_EQ(s.compared, 4u);
  EXPECT_EQ(s.outside, 1u);
  EXPECT_NEAR(s.max_abs_ppm, 80.0, 1e-6);
  EXPECT_EQ(s.max_row, 4u);
  EXPECT_NEAR(s.median_abs_ppm, 20.0, 1e-6);  // of 5, 10, 30, 80
  EXPECT_NEAR(s.mean_ppm, 16.25, 1e-6);
  EXPECT_EQ(rep[Checked::C].compared, 0u);
  EXPECT_EQ(rep.rows_outside(), 1u);
  EXPECT_FALSE(rep.passed());
}

TEST(ColumnMap, ReadsColumnsUnitsAndOptions) {
  auto m = parse_column_map(
      "T = Flow T [degC]\nP = P g [barg]\natmospheric = 1.01325 bara\nanalysis = methane=95, ethane=3, N2=2\n"
      "analysis_unit = mol%\nZ_f = Zf\ntolerance_ppm.Z_f = 20\ntolerance_ppm = 40\nmethod = detail\n"
      "base_T = 15 degC\nbase_p = 101.325 kPa\n",
      "m");
  EXPECT_EQ(m.T.column, "Flow T");
  EXPECT_EQ(m.T.unit, "degC");
  EXPECT_EQ(m.P.unit, "barg");
  ASSERT_TRUE(m.analysis);
  EXPECT_NEAR((*m.analysis)[index(Component::methane)], 0.95, 1e-15);
  ASSERT_TRUE(m.tolerances);
  EXPECT_EQ((*m.tolerances)[Checked::Z_f], 20.0);  // the per-quantity key wins whatever the order
  EXPECT_EQ((*m.tolerances)[Checked::C], 40.0);
  EXPECT_EQ(m.method.value_or(""), "detail");
  ASSERT_TRUE(m.base);
  EXPECT_DOUBLE_EQ(m.base->T_K, 288.15);
}

TEST(ColumnMap, BadMapsNameTheFieldAndValue) {
  const std::string rest = "component.methane = C1 [fraction]\nZ_f = Zf\n";
  expect_input_error([&] { (void)parse_column_map("P = p [kPa]\n" + rest, "m.zmap"); }, {"m.zmap T", "(missing)"});
  expect_input_error([&] { (void)parse_column_map("T = t [furlongs]\nP = p [kPa]\n" + rest, "m"); }, {"T unit", "furlongs"});
  expect_input_error([&] { (void)parse_column_map("T = t\nP = p [kPa]\n" + rest, "m"); }, {"line 1 T", "unit"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [psig]\n" + rest, "m"); }, {"P unit", "psig", "atmospheric"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [psi]\n" + rest, "m"); }, {"P unit", "psi"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nT = u [K]\nP = p [kPa]\n" + rest, "m"); }, {"line 2 T", "twice"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\ncolour = red\n" + rest, "m"); }, {"colour", "unknown key"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\ncomponent.xenon = Xe\nZ_f = Zf\n", "m"); },
                     {"component.xenon", "unknown component"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\ncomponent.methane = C1\n", "m"); },
                     {"no reported figure"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\nZ_f = Zf\n", "m"); }, {"composition"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\nV_b = Vb [m3]\nanalysis = methane=1\n", "m"); },
                     {"V_f"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\n" + rest + "analysis = methane=1\n", "m"); },
                     {"analysis", "not both"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\n" + rest + "base = mars\n", "m"); }, {"base", "mars"});
  expect_input_error([&] { (void)parse_column_map("T = t [K]\nP = p [kPa]\nZ_f = Zf [ppm]\nanalysis = methane=1\n", "m"); },
                     {"Z_f", "dimensionless"});
}

TEST(ExportCheck, AnExactExportIsWithinTolerance) {
  FakeMethod m;
  auto rep = run_export(make_export(), m);
  ASSERT_EQ(rep.rows.size(), 6u);
  EXPECT_TRUE(rep.passed());
  for (std::size_t k = 0; k < checked_count; ++k) {
    EXPECT_EQ(rep.summary[k].compared, 6u) << checked_names[k];
    EXPECT_LT(rep.summary[k].max_abs_ppm, 1e-6) << checked_names[k];  // round-trip of shortest decimal text
  }
  EXPECT_EQ(rep.rows[0].label, "2026-11-01 00:00");
  // The analysis changes three times in six rows (95, 94, 93.5, 95 % methane):
  // prepared only when it changes.
  EXPECT_EQ(rep.compositions, 4u);
  EXPECT_EQ(m.prepares, 4);
}

TEST(ExportCheck, APlantedZErrorIsFlaggedOnThoseRowsOnly) {
  FakeMethod m;
  auto rep = run_export(make_export({2, 5}, 200.0), m);  // 0.02 % in Z_f
  EXPECT_FALSE(rep.passed());
  EXPECT_EQ(rep.rows_outside(), 2u);
  for (const auto& r : rep.rows) {
    const bool planted = r.row == 2 || r.row == 5;
    EXPECT_EQ(r.all_within(), !planted) << "row " << r.row;
    if (planted) EXPECT_NEAR(r[Checked::Z_f].dev_ppm, 200.0, 1e-3);
    // The export's C and V_b were written from the true Z, so they still agree.
    EXPECT_TRUE(r[Checked::C].within);
  }
  EXPECT_EQ(rep[Checked::Z_f].outside, 2u);
  EXPECT_NEAR(rep[Checked::Z_f].max_abs_ppm, 200.0, 1e-3);
  EXPECT_EQ(rep[Checked::Z_f].max_row, 2u);
  EXPECT_LT(rep[Checked::Z_f].median_abs_ppm, 1e-6);
  EXPECT_EQ(rep[Checked::C].outside, 0u);
  // A wider tolerance accepts it.
  Tolerances wide;
  wide[Checked::Z_f] = 250.0;
  FakeMethod m2;
  EXPECT_TRUE(run_export(make_export({2, 5}, 200.0), m2, wide).passed());
}

TEST(ExportCheck, APlantedCErrorIsFlaggedInC) {
  FakeMethod m;
  auto rep = run_export(make_export({3}, -80.0, true), m);
  EXPECT_EQ(rep[Checked::C].outside, 1u);
  EXPECT_EQ(rep[Checked::Z_f].outside, 0u);
  EXPECT_EQ(rep[Checked::C].max_row, 3u);
  EXPECT_NEAR(rep.rows[2][Checked::C].dev_ppm, -80.0, 1e-3);
}

TEST(ExportCheck, AMissingColumnIsUnusableInputNamingKeyAndColumn) {
  auto f = make_export();
  f.map += "";
  auto pos = f.map.find("C = CF");
  f.map.replace(pos, 6, "C = Conv Factor");
  FakeMethod m;
  expect_input_error([&] { (void)run_export(f, m); }, {"line 10 C", "'Conv Factor'", "no such column", "Timestamp"});
}

TEST(ExportCheck, ABadRowKeepsItsPlaceWithTheReason) {
  auto f = make_export();
  // Row 3's temperature becomes unreadable, row 4 is refused by the method.
  auto lines = io::split(f.csv, '\n');
  std::string csv;
  for (std::size_t i = 0; i < lines.size(); ++i) {
    std::string l(lines[i]);
    if (i == 3) l.replace(l.find(",61.25,"), 7, ",warm,");
    if (i == 4) l.replace(l.find(",70,"), 4, ",-500,");
    if (!l.empty()) csv += l + "\n";
  }
  f.csv = csv;
  FakeMethod m;
  auto rep = run_export(f, m);
  ASSERT_EQ(rep.rows.size(), 6u);
  EXPECT_FALSE(rep.rows[2].recomputed);
  EXPECT_NE(rep.rows[2].problem.find("row 3 (line 4) Temp F"), std::string::npos) << rep.rows[2].problem;
  EXPECT_NE(rep.rows[2].problem.find("warm"), std::string::npos) << rep.rows[2].problem;
  EXPECT_FALSE(rep.rows[3].recomputed);  // -500 degF is below absolute zero
  EXPECT_EQ(rep.not_recomputed, 2u);
  EXPECT_FALSE(rep.passed());
  EXPECT_TRUE(rep.rows[4].recomputed);
}

TEST(ExportCheck, AStateTheMethodRefusesIsReportedNotGuessed) {
  FakeMethod m;
  m.refuse_below_K = 280.0;  // 40 degF = 277.6 K is refused
  auto rep = run_export(make_export(), m);
  EXPECT_FALSE(rep.rows[0].recomputed);
  EXPECT_NE(rep.rows[0].problem.find("out_of_range"), std::string::npos) << rep.rows[0].problem;
  EXPECT_FALSE(rep.rows[0][Checked::Z_f].compared);
  EXPECT_EQ(rep.not_recomputed, 1u);
}

TEST(ExportCheck, AFixedAnalysisAndGaugePressure) {
  FakeMethod m;
  const double atm = 14.4 * units::psi;
  const BaseConditions base = *find_base_preset("iso15");
  Fractions<double> x{};
  x[index(Component::methane)] = 0.95;
  x[index(Component::ethane)] = 0.05;
  ASSERT_TRUE(m.prepare(x).ok());
  const double T = 283.15, p = 700.0 * units::psi + atm;
  const double Zf = m.state(T, p, {})[Quantity::Z];
  std::string csv = "t,T,P,Z\n1,10," + fmt(700.0) + "," + fmt(Zf) + "\n";
  auto map = parse_column_map("time = t\nT = T [degC]\nP = P [psig]\natmospheric = 14.4 psia\nanalysis = methane=0.95,ethane=0.05\nZ_f = Z\n", "m");
  std::istringstream in(csv);
  auto rep = check_export(in, "x", map, m, base, {});
  ASSERT_EQ(rep.rows.size(), 1u);
  EXPECT_TRUE(rep.passed());
  EXPECT_LT(std::abs(rep.rows[0][Checked::Z_f].dev_ppm), 1e-6);
}

TEST(ExportCheck, EmptyOrHeaderOnlyDataIsUnusable) {
  auto map = parse_column_map("T = T [K]\nP = P [kPa]\nanalysis = methane=1\nZ_f = Z\n", "m");
  FakeMethod m;
  std::istringstream empty("");
  expect_input_error([&] { (void)check_export(empty, "e.csv", map, m, base_presets[0], {}); }, {"e.csv", "empty"});
  std::istringstream head("T,P,Z\n");
  expect_input_error([&] { (void)check_export(head, "h.csv", map, m, base_presets[0], {}); }, {"no data rows"});
}

TEST(TestPoints, EachPointHasAReasonAndTheMethodsAnswers) {
  FakeMethod m;
  const auto base = *find_base_preset("iso15");
  auto set = generate_points(m, base);
  ASSERT_EQ(set.points.size(), 21u);  // 16 inside the pipeline box, 5 beyond it (the test double takes the GERG-2008 box)
  EXPECT_TRUE(set.skipped.empty());
  bool have_wide = false, have_crit = false;
  for (const auto& p : set.points) {
    EXPECT_FALSE(p.why.empty()) << p.id;
    // No commas or quotes in the text fields: the points file splits on commas with the simplest tools.
    EXPECT_EQ(p.why.find_first_of(",\""), std::string::npos) << p.id;
    EXPECT_EQ(p.gas.find_first_of(",\""), std::string::npos) << p.id;
    EXPECT_FALSE(p.gas_source.empty()) << p.id;
    EXPECT_GT(p.Z_f, 0.0);
    EXPECT_TRUE(check_fractions(p.x).ok()) << p.id;
    // The expected answers are the method's own.
    ASSERT_TRUE(m.prepare(p.x).ok());
    EXPECT_EQ(p.Z_f, m.state(p.T_K, p.p_Pa, {})[Quantity::Z]) << p.id;
    EXPECT_EQ(p.Z_b, m.state(base.T_K, base.p_Pa, {})[Quantity::Z]) << p.id;
    EXPECT_NEAR(p.C, (p.p_Pa / base.p_Pa) * (base.T_K / p.T_K) * (p.Z_b / p.Z_f), 1e-14 * p.C) << p.id;
    if (p.id == "base-01") {
      EXPECT_EQ(p.Z_f, p.Z_b);
      EXPECT_NEAR(p.C, 1.0, 1e-15);
    }
    have_wide |= p.id.rfind("wide-", 0) == 0;
    have_crit |= p.id.rfind("crit-", 0) == 0;
  }
  EXPECT_TRUE(have_wide);
  EXPECT_TRUE(have_crit);
}

TEST(TestPoints, TheDetailSetStaysInsideTheIsoBox) {
  FakeMethod m(MethodId::detail);
  auto set = generate_points(m, base_presets[0]);
  EXPECT_EQ(set.points.size(), 16u);  // no wide-* points
  for (const auto& p : set.points) {
    EXPECT_GE(p.T_K, 263.15 - 1e-9) << p.id;
    EXPECT_LE(p.T_K, 338.15 + 1e-9) << p.id;
    EXPECT_LE(p.p_Pa, 12e6) << p.id;
  }
}

TEST(TestPoints, RefusedPointsAreSkippedWithTheirStatus) {
  FakeMethod m;
  m.refuse_below_K = 200.0;
  auto set = generate_points(m, base_presets[0]);
  ASSERT_EQ(set.skipped.size(), 2u);  // wide-01 (195 K) and wide-02 (150 K)
  EXPECT_EQ(set.skipped[0].id, "wide-01");
  EXPECT_EQ(set.skipped[0].status.code, Code::out_of_range);
  for (const auto& p : set.points) EXPECT_GE(p.T_K, 200.0);
}

TEST(TestPoints, GrossMethodsAreRefused) {
  FakeMethod m(MethodId::sgerg88);
  EXPECT_THROW((void)generate_points(m, base_presets[0]), std::invalid_argument);
}

namespace {
// Writes a points file, then fills the reported columns: `fill(row, Z_f, Z_b, C)` returns the
// three reported cells of a data row.
std::string answered(const PointSet& set,
                     const std::function<std::array<std::string, 3>(std::size_t, const std::vector<std::string>&,
                                                                    const std::map<std::string, std::size_t>&)>& fill) {
  std::ostringstream out;
  write_points_csv(out, set, {});
  std::istringstream in(out.str());
  std::string line, result;
  std::map<std::string, std::size_t> col;
  std::size_t n = 0;
  while (std::getline(in, line)) {
    if (line.rfind("#", 0) == 0) { result += line + "\n"; continue; }
    std::istringstream one(line);
    io::CsvReader r(one);
    std::vector<std::string> f;
    r.next(f);
    if (col.empty()) {
      for (std::size_t i = 0; i < f.size(); ++i) col[f[i]] = i;
    } else {
      auto cells = fill(++n, f, col);
      f[col.at("Z_f_reported")] = cells[0];
      f[col.at("Z_b_reported")] = cells[1];
      f[col.at("C_reported")] = cells[2];
    }
    std::ostringstream o;
    io::write_csv_row(o, f);
    result += o.str();
  }
  return result;
}
}  // namespace

TEST(Answers, CorrectAnswersPassAndAWrongOneIsNamed) {
  FakeMethod m;
  auto set = generate_points(m, *find_base_preset("us60f_14.73"));
  auto provider = [&m](MethodId id) -> LineMethod* { return id == MethodId::gerg2008 ? &m : nullptr; };
  // A flow computer showing Z to 6 decimals and C to 7: within 50 ppm.
  auto good = answered(set, [](std::size_t, const std::vector<std::string>& f, const std::map<std::string, std::size_t>& c) {
    auto round_to = [](const std::string& s, int d) {
      const double v = std::stod(s), k = std::pow(10.0, d);
      return io::format_number(std::round(v * k) / k);
    };
    return std::array<std::string, 3>{round_to(f[c.at("Z_f_expected")], 6), round_to(f[c.at("Z_b_expected")], 6),
                                      round_to(f[c.at("C_expected")], 7)};
  });
  std::istringstream in(good);
  auto rep = compare_answers(in, "good.csv", {}, provider);
  EXPECT_TRUE(rep.passed());
  EXPECT_TRUE(rep.expected_checked);
  EXPECT_EQ(rep[Checked::Z_f].compared, set.points.size());
  EXPECT_EQ(rep[Checked::V_b].compared, 0u);

  // Point 3 answered with Z_f 0.02 % high.
  auto bad = answered(set, [](std::size_t n, const std::vector<std::string>& f, const std::map<std::string, std::size_t>& c) {
    double z = std::stod(f[c.at("Z_f_expected")]);
    if (n == 3) z *= 1.0002;
    return std::array<std::string, 3>{io::format_number(z), "", ""};
  });
  std::istringstream in2(bad);
  auto rep2 = compare_answers(in2, "bad.csv", {}, provider);
  EXPECT_FALSE(rep2.passed());
  ASSERT_EQ(rep2.rows_outside(), 1u);
  EXPECT_FALSE(rep2.rows[2].all_within());
  EXPECT_EQ(rep2.rows[2].label, set.points[2].id);
  EXPECT_NEAR(rep2.rows[2][Checked::Z_f].dev_ppm, 200.0, 0.01);
  EXPECT_EQ(rep2[Checked::Z_b].compared, 0u);  // left empty: not compared
}

TEST(Answers, UnansweredOrAlteredPointsDoNotPass) {
  FakeMethod m;
  auto set = generate_points(m, base_presets[0]);
  auto provider = [&m](MethodId) -> LineMethod* { return &m; };
  auto partly = answered(set, [](std::size_t n, const std::vector<std::string>& f, const std::map<std::string, std::size_t>& c) {
    return std::array<std::string, 3>{n == 1 ? std::string() : f[c.at("Z_f_expected")], "", ""};
  });
  std::istringstream in(partly);
  auto rep = compare_answers(in, "p.csv", {}, provider);
  EXPECT_EQ(rep.unanswered, 1u);
  EXPECT_EQ(rep.rows_outside(), 0u);
  EXPECT_FALSE(rep.passed());

  // Someone edits an expected value to match the flow computer: refused.
  auto altered = answered(set, [](std::size_t, const std::vector<std::string>& f, const std::map<std::string, std::size_t>& c) {
    return std::array<std::string, 3>{f[c.at("Z_f_expected")], "", ""};
  });
  auto pos = altered.find(",pipe-02,");
  (void)pos;
  // Replace the Z_f_expected of the first data row by a different number.
  std::istringstream scan(altered);
  std::string line, edited;
  bool header_seen = false, done = false;
  std::map<std::string, std::size_t> col;
  while (std::getline(scan, line)) {
    if (line.rfind("#", 0) != 0 && !done) {
      std::istringstream one(line);
      io::CsvReader r(one);
      std::vector<std::string> f;
      r.next(f);
      if (!header_seen) {
        header_seen = true;
        for (std::size_t i = 0; i < f.size(); ++i) col[f[i]] = i;
      } else {
        f[col.at("Z_f_expected")] = "0.5";
        f[col.at("Z_f_reported")] = "0.5";
        std::ostringstream o;
        io::write_csv_row(o, f);
        line = o.str();
        line.pop_back();
        done = true;
      }
    }
    edited += line + "\n";
  }
  std::istringstream in2(edited);
  auto rep2 = compare_answers(in2, "a.csv", {}, provider);
  EXPECT_FALSE(rep2.rows[0].recomputed);
  EXPECT_NE(rep2.rows[0].problem.find("Z_f_expected"), std::string::npos) << rep2.rows[0].problem;
  EXPECT_NE(rep2.rows[0].problem.find("altered"), std::string::npos);
  EXPECT_FALSE(rep2.passed());
}

TEST(Answers, AFileWithoutTheColumnsIsUnusable) {
  std::istringstream in("point,T_K\nx,300\n");
  expect_input_error([&] { (void)compare_answers(in, "f.csv", {}, nullptr); }, {"f.csv header", "'method'", "missing"});
}

// With the real GERG-2008 method (engine/methods/gerg2008.hpp through the registry).
namespace {
std::unique_ptr<LineMethod> gerg() { return make_line_method(MethodId::gerg2008); }
}  // namespace

TEST(WithGerg2008, EveryPlannedPointIsInsideTheNormalRange) {
  auto m = gerg();
  ASSERT_NE(m, nullptr);
  auto set = generate_points(*m, *find_base_preset("iso15"));
  for (const auto& s : set.skipped) ADD_FAILURE() << s.id << " skipped: " << status_brief(s.status);
  EXPECT_EQ(set.points.size(), 21u);
  for (const auto& p : set.points) {
    EXPECT_TRUE(p.status.ok()) << p.id;
    EXPECT_NE(p.status.range, RangeClass::outside) << p.id;
    EXPECT_GT(p.Z_f, 0.3) << p.id;
    EXPECT_LT(p.Z_f, 1.2) << p.id;
  }
}

TEST(WithGerg2008, TheCommittedExactExportValidatesAndThePlantedOneDoesNot) {
  // tests/cli/data/validate: made by zcorr itself (README.md there).
  const std::string dir = std::string(ZCORR_SOURCE_DIR) + "/tests/cli/data/validate/";
  const auto map = load_column_map(dir + "export.zmap");
  ASSERT_TRUE(map.base);
  for (const char* name : {"exact_export.csv", "planted_export.csv"}) {
    auto m = gerg();
    ASSERT_NE(m, nullptr);
    std::ifstream in(dir + name);
    ASSERT_TRUE(in) << name;
    auto rep = check_export(in, name, map, *m, *map.base, {});
    ASSERT_EQ(rep.rows.size(), 24u);
    EXPECT_EQ(rep.not_recomputed, 0u);
    EXPECT_EQ(rep.compositions, 2u);
    if (std::string(name) == "exact_export.csv") {
      EXPECT_TRUE(rep.passed());
      EXPECT_LT(rep[Checked::Z_f].max_abs_ppm, 1e-3);
      EXPECT_LT(rep[Checked::C].max_abs_ppm, 1e-3);
    } else {
      EXPECT_FALSE(rep.passed());
      EXPECT_EQ(rep.rows_outside(), 3u);
      for (std::size_t row : {4u, 9u, 17u}) {
        EXPECT_FALSE(rep.rows[row - 1].all_within()) << row;
        EXPECT_NEAR(rep.rows[row - 1][Checked::Z_f].dev_ppm, 200.0, 1e-3) << row;
      }
    }
  }
}

TEST(WithGerg2008, PointsAnsweredExactlyPass) {
  auto m = gerg();
  ASSERT_NE(m, nullptr);
  auto set = generate_points(*m, *find_base_preset("us60f_14.73"));
  auto provider = [&m](MethodId id) -> LineMethod* { return id == MethodId::gerg2008 ? m.get() : nullptr; };
  auto file = answered(set, [](std::size_t, const std::vector<std::string>& f, const std::map<std::string, std::size_t>& c) {
    return std::array<std::string, 3>{f[c.at("Z_f_expected")], f[c.at("Z_b_expected")], f[c.at("C_expected")]};
  });
  std::istringstream in(file);
  auto rep = compare_answers(in, "g.csv", {}, provider);
  EXPECT_TRUE(rep.passed());
  EXPECT_EQ(rep.not_recomputed, 0u);  // the expected values written to 10 digits survive the recomputation check
}
