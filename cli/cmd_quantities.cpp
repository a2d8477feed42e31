// zcorr quantities: prints the hourly or daily quantity transaction records
// of an interval log. Registers are printed exactly (m3 and MJ with six
// decimals); other report units are conversions for reading.
#include <iomanip>
#include <iostream>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "io/csv.hpp"
#include "io/text.hpp"
#include "record/quantities.hpp"
#include "record/tables.hpp"
#include "record/timeutil.hpp"

namespace zcorr::cli {
namespace {

struct QuantitiesOptions {
  std::string db, point, period = "day";
  Format format = Format::text;
};

std::string opt_fixed(const std::optional<double>& v, double scale, double offset, int decimals) {
  if (!v) return "";
  std::ostringstream s;
  s << std::fixed << std::setprecision(decimals) << (*v * scale + offset);
  return s.str();
}

int run_quantities(const QuantitiesOptions& o) {
  using namespace zcorr::record;
  Log log(o.db, {OpenMode::read_only});
  const auto rows = read_quantities(log, o.point, o.period);
  const bool corrected = !rows.empty() && rows.front().corrected;
  std::vector<std::string> head{"point", "period", "contract_day", "start_utc", "end_utc", "intervals", "flow_time_s", "alarm_time_s",
                                      "p_avg_kPa", "T_avg_degC", "V_f_m3", "V_b_m3", "V_fault_m3", "E_MJ", "mass_kg", "Hs_avg_MJ_per_m3",
                                      "cum_V_b_m3", "flags"};
  if (corrected) head.insert(head.end(), {"V_b_m3_corrected", "E_MJ_corrected", "mass_kg_corrected"});
  auto fields = [](const QuantityRecord& q) {
    auto f = std::vector<std::string>{q.point, q.period, q.contract_day, format_time_utc(q.start_utc_s), format_time_utc(q.end_utc_s),
                                    std::to_string(q.intervals), std::to_string(q.flow_time_s), std::to_string(q.alarm_time_s),
                                    opt_fixed(q.p_avg_Pa, 1e-3, 0, 3), opt_fixed(q.T_avg_K, 1, -273.15, 3), decimal(q.V_f_um3, 6),
                                    decimal(q.V_b_um3, 6), decimal(q.V_fault_um3, 6), decimal(q.E_J, 6), decimal(q.mass_mg, 6),
                                    opt_fixed(q.Hs_avg_MJ_per_m3, 1, 0, 4), decimal(q.cum_V_b_um3, 6), std::to_string(q.flags)};
    if (q.corrected) f.insert(f.end(), {decimal(q.V_b_um3_corrected, 6), decimal(q.E_J_corrected, 6), decimal(q.mass_mg_corrected, 6)});
    return f;
  };
  if (o.format == Format::csv) {
    io::write_csv_row(std::cout, head);
    for (const auto& q : rows) io::write_csv_row(std::cout, fields(q));
  } else if (o.format == Format::json) {
    nlohmann::json j = nlohmann::json::array();
    for (const auto& q : rows) {
      auto f = fields(q);
      nlohmann::json r;
      for (std::size_t i = 0; i < head.size(); ++i) r[head[i]] = f[i];
      j.push_back(r);
    }
    std::cout << json_text(j) << '\n';
  } else {
    std::cout << (o.period == "day" ? "Daily" : "Hourly") << " quantity transaction records, " << o.db << '\n';
    std::cout << std::left << std::setw(12) << "point" << std::setw(12) << (o.period == "day" ? "day" : "hour from") << std::right
              << std::setw(7) << "flow h" << std::setw(8) << "alarm s" << std::setw(11) << "p kPa" << std::setw(9) << "T degC"
              << std::setw(19) << "V_f m3" << std::setw(19) << "V_b m3" << std::setw(15) << "fault m3" << std::setw(20) << "energy MJ"
              << std::setw(9) << "Hs" << (corrected ? "  flags        V_b corrected m3  energy corrected MJ\n" : "  flags\n");
    for (const auto& q : rows) {
      const std::string when = o.period == "day" ? q.contract_day : format_time_utc(q.start_utc_s).substr(5, 11);
      std::cout << std::left << std::setw(12) << q.point << std::setw(12) << when << std::right << std::setw(7)
                << opt_fixed(static_cast<double>(q.flow_time_s) / 3600.0, 1, 0, 2) << std::setw(8) << q.alarm_time_s << std::setw(11)
                << opt_fixed(q.p_avg_Pa, 1e-3, 0, 2) << std::setw(9) << opt_fixed(q.T_avg_K, 1, -273.15, 2) << std::setw(19)
                << decimal(q.V_f_um3, 6) << std::setw(19) << decimal(q.V_b_um3, 6) << std::setw(15) << decimal(q.V_fault_um3, 6)
                << std::setw(20) << decimal(q.E_J, 6) << std::setw(9) << opt_fixed(q.Hs_avg_MJ_per_m3, 1, 0, 3) << "  "
                << ((q.flags & iflag::alarm) ? "alarm " : "") << ((q.flags & iflag::bad_input) ? "bad_input " : "")
                << ((q.flags & iflag::gap) ? "gap " : "");
      if (q.corrected) {
        const std::string fl = std::string((q.flags & iflag::alarm) ? "alarm " : "") + ((q.flags & iflag::bad_input) ? "bad_input " : "") +
                               ((q.flags & iflag::gap) ? "gap " : "");
        std::cout << std::string(fl.size() < 11 ? 11 - fl.size() : 1, ' ') << std::setw(18) << decimal(q.V_b_um3_corrected, 6)
                  << std::setw(21) << decimal(q.E_J_corrected, 6);
      }
      std::cout << '\n';
    }
    std::cout << rows.size() << " record(s)";
    if (corrected)
      std::cout << "; the records are as recorded, the corrected columns sum the intervals no correction replaces";
    std::cout << '\n' << caution_line << '\n';
  }
  return exit_ok;
}

}  // namespace

void setup_quantities(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<QuantitiesOptions>();
  auto* sub = app.add_subcommand("quantities", "Print the hourly or daily quantity transaction records of an interval log");
  sub->add_option("--db", opt->db, "Interval log file")->required();
  sub->add_option("--point", opt->point, "Only this measurement point");
  sub->add_option("--period", opt->period, "day or hour")->check(CLI::IsMember({"day", "hour"}))->capture_default_str();
  add_format_option(*sub, opt->format);
  sub->footer("\nExample:\n  zcorr quantities --db station.db --period day\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("quantities", [&] { return run_quantities(*opt); }); });
}

}  // namespace zcorr::cli
