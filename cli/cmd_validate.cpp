// zcorr validate: check a flow computer against zcorr.
//
//   validate export   recompute a flow computer's own CSV export (with a
//                     column map, engine/validate/column_map.hpp) and compare
//                     Z_f, Z_b, C and V_b with what it reported;
//   validate points   write test points with the expected answers, for a
//                     technician to key into a flow computer;
//   validate answers  compare the answers brought back in that file.
//
// Exit 0 when every compared figure is within tolerance (and every row was
// recomputed and answered), 1 when some are not, 2 for unusable input (bad
// map, missing column, unreadable file), with a one-line message naming the
// field and the value. Parsing and formatting only; the logic is in
// engine/validate.
#include <fstream>
#include <iomanip>
#include <iostream>
#include <map>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "base_options.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "io/csv.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "method_options.hpp"
#include "validate/column_map.hpp"
#include "validate/export_check.hpp"
#include "validate/test_points.hpp"

namespace zcorr::cli {
namespace {

using validate::Checked;
using validate::checked_count;
using validate::checked_names;

struct ToleranceOptions {
  double all_ppm = -1.0;                // --tolerance-ppm
  std::vector<std::string> per_quantity;  // --tolerance Q=N
  void add_to(CLI::App& app) {
    app.add_option("--tolerance-ppm", all_ppm,
                   "Tolerance for every quantity, ppm relative (default 50, the API MPMS 21.1 recalculation bar)")
        ->check(CLI::Range(0.0, 1e6));
    app.add_option("--tolerance", per_quantity, "Tolerance of one quantity, e.g. --tolerance V_b=200 (Z_f, Z_b, C, V_b)");
  }
  // Defaults, then the map's, then the command line's.
  [[nodiscard]] validate::Tolerances resolve(const std::optional<validate::Tolerances>& from_map) const {
    validate::Tolerances t = from_map.value_or(validate::Tolerances{});
    if (all_ppm >= 0.0)
      for (auto& v : t.ppm) v = all_ppm;
    for (const auto& s : per_quantity) {
      const auto eq = s.find('=');
      auto q = eq == std::string::npos ? std::nullopt : validate::checked_from_name(io::trim(s.substr(0, eq)));
      if (!q) throw io::InputError("--tolerance", s, "write QUANTITY=PPM with QUANTITY one of Z_f, Z_b, C, V_b");
      const double v = io::parse_number(s.substr(eq + 1), "--tolerance " + std::string(checked_names[static_cast<std::size_t>(*q)]));
      if (!(v >= 0.0 && v <= 1e6)) throw io::InputError("--tolerance", s, "a tolerance in ppm, 0 to 1000000");
      t[*q] = v;
    }
    return t;
  }
};

struct ExportOptions {
  std::string data, map;
  MethodOptions method;
  BaseOptions base;
  ToleranceOptions tol;
  Format format = Format::text;
  bool all_rows = false;
  CLI::App* app = nullptr;
};

struct PointsOptions {
  MethodOptions method;
  BaseOptions base;
  ToleranceOptions tol;
  std::string out;
};

struct AnswersOptions {
  std::string file;
  ToleranceOptions tol;
  Format format = Format::text;
  bool all_rows = false;
};

std::string ppm(double v) {
  if (std::isnan(v)) return "-";
  std::ostringstream s;
  if (v != 0.0 && std::abs(v) < 0.01) s << std::scientific << std::setprecision(1) << v;
  else s << std::fixed << std::setprecision(std::abs(v) < 10.0 ? 2 : 1) << v;
  return s.str();
}

std::string signed_ppm(double v) { return (v >= 0.0 ? "+" : "") + ppm(v); }

std::string verdict(const validate::RowResult& r) {
  if (!r.recomputed) return "not_recomputed";
  if (!r.any_compared()) return "unanswered";
  return r.all_within() ? "within" : "outside";
}

// Quantities that were compared anywhere (the columns worth showing).
std::vector<std::size_t> shown_quantities(const validate::ToleranceReport& rep) {
  std::vector<std::size_t> out;
  for (std::size_t k = 0; k < checked_count; ++k)
    if (rep.summary[k].compared > 0) out.push_back(k);
  return out;
}

void print_text(const validate::ToleranceReport& rep, const std::vector<std::string>& heading, bool all_rows,
                const char* row_word, const char* reference_word) {
  for (const auto& h : heading) std::cout << h << '\n';
  std::cout << '\n'
            << std::left << std::setw(6) << "qty" << std::right << std::setw(10) << "tol ppm" << std::setw(10) << "compared"
            << std::setw(9) << "outside" << std::setw(15) << "max |dev| ppm" << std::setw(8) << "at row" << std::setw(18)
            << "median |dev| ppm" << std::setw(14) << "mean dev ppm" << '\n';
  for (std::size_t k = 0; k < checked_count; ++k) {
    const auto& s = rep.summary[k];
    if (s.compared == 0) continue;
    std::cout << std::left << std::setw(6) << checked_names[k] << std::right << std::setw(10) << io::format_number(rep.tolerances.ppm[k])
              << std::setw(10) << s.compared << std::setw(9) << s.outside << std::setw(15) << ppm(s.max_abs_ppm) << std::setw(8)
              << s.max_row << std::setw(18) << ppm(s.median_abs_ppm) << std::setw(14) << signed_ppm(s.mean_ppm) << '\n';
  }
  std::size_t outside = 0;
  for (const auto& r : rep.rows) {
    const bool bad = !r.all_within();
    if (!bad && !all_rows) continue;
    if (bad && outside++ == 0) std::cout << "\nOutside tolerance:\n";
    for (std::size_t k = 0; k < checked_count; ++k) {
      const auto& c = r.q[k];
      if (!c.compared || (c.within && !all_rows)) continue;
      std::cout << "  row " << r.row << " (line " << r.line << ") " << r.label << ": " << checked_names[k] << " reported "
                << io::format_sig(c.reported, 10) << ", " << reference_word << ' ' << io::format_sig(c.recomputed, 10) << ", "
                << signed_ppm(c.dev_ppm) << " ppm" << (c.within ? "" : "  OUTSIDE") << '\n';
    }
  }
  bool first = true;
  for (const auto& r : rep.rows) {
    if (r.recomputed) continue;
    if (first) std::cout << "\nNot recomputed:\n";
    first = false;
    std::cout << "  row " << r.row << " (line " << r.line << ") " << r.label << ": " << r.problem << '\n';
  }
  first = true;
  for (const auto& r : rep.rows) {
    const bool flagged = r.status.range == RangeClass::expanded || r.status.range == RangeClass::outside ||
                         (r.status.flags & ~flag::sum_not_unity) != 0;
    if (!r.recomputed || !flagged) continue;
    if (first) std::cout << "\nRecomputed, but the method flags the state:\n";
    first = false;
    std::cout << "  row " << r.row << " (line " << r.line << ") " << r.label << ": " << validate::status_brief(r.status) << '\n';
  }
  first = true;
  for (const auto& r : rep.rows) {
    if (!r.recomputed || r.any_compared()) continue;
    if (first) std::cout << "\nNothing reported to compare:\n";
    first = false;
    std::cout << "  row " << r.row << " (line " << r.line << ") " << r.label << '\n';
  }
  std::cout << '\n';
  const std::size_t n = rep.rows.size();
  if (rep.passed()) {
    std::cout << "RESULT: all " << n << ' ' << row_word << " within tolerance of zcorr's recomputation\n";
  } else {
    std::cout << "RESULT: " << rep.rows_outside() << " of " << n << ' ' << row_word << " outside tolerance of zcorr's recomputation";
    if (rep.not_recomputed) std::cout << ", " << rep.not_recomputed << " not recomputed";
    if (rep.unanswered) std::cout << ", " << rep.unanswered << " with nothing to compare";
    std::cout << '\n';
  }
  std::cout << "(a comparison with zcorr's own figures, not a certification)\n" << caution_line << '\n';
}

void print_csv(const validate::ToleranceReport& rep, const char* label_name, const char* reference_word) {
  const auto shown = shown_quantities(rep);
  std::vector<std::string> head{"row", "line", label_name, "verdict", "status"};
  for (auto k : shown)
    for (const std::string& suffix : std::vector<std::string>{"_reported", "_" + std::string(reference_word), "_dev_ppm", "_within"})
      head.push_back(std::string(checked_names[k]) + suffix);
  head.emplace_back("problem");
  io::write_csv_row(std::cout, head);
  for (const auto& r : rep.rows) {
    std::vector<std::string> row{std::to_string(r.row), std::to_string(r.line), r.label, verdict(r),
                                 validate::status_brief(r.status)};
    for (auto k : shown) {
      const auto& c = r.q[k];
      row.push_back(std::isnan(c.reported) ? "" : io::format_number(c.reported));
      row.push_back(std::isnan(c.recomputed) ? "" : io::format_number(c.recomputed));
      row.push_back(c.compared ? io::format_sig(c.dev_ppm, 6) : "");
      row.push_back(c.compared ? (c.within ? "yes" : "no") : "");
    }
    row.push_back(r.problem);
    io::write_csv_row(std::cout, row);
  }
}

nlohmann::json report_json(const validate::ToleranceReport& rep, const char* label_name, const char* reference_word) {
  nlohmann::json j;
  j["passed"] = rep.passed();
  j["rows"] = rep.rows.size();
  j["rows_outside"] = rep.rows_outside();
  j["not_recomputed"] = rep.not_recomputed;
  j["unanswered"] = rep.unanswered;
  j["tolerance_ppm"] = nlohmann::json::object();
  j["summary"] = nlohmann::json::object();
  for (std::size_t k = 0; k < checked_count; ++k) {
    const std::string q(checked_names[k]);
    j["tolerance_ppm"][q] = rep.tolerances.ppm[k];
    const auto& s = rep.summary[k];
    if (s.compared == 0) continue;
    j["summary"][q] = {{"compared", s.compared}, {"outside", s.outside},   {"max_abs_ppm", s.max_abs_ppm},
                       {"max_row", s.max_row},   {"median_abs_ppm", s.median_abs_ppm}, {"mean_ppm", s.mean_ppm}};
  }
  j["details"] = nlohmann::json::array();
  for (const auto& r : rep.rows) {
    nlohmann::json row{{"row", r.row}, {"line", r.line}, {label_name, r.label}, {"verdict", verdict(r)},
                       {"status", validate::status_brief(r.status)}};
    if (!r.problem.empty()) row["problem"] = r.problem;
    for (std::size_t k = 0; k < checked_count; ++k) {
      const auto& c = r.q[k];
      if (!c.compared) continue;
      row[std::string(checked_names[k])] = {{"reported", c.reported}, {reference_word, c.recomputed},
                                            {"dev_ppm", c.dev_ppm},   {"within", c.within}};
    }
    j["details"].push_back(row);
  }
  return j;
}

std::string base_text(const BaseConditions& b) {
  return std::string(b.name) + " (T_b = " + io::format_sig(b.T_K, 10) + " K, p_b = " + io::format_sig(b.p_Pa / 1000.0, 10) +
         " kPa)";
}

int run_export(const ExportOptions& o) {
  const auto map = validate::load_column_map(o.map);
  {
    std::ifstream head(o.data, std::ios::binary);
    if (!head) throw io::InputError("--data", o.data, "the file cannot be opened");
    validate::check_header(head, o.data, map);
  }
  // The command line wins over the map; base conditions must come from one of them.
  MethodOptions mo = o.method;
  const bool method_given = o.app->get_option("--method")->count() > 0;
  if (!method_given) {
    if (!map.method) throw io::InputError("--method", "(missing)", "name the method with --method or \"method = ...\" in the map");
    mo.method = *map.method;
  }
  auto method = mo.make();
  const bool base_given = o.app->get_option("--base")->count() > 0 || !o.base.T.empty() || !o.base.p.empty();
  BaseConditions base{};
  if (base_given) base = o.base.resolve();
  else if (map.base) base = *map.base;
  else
    throw io::InputError("--base", "(missing)",
                         "give the flow computer's base conditions with --base / --base-T and --base-p, or \"base = ...\" in the map");
  const auto tol = o.tol.resolve(map.tolerances);
  std::ifstream data(o.data, std::ios::binary);
  if (!data) throw io::InputError("--data", o.data, "the file cannot be opened");
  auto rep = validate::check_export(data, o.data, map, *method, base, tol, mo.eval_options(false));
  if (o.format == Format::json) {
    auto j = report_json(rep, "time", "recomputed");
    j["command"] = "validate export";
    j["caution"] = caution_line;
    j["data"] = o.data;
    j["map"] = o.map;
    j["method"] = mo.method;
    j["base"] = {{"name", std::string(base.name)}, {"T_K", base.T_K}, {"p_kPa", base.p_Pa / 1000.0}};
    j["analyses"] = rep.compositions;
    std::cout << json_text(j) << '\n';
  } else if (o.format == Format::csv) {
    print_csv(rep, "time", "recomputed");
  } else {
    print_text(rep,
               {"zcorr validate export: " + o.data + " read with the map " + o.map,
                "recomputed with " + mo.method + " at base conditions " + base_text(base),
                std::to_string(rep.rows.size()) + " rows, " + std::to_string(rep.compositions) +
                    " analyses; Z_b by the same method at base conditions; deviation = (reported - recomputed) / recomputed"},
               o.all_rows, "rows", "recomputed");
  }
  return rep.passed() ? exit_ok : exit_partial;
}

int run_points(const PointsOptions& o) {
  auto method = o.method.make();
  const auto base = o.base.resolve();
  const auto tol = o.tol.resolve(std::nullopt);
  validate::PointSet set;
  try {
    set = validate::generate_points(*method, base, o.method.eval_options(false));
  } catch (const std::invalid_argument&) {
    throw io::InputError("--method", o.method.method, "test points need gerg2008 or detail (a method that takes a detailed analysis)");
  }
  if (set.points.empty()) throw io::InputError("--method", o.method.method, "the method refused every test point");
  std::ofstream file;
  std::ostream* out = &std::cout;
  if (o.out != "-") {
    file.open(o.out, std::ios::binary);
    if (!file) throw io::InputError("--out", o.out, "the file cannot be written");
    out = &file;
  }
  validate::write_points_csv(*out, set, tol);
  out->flush();
  if (!*out) throw io::InputError("--out", o.out, "writing the file failed");
  std::ostream& msg = o.out == "-" ? std::cerr : std::cout;
  msg << "zcorr validate points: " << set.points.size() << " points for " << o.method.method << " at base conditions "
      << base_text(base) << (o.out == "-" ? "" : " written to " + o.out) << '\n';
  for (const auto& s : set.skipped)
    msg << "  left out " << s.id << " (" << s.why << "): the method gives " << status_text(s.status) << '\n';
  msg << caution_line << '\n';
  return exit_ok;
}

int run_answers(const AnswersOptions& o) {
  std::ifstream in(o.file, std::ios::binary);
  if (!in) throw io::InputError("--file", o.file, "the file cannot be opened");
  std::map<MethodId, std::unique_ptr<LineMethod>> methods;
  validate::MethodProvider provider = [&methods](MethodId id) -> LineMethod* {
    auto it = methods.find(id);
    if (it == methods.end()) it = methods.emplace(id, make_line_method(id)).first;
    return it->second.get();
  };
  auto rep = validate::compare_answers(in, o.file, o.tol.resolve(std::nullopt), provider);
  if (o.format == Format::json) {
    auto j = report_json(rep, "point", "expected");
    j["command"] = "validate answers";
    j["caution"] = caution_line;
    j["file"] = o.file;
    j["expected_recomputed"] = rep.expected_checked;
    std::cout << json_text(j) << '\n';
  } else if (o.format == Format::csv) {
    print_csv(rep, "point", "expected");
  } else {
    print_text(rep,
               {"zcorr validate answers: " + o.file,
                std::to_string(rep.rows.size()) +
                    " points; expected values recomputed and confirmed; deviation = (reported - expected) / expected"},
               o.all_rows, "points", "expected");
  }
  return rep.passed() ? exit_ok : exit_partial;
}

}  // namespace

void setup_validate(CLI::App& app, int& exit_code) {
  auto* sub = app.add_subcommand("validate", "Check a flow computer against zcorr: its export, or test points keyed into it");
  sub->require_subcommand(1);
  sub->footer(
      "\nExamples:\n"
      "  zcorr validate export --data fc_export.csv --map fc_export.zmap --method gerg2008 --base us60f_14.73\n"
      "  zcorr validate points --method gerg2008 --base iso15 --out points.csv\n"
      "  zcorr validate answers --file points.csv\n\n" +
      std::string(caution_text));

  auto ex = std::make_shared<ExportOptions>();
  auto* e = sub->add_subcommand("export", "Recompute a flow computer's CSV export and compare Z_f, Z_b, C and V_b");
  ex->app = e;
  e->add_option("--data", ex->data, "The flow computer's export (CSV with a header line)")->required();
  e->add_option("--map", ex->map, "Column map (zcorr-map 1): which columns are time, T, P, the analysis, Z, C, volumes")->required();
  ex->method.add_to(*e);
  ex->base.add_to(*e);
  ex->tol.add_to(*e);
  add_format_option(*e, ex->format);
  e->add_flag("--all-rows", ex->all_rows, "List every compared figure in the text report, not only those outside");
  e->footer(
      "\nThe map is a text file of key = value lines, e.g.\n"
      "  time = Timestamp\n"
      "  T = Flow Temp [degF]\n"
      "  P = Static Press [psig]\n"
      "  atmospheric = 14.4 psia\n"
      "  component.methane = C1 [mol%]      (one line per component column; or: analysis = methane=0.95, ...)\n"
      "  Z_f = Zf\n"
      "  Z_b = Zb\n"
      "  C = CF\n"
      "  V_f = Uncorr Vol [m3]\n"
      "  V_b = Corr Vol [m3]\n"
      "  base = us60f_14.73                 (or base_T = ..., base_p = ...; the command line overrides)\n"
      "  tolerance_ppm.V_b = 200\n"
      "Method and base conditions come from the command line, else from the map.\n"
      "Exit 0 all within tolerance, 1 some outside or not recomputed, 2 unusable input.\n\n"
      "Example:\n"
      "  zcorr validate export --data fc_export.csv --map fc_export.zmap --method gerg2008 --base us60f_14.73\n"
      "  zcorr validate export --data fc_export.csv --map fc_export.zmap --tolerance-ppm 20 --format json\n");
  e->callback([ex, &exit_code] { exit_code = guarded("validate export", [&] { return run_export(*ex); }); });

  auto po = std::make_shared<PointsOptions>();
  auto* p = sub->add_subcommand("points", "Write test points across a method's range with the expected Z_f, Z_b and C");
  po->method.add_to(*p);
  po->base.add_to(*p);
  po->tol.add_to(*p);
  p->add_option("--out", po->out, "Points file to write (CSV); '-' for standard output")->required();
  p->footer(
      "\nEach point says why it is there (pipeline gases, a state equal to the base conditions, corners of the range,\n"
      "the region where Z is most sensitive, high pressure). Key T, P and the analysis of each point into the flow\n"
      "computer, fill in Z_f_reported, Z_b_reported and C_reported, then run 'zcorr validate answers'.\n\n"
      "Example:\n"
      "  zcorr validate points --method gerg2008 --base iso15 --out points.csv\n");
  p->callback([po, &exit_code] { exit_code = guarded("validate points", [&] { return run_points(*po); }); });

  auto ao = std::make_shared<AnswersOptions>();
  auto* a = sub->add_subcommand("answers", "Compare the answers a flow computer gave for the test points");
  a->add_option("--file", ao->file, "The points file with the *_reported columns filled in")->required();
  ao->tol.add_to(*a);
  add_format_option(*a, ao->format);
  a->add_flag("--all-rows", ao->all_rows, "List every compared figure in the text report, not only those outside");
  a->footer(
      "\nThe expected values are recomputed first; a file whose expected values were edited is refused.\n"
      "Exit 0 every point answered and within tolerance, 1 otherwise, 2 unusable file.\n\n"
      "Example:\n"
      "  zcorr validate answers --file points.csv --tolerance-ppm 50\n");
  a->callback([ao, &exit_code] { exit_code = guarded("validate answers", [&] { return run_answers(*ao); }); });
}

}  // namespace zcorr::cli
