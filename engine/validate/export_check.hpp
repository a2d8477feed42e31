// zcorr validation: recompute a flow computer's own CSV export and compare.
//
// For each data row, with the column map (column_map.hpp):
//   Z_f = method.state(T, P) on the row's analysis (or the map's fixed one),
//   Z_b = method.state(T_b, p_b) on the same analysis,
//   C   = correction_factors(P, T, Z_f, p_b, T_b, Z_b).C   (core/base_conditions.hpp),
//   V_b = C * V_f,
// and each reported figure that the map names is compared with its
// recomputed value (tolerance_report.hpp). No physics of its own: every
// number comes from the LineMethod and the core correction.
//
// A volume in an export is usually integrated over the interval from live
// readings, while the export's T and P are averages: recomputing V_b from
// averages need not reproduce it within 50 ppm (see the standards notes on
// API 21.1 averaging). Give V_b its own tolerance (tolerance_ppm.V_b) when
// that applies.
//
// Unusable input (no header, a mapped column missing from the header, a
// column named twice) throws io::InputError naming the map key and column.
// A row that cannot be read or computed keeps its place in the report with
// the reason, and makes the report fail.
#pragma once

#include <istream>
#include <string_view>

#include "core/base_conditions.hpp"
#include "eval/line_method.hpp"
#include "validate/column_map.hpp"
#include "validate/tolerance_report.hpp"

namespace zcorr::validate {

struct ExportReport : ToleranceReport {
  MethodId method{};
  BaseConditions base{};
  std::size_t compositions = 0;  // distinct analyses met (each prepared once)
};

// Reads only the header and checks that every mapped column is there (throws
// io::InputError as check_export would), so that a bad map is reported before
// a method is built.
void check_header(std::istream& data, std::string_view data_name, const ColumnMap& map);

// `method` must not be prepared by the caller; it is prepared for each analysis.
[[nodiscard]] ExportReport check_export(std::istream& data, std::string_view data_name, const ColumnMap& map,
                                        LineMethod& method, const BaseConditions& base, const Tolerances& tolerances,
                                        const EvalOptions& eval = {});

// Short text of a status: "ok", "out_of_range;range=outside", ...
[[nodiscard]] std::string status_brief(const Status& s);

}  // namespace zcorr::validate
