// zcorr correct: writes a what-if recomputation to the log as a correction
// set (audit/correct.hpp). Exit 0 written, 2 refused (nothing written).
#include <iostream>
#include <memory>

#include "audit/correct.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "io/input_error.hpp"
#include "io/units_parse.hpp"
#include "progress.hpp"
#include "record/quantities.hpp"
#include "record/seal.hpp"
#include "record/timeutil.hpp"

namespace zcorr::cli {
namespace {

struct CorrectCliOptions {
  std::string db, point, from, to, method, base_T, base_p, reason, seal_key;
  std::int64_t analysis = 0;
};

int run_correct(const CorrectCliOptions& o) {
  audit::CorrectionRequest req;
  req.point = o.point;
  if (!o.from.empty()) req.from_utc_s = parse_utc_option("--from", o.from);
  if (!o.to.empty()) req.to_utc_s = parse_utc_option("--to", o.to);
  if (req.from_utc_s && req.to_utc_s && *req.from_utc_s >= *req.to_utc_s)
    throw io::InputError("--to", o.to, "a time after --from (" + o.from + ")");
  if (!o.method.empty()) req.change.method = o.method;
  if (!o.base_T.empty()) req.change.base_T_K = io::parse_temperature_K(o.base_T, "--base-T");
  if (!o.base_p.empty()) req.change.base_p_Pa = io::parse_pressure_Pa(o.base_p, "--base-p");
  if (o.analysis) req.change.analysis_seq = o.analysis;
  req.reason = o.reason;
  if (!o.seal_key.empty()) req.seal_key = record::load_seal_key(o.seal_key, "--seal-key");
  req.progress = stderr_progress("correct");
  audit::CorrectionOutcome out;
  try {
    out = audit::write_correction_set(o.db, req, audit::built_in_methods());
  } catch (const record::LogError& e) {
    std::cerr << "zcorr correct: " << e.what() << '\n';
    return exit_unusable;
  }
  const auto& s = out.set;
  std::cout << "correction set seq " << s.seq << " written to " << o.db << "\n"
            << "point      " << s.point << ", " << record::format_time_utc(s.from_utc_s) << " .. " << record::format_time_utc(s.to_utc_s)
            << ", " << s.intervals << " interval(s) replaced (records seq " << out.first_seq << ".." << s.seq << ", "
            << out.configs << " correcting configuration(s))\n"
            << "change     " << s.change << "\n"
            << "reason     " << s.reason << "\n"
            << "base vol.  " << record::decimal(s.V_b_um3_replaced, 6) << " m3 as logged, " << record::decimal(s.V_b_um3_corrected, 6)
            << " m3 corrected (" << record::decimal(s.V_b_um3_corrected - s.V_b_um3_replaced, 6) << ")\n"
            << "energy     " << record::decimal(s.E_J_replaced, 6) << " MJ as logged, " << record::decimal(s.E_J_corrected, 6)
            << " MJ corrected (" << record::decimal(s.E_J_corrected - s.E_J_replaced, 6) << ")\n"
            << "The records it replaces are unchanged; zcorr audit shows both totals side by side.\n";
  if (out.unconverted)
    std::cout << "note       " << out.unconverted
              << " interval(s) had line volume but no converted volume as logged (conversion stopped); they stay so:\n"
                 "           the log keeps no samples to convert them from.\n";
  return exit_ok;
}

}  // namespace

void setup_correct(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<CorrectCliOptions>();
  auto* sub = app.add_subcommand(
      "correct", "Write a recomputation with another method, base condition or gas analysis to the log as a correction set");
  sub->add_option("--db", opt->db, "Interval log file (written: a correction set is appended)")->required();
  sub->add_option("--point", opt->point, "Measurement point to correct")->required();
  sub->add_option("--from", opt->from, "Only intervals ending after this UTC time (2026-03-02T06:00:00Z)");
  sub->add_option("--to", opt->to, "Only intervals starting before this UTC time");
  sub->add_option("--method", opt->method, "Recompute with this line method (gerg2008, detail, sgerg88, ...)");
  sub->add_option("--base-T", opt->base_T, "Recompute at this base temperature, e.g. \"15 degC\" or \"60 degF\"");
  sub->add_option("--base-p", opt->base_p, "Recompute at this base pressure, absolute, e.g. \"101.325 kPa\" or \"14.73 psia\"");
  sub->add_option("--analysis", opt->analysis, "Recompute every interval with this gas_analysis record (seq)");
  sub->add_option("--reason", opt->reason, "Why (required; kept in every correcting record)")->required();
  sub->add_option("--seal-key", opt->seal_key, "Key file of a sealed log: the correction set ends in a seal as a recording does");
  sub->footer(std::string("\nEvery interval of the point and range that no correction replaces yet is recomputed and written as a\n"
                          "new record naming the one it replaces (corrects_seq); nothing logged changes. The set is one\n"
                          "transaction: written whole or not at all. Try it first with zcorr audit --what-if-....\n\n"
                          "Exit status: 0 written, 2 refused (nothing written).\n\nExample:\n"
                          "  zcorr correct --db station.db --point HF-1 --base-p \"101.56 kPa\" --reason \"contract base pressure\"\n\n") +
              caution_text + "\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("correct", [&] { return run_correct(*opt); }); });
}

}  // namespace zcorr::cli
