// zcorr validation: the column map, which says how to read a flow computer's
// own CSV export. Our own small text format ("zcorr column map", *.zmap):
//
//   # comment (a line starting with '#', or anything after " #")
//   time             = Date/Time                # optional: the row label
//   T                = Flow Temp [degF]         # required: column [unit]
//   P                = Static Press [psig]      # required: column [unit]
//   atmospheric      = 14.4 psia                # required when P is gauge
//   component.methane = C1 [mol%]               # one line per component column,
//   component.CO2     = CO2 [mol%]              #   any accepted component name
//   analysis         = methane=0.95, ethane=0.03, nitrogen=0.02
//                                               # or one fixed analysis for every row
//   analysis_unit    = fraction                 # fraction (default) or mol%
//   normalise        = no                       # yes: scale each analysis to 1
//   Z_f              = Zf                       # reported figures to check; at least one
//   Z_b              = Zb
//   C                = CF                       # conversion factor (p_f/p_b)(T_b/T_f)(Z_b/Z_f)
//   V_f              = Uncorr Vol [m3]          # line volume, needed to check V_b
//   V_b              = Corr Vol [m3]            # base volume
//   method           = gerg2008                 # optional; the command line overrides
//   base             = us60f_14.73              # optional preset, or base_T and base_p
//   base_T           = 60 degF
//   base_p           = 14.73 psia
//   tolerance_ppm    = 50                       # optional, every quantity
//   tolerance_ppm.V_b = 200                     # optional, one quantity
//
// Keys are case-sensitive; each may appear once. Units: temperature K, degC,
// degF, degR; pressure Pa, kPa, MPa (absolute), kPag, MPag, bara, barg, psia,
// psig; volume m3, L, ft3, Mcf; a component [fraction] or [mol%] (default:
// the analysis_unit). Column names are matched exactly after trimming.
//
// Parsing throws io::InputError naming the map line, the key and the value.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>

#include "core/base_conditions.hpp"
#include "core/composition.hpp"
#include "io/composition_parse.hpp"
#include "validate/tolerance_report.hpp"

namespace zcorr::validate {

struct ColumnRef {
  std::string key;     // map key, e.g. "T" or "component.methane" (for messages)
  std::string column;  // header name in the data file
  std::string unit;    // as written in the map (may be empty where none applies)
  int map_line = 0;
};

struct ColumnMap {
  std::string source;  // file name, for messages
  std::optional<ColumnRef> time;
  ColumnRef T, P;
  std::optional<double> atmospheric_Pa;
  std::array<std::optional<ColumnRef>, max_components> component{};
  bool component_mol_percent[max_components] = {};  // per mapped component
  std::optional<Fractions<double>> analysis;       // fixed analysis (mole fractions)
  io::CompositionOptions composition{};             // normalise and sum tolerance
  std::array<std::optional<ColumnRef>, checked_count> reported{};  // Z_f, Z_b, C, V_b
  std::optional<ColumnRef> V_f;
  std::optional<std::string> method;
  std::optional<BaseConditions> base;
  std::optional<Tolerances> tolerances;  // all keys applied on top of the defaults

  [[nodiscard]] bool has_components() const noexcept;
};

[[nodiscard]] ColumnMap parse_column_map(std::string_view text, std::string_view source);
[[nodiscard]] ColumnMap load_column_map(const std::string& path);

}  // namespace zcorr::validate
