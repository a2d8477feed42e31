// zcorr record: appends a measurement point's samples to an interval log.
//
// Inputs (formats in engine/record/input.hpp and config.hpp, summarised in
// --help): the point configuration file, the sample CSV and, optionally, the
// gas-analysis CSV. Exit 0 recorded, 1 recorded but some input rows were bad
// (each is an event in the log), 2 nothing recorded (unusable input, log
// refused or another writer).
#include <fstream>
#include <iostream>
#include <memory>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "io/input_error.hpp"
#include "record/config.hpp"
#include "record/input.hpp"
#include "record/log.hpp"
#include "record/recorder.hpp"
#include "record/seal.hpp"
#include "record/timeutil.hpp"

namespace zcorr::cli {
namespace {

struct RecordCliOptions {
  std::string db, config, samples, analyses, seal_key;
  std::int64_t batch = 60;
  std::string sync = "normal";
  bool allow_outside_range = false;
  GasOptions gas;  // only its composition options (--normalise, --sum-tolerance) are used
  Format format = Format::text;
};

int run_record(const RecordCliOptions& o) {
  using namespace zcorr::record;
  const PointConfig cfg = load_point_config(o.config);
  const auto id = method_from_name(cfg.method);
  if (!id || *id == MethodId::iso6976)
    throw io::InputError(o.config + " method", cfg.method, "use gerg2008, detail, sgerg88, gross1 or gross2");
  auto method = make_line_method(*id);
  if (!method) throw io::InputError(o.config + " method", cfg.method, "this method is not available in this build of zcorr");
  AnalysisFile af;
  if (!o.analyses.empty()) {
    std::ifstream f(o.analyses, std::ios::binary);
    if (!f) throw io::InputError("--analyses", o.analyses, "the file cannot be opened");
    af = read_analyses(f, o.analyses, o.gas.composition_options());
  }
  std::ifstream file;
  std::istream* in = &std::cin;
  if (o.samples != "-") {
    file.open(o.samples, std::ios::binary);
    if (!file) throw io::InputError("--samples", o.samples, "the file cannot be opened");
    in = &file;
  }
  SampleReader reader(*in, o.samples == "-" ? "stdin" : o.samples, cfg);

  OpenOptions oo;
  oo.mode = OpenMode::writer;
  oo.durability = o.sync == "full" ? Durability::full : Durability::normal;
  std::vector<std::uint8_t> key;
  if (!o.seal_key.empty()) key = load_seal_key(o.seal_key, "--seal-key");
  Log log(o.db, oo);
  if (!key.empty()) log.set_seal_key(std::move(key));
  RecordOptions ro;
  ro.batch_intervals = o.batch;
  ro.eval.solve.allow_outside_range = o.allow_outside_range;
  ro.input_name = o.samples;
  const std::int64_t head_before = log.head_seq();
  Recorder rec(log, cfg, *method, ro);
  try {
    for (const auto& b : af.bad) rec.add_bad_analysis(b);
    rec.add_analyses(af.analyses);
    rec.feed(reader);
    rec.finish();
  } catch (const std::exception& e) {
    // Exit 2 means nothing was recorded; once a batch is committed, a later
    // failure is exit 1 and says what the log holds.
    log.rollback();
    if (log.head_seq() == head_before) throw;
    std::cerr << "zcorr record: " << io::printable(e.what(), 1000) << "; the log keeps every record committed before it, up to seq "
              << log.head_seq() << " (" << log.head_seq() - head_before
              << " records of this run); run again on the same input to resume\n"
              << caution_line << '\n';
    return exit_partial;
  }
  const auto& st = rec.stats();
  const std::int64_t bad_rows = st.bad_rows + static_cast<std::int64_t>(af.bad.size());
  if (o.format == Format::json) {
    nlohmann::json j;
    j["db"] = o.db;
    j["caution"] = caution_line;
    j["point"] = cfg.point;
    j["rows"] = st.rows;
    j["skipped_already_recorded"] = st.skipped;
    j["bad_rows"] = bad_rows;
    j["intervals"] = st.intervals;
    j["hourly_records"] = st.hours;
    j["daily_records"] = st.days;
    j["events"] = st.events;
    j["analyses"] = st.analyses;
    j["configurations"] = st.configs;
    j["transactions"] = st.commits;
    j["read_back"] = st.read_back;
    j["seals"] = log.seals_written();
    j["rows_left_for_next_run"] = st.rows_left;
    j["last_interval_end"] = st.last_end_utc_s ? format_time_utc(st.last_end_utc_s) : "";
    j["head_seq"] = log.head_seq();
    j["head_hash"] = to_hex(log.head_hash());
    std::cout << json_text(j) << '\n';
  } else {
    std::cout << "zcorr record: point " << cfg.point << " -> " << o.db << '\n'
              << "  rows read          " << st.rows << " (" << st.skipped << " already recorded, skipped)\n"
              << "  bad rows           " << bad_rows << " (each logged as an event)\n"
              << "  intervals          " << st.intervals
              << (st.last_end_utc_s ? " (recorded up to " + format_time_utc(st.last_end_utc_s) + ")" : std::string()) << '\n'
              << "  hourly / daily     " << st.hours << " / " << st.days << " quantity records\n"
              << "  events             " << st.events << '\n'
              << "  analyses, configs  " << st.analyses << ", " << st.configs << '\n'
              << "  transactions       " << st.commits << " (every " << o.batch << " intervals)\n"
              << "  read back          " << st.read_back << " records appended by this run, as written\n"
              << (log.seals_written() ? "  sealed             " + std::to_string(log.seals_written()) + " seal(s), the last at the head\n"
                                      : std::string())
              << "  head               seq " << log.head_seq() << ", hash " << to_hex(log.head_hash()) << '\n';
    if (st.rows_left > 0)
      std::cout << "  left               " << st.rows_left << " rows of an incomplete last interval (recorded by the next run)\n";
    std::cout << caution_line << '\n';
  }
  return bad_rows > 0 ? exit_partial : exit_ok;
}

}  // namespace

void setup_record(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<RecordCliOptions>();
  auto* sub = app.add_subcommand("record", "Append a measurement point's samples to an interval log (SQLite, hash-chained)");
  sub->add_option("--db", opt->db, "Interval log file (created when missing)")->required();
  sub->add_option("--config", opt->config, "Point configuration file (key = value lines)")->required()->check(CLI::ExistingFile);
  sub->add_option("--samples", opt->samples, "Sample CSV: time, p_<unit>, T_<unit>, V_<unit> or pulses ('-' = standard input)")
      ->required();
  sub->add_option("--analyses", opt->analyses, "Gas-analysis CSV: valid_from, [sampled, source, Hs_MJ_per_m3, hs_ref], components")
      ->check(CLI::ExistingFile);
  sub->add_option("--batch", opt->batch, "Intervals per transaction (flush policy)")->check(CLI::Range(1, 1000000))->capture_default_str();
  sub->add_option("--seal-key", opt->seal_key,
                  "Key file (at least 32 bytes, kept away from the log): every transaction ends in a seal, an HMAC of the "
                  "chain head, that `verify --seal-key` checks");
  sub->add_option("--sync", opt->sync, "normal: committed batches survive a killed process; full: also a power loss")
      ->check(CLI::IsMember({"normal", "full"}))
      ->capture_default_str();
  sub->add_flag("--allow-outside-range", opt->allow_outside_range,
                "Compute states outside the method's range (flagged) instead of stopping the conversion");
  sub->add_flag("--normalise", opt->gas.normalise, "Scale analyses to sum 1 (the original sum is recorded)");
  sub->add_option("--sum-tolerance", opt->gas.sum_tolerance, "Accepted |sum - 1| of an analysis without normalising")
      ->check(CLI::Range(0.0, 0.05));
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nPoint configuration (one key = value per line, '#' comments):\n"
      "  point, method, base (iso15 | normal0 | us60f_14.73 | us60f_14.696) or base_T + base_p, atm,\n"
      "  pressure (absolute | gauge), meter (volume | pulses), k_factor, meter_factor, interval (s),\n"
      "  contract_hour, utc_offset, averaging (time_linear | flow_linear | time_formulaic | flow_formulaic),\n"
      "  integration (per_sample | average_then_correct), p_min, p_max, T_min, T_max, volume_unit,\n"
      "  energy_unit, max_flow (m3/h after the meter factor, default 1e6), dew_margin (K, default 5), note\n"
      "Refused (exit 2, field named): base_T outside 200..400 K, base_p outside 10 kPa..1 MPa, p_min or\n"
      "T_min not above 0, a point id that is not UTF-8 text, max_flow not in (0, 1e9] m3/h.\n"
      "Each sample row closes a sub-period begun at the previous row; intervals are aligned to multiples\n"
      "of the interval length. A reading outside [p_min, p_max] or [T_min, T_max], or unreadable, stops\n"
      "the converted register for that row (its volume goes to the fault register) and is an alarm event.\n"
      "A row whose volume is above max_flow over the time it covers is an alarm too; its volume enters\n"
      "no register. Registers saturate at their limit (flag overflow), never wrap.\n"
      "Running again on overlapping input resumes after the last recorded interval.\n"
      "\nExample:\n  zcorr record --db station.db --config point.conf --samples day1.csv --analyses gc.csv\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("record", [&] { return run_record(*opt); }); });
}

}  // namespace zcorr::cli
