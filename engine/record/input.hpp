// zcorr recording input: the sample CSV and the gas-analysis CSV (formats of
// our own). Both are RFC 4180 CSV with a header line; '#' lines before the
// header are comments; other columns are ignored.
//
// Sample file: one row per sub-period, in time order. The row's values are
// for the sub-period that ends at its time and began at the previous row
// (or at the start of its interval for the first row).
//   time                      end of the sub-period: 2026-03-01T06:01:00Z,
//                             "2026-03-01 06:01:00" (UTC), with an offset
//                             (+01:00), or Unix seconds
//   p_Pa | p_kPa | p_MPa | p_bar | p_psi
//                             line pressure, absolute or gauge as the
//                             point configuration says (pressure = ...)
//   T_K | T_degC | T_degF     line temperature
//   V_m3 | V_ft3 | V_L        indicated volume counted in the sub-period, or
//   pulses                    pulses counted in the sub-period (meter = pulses)
// An empty or unreadable p or T is a transmitter failure (the row's volume
// goes to the fault register); an unreadable time or volume makes the row
// a bad row, logged as an event, never dropped silently.
//
// Analysis file: one row per analysis, in time order.
//   valid_from                in force from (applied from the first interval
//                             starting at or after it)
//   sampled (optional)        when the gas was sampled
//   source (optional)         e.g. "GC-1 run 4411" (default: file:line)
//   Hs_MJ_per_m3 (optional)   gross calorific value at the point's base conditions
//   hs_ref (optional)         its reference conditions, text
//   one column per component by canonical name (methane, ...), mole fractions
#pragma once

#include <cstdint>
#include <istream>
#include <optional>
#include <string>
#include <vector>

#include "core/composition.hpp"
#include "io/composition_parse.hpp"
#include "io/csv.hpp"
#include "record/config.hpp"

namespace zcorr::record {

struct RawSample {
  std::int64_t t_utc_s = 0;
  double p_Pa = std::numeric_limits<double>::quiet_NaN();  // absolute (gauge + atm applied); NaN when unreadable
  double T_K = std::numeric_limits<double>::quiet_NaN();
  double V_ind_m3 = 0.0;
  std::int64_t pulses = 0;
  long line = 0;
  std::string problem;  // why p or T is missing (empty when both were read)
};

struct BadRow {
  long line = 0;
  std::string text;    // the row as read (truncated)
  std::string why;
  std::optional<std::int64_t> t_utc_s;
};

struct AnalysisInput {
  std::int64_t valid_from_utc_s = 0;
  std::optional<std::int64_t> sampled_utc_s;
  std::string source;
  Fractions<double> x{};
  double sum_as_given = 1.0;
  bool normalised = false;
  double Hs_MJ_per_m3 = std::numeric_limits<double>::quiet_NaN();
  std::string hs_ref;
};

class SampleReader {
 public:
  // Throws io::InputError when the header lacks a needed column.
  SampleReader(std::istream& in, std::string name, const PointConfig& cfg);
  enum class Next { sample, bad, end };
  Next next(RawSample& s, BadRow& bad);

 private:
  io::CsvReader csv_;
  std::string name_;
  PointConfig cfg_;
  std::size_t ncols_ = 0;
  int c_time_ = -1, c_p_ = -1, c_T_ = -1, c_V_ = -1;
  double p_factor_ = 1, V_factor_ = 1;
  int T_kind_ = 0;  // 0 K, 1 degC, 2 degF
  bool pulses_ = false;
  std::vector<std::string> row_;
};

struct AnalysisFile {
  std::vector<AnalysisInput> analyses;  // in file order
  std::vector<BadRow> bad;              // rows refused, with the reason
};
// Throws io::InputError when the header is unusable.
[[nodiscard]] AnalysisFile read_analyses(std::istream& in, const std::string& name, const io::CompositionOptions& opt);

}  // namespace zcorr::record
