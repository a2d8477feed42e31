// zcorr validation: test points for a flow computer, and the answers that
// come back.
//
// generate_points() lays out states across a method's range — pipeline gases
// at ordinary line conditions, a state equal to the base conditions, the
// corners of the range, the region where Z is smallest and most sensitive
// (nearest the mixture's critical region), high-pressure corners — each with
// a label saying why it is there, and computes the expected Z_f, Z_b and C
// for the stated base conditions with the method itself. A point the method
// refuses (status not ok) is left out and listed in `skipped`; no point is
// written without an expected answer.
//
// The points file (CSV, our own layout, "zcorr test points 1"):
//   '#' comment lines (method, base, how to use the file), then a header:
//   point, why, gas, method, base_T_K, base_P_kPa, T_K, T_degC, T_degF,
//   P_kPa, P_MPa, P_psia (absolute), <component>_mol_pct for every component
//   used, status (the method's status of the line state), Z_f_expected, Z_b_expected, C_expected, Z_f_reported,
//   Z_b_reported, C_reported (empty, for the technician to fill in).
// Columns are found by name, so a spreadsheet may reorder them or add others.
//
// compare_answers() reads such a file back. The expected columns are checked
// against a fresh recomputation when a method is given (a file edited by hand
// or made by another version is refused row by row), then every reported
// figure is compared with its expected one.
#pragma once

#include <functional>
#include <istream>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include "core/base_conditions.hpp"
#include "eval/line_method.hpp"
#include "validate/tolerance_report.hpp"

namespace zcorr::validate {

struct TestPoint {
  std::string id;   // stable, e.g. "pipe-03"
  std::string why;  // one line without commas (the simplest CSV tools can split the file): why the point is there
  std::string gas;  // name of the analysis (with its source in gas_source)
  std::string_view gas_source;
  Fractions<double> x{};
  double T_K = 0.0;
  double p_Pa = 0.0;
  double Z_f = 0.0, Z_b = 0.0, C = 0.0;
  Status status{};
};

struct SkippedPoint {
  std::string id, why;
  Status status{};
};

struct PointSet {
  MethodId method{};
  BaseConditions base{};
  std::vector<TestPoint> points;
  std::vector<SkippedPoint> skipped;
  std::string range_note;  // the range the points span, with its source
};

// Throws std::invalid_argument for a method that takes no detailed analysis
// (sgerg88, gross1, gross2, iso6976).
[[nodiscard]] PointSet generate_points(LineMethod& method, const BaseConditions& base, const EvalOptions& eval = {});

void write_points_csv(std::ostream& out, const PointSet& set, const Tolerances& tolerances);

struct AnswerReport : ToleranceReport {
  bool expected_checked = false;  // the expected columns were recomputed
};

// Gives the method named in a row (nullptr when this build lacks it). The
// method is prepared by compare_answers.
using MethodProvider = std::function<LineMethod*(MethodId)>;

// Reads a points file with reported columns filled in. With a provider, each
// row's expected values are recomputed first (a row whose method is not
// available, or whose expected values differ from the recomputation by more
// than 0.05 ppm, is refused); without one, the file's expected values are
// taken as they are. Throws io::InputError for unusable input (missing
// column, empty file, no data rows).
[[nodiscard]] AnswerReport compare_answers(std::istream& in, std::string_view name, const Tolerances& tolerances,
                                           const MethodProvider& provider, const EvalOptions& eval = {});

}  // namespace zcorr::validate
