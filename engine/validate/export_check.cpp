#include "validate/export_check.hpp"

#include <cmath>
#include <limits>
#include <map>
#include <vector>

#include "core/components.hpp"
#include "io/status_text.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"

namespace zcorr::validate {
namespace {

constexpr double nan = std::numeric_limits<double>::quiet_NaN();

std::string header_list(const std::vector<std::string>& header) {
  std::string out;
  for (std::size_t i = 0; i < header.size() && i < 40; ++i) out += (i ? ", " : "") + std::string(io::trim(header[i]));
  if (header.size() > 40) out += ", ...";
  return out;
}

int find_column(const std::vector<std::string>& header, const ColumnRef& r, const ColumnMap& map) {
  int found = -1;
  for (std::size_t c = 0; c < header.size(); ++c) {
    if (io::trim(header[c]) != r.column) continue;
    if (found >= 0)
      throw io::InputError("map " + map.source + " line " + std::to_string(r.map_line) + " " + r.key, r.column,
                           "the data header has this column twice; rename one");
    found = static_cast<int>(c);
  }
  if (found < 0)
    throw io::InputError("map " + map.source + " line " + std::to_string(r.map_line) + " " + r.key, r.column,
                         "the data file has no such column (its columns: " + header_list(header) + ")");
  return found;
}

const std::string& cell(const std::vector<std::string>& row, int c) { return row[static_cast<std::size_t>(c)]; }

// "61.25" and unit "degF" -> "61.25 degF", after checking that the cell is a
// number (so that a message names the cell as written).
std::string with_unit(const std::string& text, const std::string& unit, const std::string& field) {
  const auto t = io::trim(text);
  (void)io::parse_number(t, field);
  return std::string(t) + " " + unit;
}

struct Columns {
  int T = -1, P = -1, time = -1, V_f = -1;
  std::array<int, max_components> x{};
  std::array<int, checked_count> reported{};
};

void read_header(io::CsvReader& reader, std::vector<std::string>& header, std::string_view data_name) {
  for (;;) {
    if (!reader.next(header))
      throw io::InputError("--data", std::string(data_name), "the file is empty (a header line is required)");
    if (!header.empty() && !io::trim(header[0]).empty() && io::trim(header[0]).front() == '#') continue;
    return;
  }
}

Columns resolve_columns(const std::vector<std::string>& header, const ColumnMap& map) {
  Columns c;
  c.T = find_column(header, map.T, map);
  c.P = find_column(header, map.P, map);
  c.time = map.time ? find_column(header, *map.time, map) : -1;
  c.x.fill(-1);
  for (std::size_t i = 0; i < max_components; ++i)
    if (map.component[i]) c.x[i] = find_column(header, *map.component[i], map);
  c.reported.fill(-1);
  for (std::size_t k = 0; k < checked_count; ++k)
    if (map.reported[k]) c.reported[k] = find_column(header, *map.reported[k], map);
  c.V_f = map.V_f ? find_column(header, *map.V_f, map) : -1;
  return c;
}

}  // namespace

void check_header(std::istream& data, std::string_view data_name, const ColumnMap& map) {
  io::CsvReader reader(data);
  std::vector<std::string> header;
  read_header(reader, header, data_name);
  (void)resolve_columns(header, map);
}

std::string status_brief(const Status& s) { return io::status_text(s); }

ExportReport check_export(std::istream& data, std::string_view data_name, const ColumnMap& map, LineMethod& method,
                          const BaseConditions& base, const Tolerances& tolerances, const EvalOptions& eval) {
  ExportReport rep;
  rep.method = method.id();
  rep.base = base;
  rep.tolerances = tolerances;

  io::CsvReader reader(data);
  std::vector<std::string> header, row;
  read_header(reader, header, data_name);
  const auto cols = resolve_columns(header, map);
  const int col_T = cols.T, col_P = cols.P, col_time = cols.time, col_Vf = cols.V_f;
  const auto& col_x = cols.x;
  const auto& col_rep = cols.reported;

  struct Prepared {
    Status prep;
    Status base_status;
    double Z_b;
  };
  Fractions<double> last_x{};
  bool have_last = false;
  Prepared cur{};
  std::size_t n = 0;
  while (reader.next(row)) {
    RowResult r;
    r.row = ++n;
    r.line = reader.line();
    r.label = col_time >= 0 && static_cast<std::size_t>(col_time) < row.size() ? std::string(io::trim(cell(row, col_time)))
                                                                                : "row " + std::to_string(n);
    const std::string where = "row " + std::to_string(n) + " (line " + std::to_string(r.line) + ")";
    try {
      if (row.size() != header.size())
        throw io::InputError(where, std::to_string(row.size()) + " fields", "expected " + std::to_string(header.size()));
      const std::string fT = where + " " + map.T.column, fP = where + " " + map.P.column;
      const double T = io::parse_temperature_K(with_unit(cell(row, col_T), map.T.unit, fT), fT);
      const double P = io::parse_pressure_Pa(with_unit(cell(row, col_P), map.P.unit, fP), fP, map.atmospheric_Pa);
      if (!(P > 0.0)) throw io::InputError(where + " " + map.P.column, cell(row, col_P), "the absolute pressure must be > 0");
      Fractions<double> x{};
      if (map.analysis) {
        x = *map.analysis;
      } else {
        for (std::size_t i = 0; i < max_components; ++i) {
          if (col_x[i] < 0 || io::trim(cell(row, col_x[i])).empty()) continue;
          const double v = io::parse_number(cell(row, col_x[i]), where + " " + map.component[i]->column);
          x[i] = map.component_mol_percent[i] ? v * 0.01 : v;
        }
        x = io::finish_composition(x, map.composition, where + " analysis").x;
      }
      std::array<double, checked_count> reported;
      reported.fill(nan);
      for (std::size_t k = 0; k < checked_count; ++k) {
        if (col_rep[k] < 0 || io::trim(cell(row, col_rep[k])).empty()) continue;
        const auto& text = cell(row, col_rep[k]);
        const std::string f = where + " " + map.reported[k]->column;
        reported[k] = static_cast<Checked>(k) == Checked::V_b
                          ? io::parse_volume_m3(with_unit(text, map.reported[k]->unit, f), f)
                          : io::parse_number(text, f);
      }
      double V_f = nan;
      if (col_Vf >= 0 && !io::trim(cell(row, col_Vf)).empty()) {
        const std::string f = where + " " + map.V_f->column;
        V_f = io::parse_volume_m3(with_unit(cell(row, col_Vf), map.V_f->unit, f), f);
      }

      if (!have_last || x != last_x) {
        cur.prep = method.prepare(x);
        cur.Z_b = nan;
        cur.base_status = cur.prep;
        if (cur.prep.ok()) {
          auto b = method.state(base.T_K, base.p_Pa, eval);
          cur.base_status = b.status;
          if (b.status.ok()) cur.Z_b = b[Quantity::Z];
        }
        last_x = x;
        have_last = true;
        ++rep.compositions;
      }
      if (!cur.prep.ok()) {
        r.status = cur.prep;
        r.problem = "the analysis is not accepted by the method: " + status_brief(cur.prep);
      } else if (!cur.base_status.ok()) {
        r.status = cur.base_status;
        r.problem = "Z at base conditions not computed: " + status_brief(cur.base_status);
      } else {
        auto s = method.state(T, P, eval);
        r.status = s.status;
        if (!s.status.ok()) {
          r.problem = "Z at line conditions not computed: " + status_brief(s.status);
        } else {
          const double Z_f = s[Quantity::Z];
          auto f = correction_factors(P, T, Z_f, base.p_Pa, base.T_K, cur.Z_b);
          if (!f.status.ok()) {
            r.status = f.status;
            r.problem = "correction not computed: " + status_brief(f.status);
          } else {
            r.recomputed = true;
            const std::array<double, checked_count> computed{Z_f, cur.Z_b, f.C, std::isnan(V_f) ? nan : f.C * V_f};
            for (std::size_t k = 0; k < checked_count; ++k)
              r.q[k] = compare_value(reported[k], computed[k], tolerances.ppm[k]);
          }
        }
      }
    } catch (const io::InputError& e) {
      r.recomputed = false;
      r.status = make_status(Code::invalid_input);
      r.problem = e.what();
    }
    rep.rows.push_back(std::move(r));
  }
  if (rep.rows.empty()) throw io::InputError("--data", std::string(data_name), "the file has a header but no data rows");
  summarise(rep);
  return rep;
}

}  // namespace zcorr::validate
