// zcorr audit: replays an interval log and lists what is wrong with it, each
// finding with its interval range, kind, severity and the base volume and
// energy at stake. Exit 0 nothing found, 1 findings, 2 the log cannot be read
// (missing, corrupt, not a zcorr log, newer schema).
#include <cmath>
#include <cstdio>
#include <ctime>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <memory>
#include <sstream>

#include <nlohmann/json.hpp>

#include "record/seal.hpp"

#include "audit/audit.hpp"
#include "audit/report_html.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "io/input_error.hpp"
#include "io/iso6976_refs.hpp"
#include "io/text.hpp"
#include "io/units_parse.hpp"
#include "progress.hpp"
#include "record/quantities.hpp"
#include "record/timeutil.hpp"

namespace zcorr::cli {
namespace {

struct AuditCliOptions {
  std::string db, point, from, to, contract;
  std::string wi_method, wi_base_T, wi_base_p, wi_combustion;
  std::string expect_head, seal_key;
  std::string report;  // --report FILE.html
  std::int64_t wi_analysis = 0;
  double max_age_h = 840;
  double tolerance_ppm = audit::recalculation_bar_ppm;
  std::string dew_margin;  // kelvin, "3" or "3 K"; empty: the contract's, else 5 K
  Format format = Format::text;
};

std::string t_or_empty(std::int64_t t) { return t ? record::format_time_utc(t) : std::string(); }

std::string fixed(double v, int digits) {
  if (!std::isfinite(v)) return v > 0 ? "inf" : (v < 0 ? "-inf" : "");
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.*f", digits, v);
  return buf;
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n") == std::string::npos) return s;
  std::string o = "\"";
  for (char c : s) {
    if (c == '"') o += '"';
    o += c;
  }
  return o + '"';
}

double json_num(double v) { return std::isfinite(v) ? v : (v > 0 ? 1e300 : -1e300); }
// NaN (not known) as null; an infinite value as +-1e300.
nlohmann::json json_or_null(double v) { return std::isnan(v) ? nlohmann::json(nullptr) : nlohmann::json(json_num(v)); }

// "hold" or an ISO 6976 combustion reference ("15", "60 degF") -> the what-if's combustion reference.
void parse_combustion(const std::string& text, audit::WhatIf& w) {
  if (io::trim(text) == "hold") w.combustion_hold = true;
  else w.combustion = io::parse_combustion_ref(text, "--what-if-combustion-ref");
}

std::string diff_text(double v, bool estimated) {
  if (std::isnan(v)) return "not known";
  return (estimated ? "~" : "") + std::string(v > 0 ? "+" : "") + fixed(v, 6);
}

int run_audit_cmd(const AuditCliOptions& o) {
  using namespace zcorr::audit;
  AuditOptions ao;
  if (!o.point.empty()) ao.selection.point = o.point;
  if (!o.from.empty()) ao.selection.from_utc_s = parse_utc_option("--from", o.from);
  if (!o.to.empty()) ao.selection.to_utc_s = parse_utc_option("--to", o.to);
  if (!o.contract.empty()) ao.contract = load_contract(o.contract);
  if (!(o.max_age_h > 0)) throw io::InputError("--max-analysis-age", std::to_string(o.max_age_h), "hours > 0");
  if (!(o.tolerance_ppm >= 0)) throw io::InputError("--tolerance-ppm", std::to_string(o.tolerance_ppm), "ppm >= 0");
  ao.max_analysis_age_h = o.max_age_h;
  ao.tolerance_ppm = o.tolerance_ppm;
  if (!o.dew_margin.empty()) {
    std::string t(io::trim(o.dew_margin));
    if (t.size() > 1 && t.back() == 'K') t = std::string(io::trim(std::string_view(t).substr(0, t.size() - 1)));
    const double v = io::parse_number(t, "--dew-margin");
    if (!(v >= 0.0 && v <= 50.0)) throw io::InputError("--dew-margin", o.dew_margin, "a temperature difference from 0 K to 50 K");
    ao.dew_margin_K = v;
  }

  if (!o.wi_method.empty()) ao.what_if.method = o.wi_method;
  if (!o.seal_key.empty()) ao.seal_key = record::load_seal_key(o.seal_key, "--seal-key");
  if (!o.expect_head.empty()) ao.expected_head = record::parse_anchor(o.expect_head, "--expect-head");
  if (!o.wi_base_T.empty()) ao.what_if.base_T_K = io::parse_temperature_K(o.wi_base_T, "--what-if-base-T");
  if (!o.wi_base_p.empty()) ao.what_if.base_p_Pa = io::parse_pressure_Pa(o.wi_base_p, "--what-if-base-p");
  if (o.wi_analysis) ao.what_if.analysis_seq = o.wi_analysis;
  if (!o.wi_combustion.empty()) parse_combustion(o.wi_combustion, ao.what_if);

  ao.progress = stderr_progress("audit");

  // --report: the HTML report, fed while the audit replays. The path is
  // checked before the replay: never the log itself or one of its companion
  // files, never an existing SQLite file, and its folder must take a new
  // file. The page is written to a temporary file beside it and renamed, so
  // an existing file is replaced whole or not at all.
  ReportCollector report_charts;
  if (!o.report.empty()) {
    namespace fs = std::filesystem;
    std::error_code ec;
    const fs::path rp(o.report);
    for (const char* suffix : {"", "-wal", "-shm", "-journal", "-writer.lock"})
      if (fs::exists(o.db + suffix, ec) && fs::equivalent(rp, o.db + suffix, ec))
        throw io::InputError("--report", o.report, "a file other than the log given with --db and its companion files");
    if (fs::is_directory(rp, ec)) throw io::InputError("--report", o.report, "a file, not a folder");
    if (fs::exists(rp, ec)) {
      std::ifstream in(rp, std::ios::binary);
      char head[16] = {};
      in.read(head, sizeof head);
      if (in.gcount() == 16 && std::string(head, 16) == std::string("SQLite format 3\0", 16))
        throw io::InputError("--report", o.report, "a path that is not an SQLite database (refusing to overwrite it)");
    }
    const fs::path probe = rp.string() + ".zcorr-tmp";
    if (!std::ofstream(probe, std::ios::trunc))
      throw io::InputError("--report", o.report, "a file that can be written (its folder must exist)");
    fs::remove(probe, ec);
    ao.observe = report_charts.observer();
  }
  auto write_report = [&](const AuditResult& res) {
    ReportHeader h;
    h.log_file = o.db;
    h.produced_utc_s = static_cast<std::int64_t>(std::time(nullptr));
    h.produced_by = "zcorr audit";
    std::string sel;
    if (!o.point.empty()) sel += "point " + o.point;
    if (!o.from.empty()) sel += (sel.empty() ? "" : ", ") + std::string("intervals ending after ") + o.from;
    if (!o.to.empty()) sel += (sel.empty() ? "" : ", ") + std::string("intervals starting before ") + o.to;
    h.selection = sel.empty() ? "the whole log" : sel;
    h.tolerance_ppm = o.tolerance_ppm;
    std::string wi;
    if (!o.wi_method.empty()) wi += "method " + o.wi_method;
    if (!o.wi_base_T.empty()) wi += (wi.empty() ? "" : ", ") + std::string("base temperature ") + o.wi_base_T;
    if (!o.wi_base_p.empty()) wi += (wi.empty() ? "" : ", ") + std::string("base pressure ") + o.wi_base_p;
    if (o.wi_analysis) wi += (wi.empty() ? "" : ", ") + std::string("gas_analysis seq ") + std::to_string(o.wi_analysis);
    if (!o.wi_combustion.empty()) wi += (wi.empty() ? "" : ", ") + std::string("combustion reference ") + o.wi_combustion;
    if (!wi.empty()) h.what_if = "Recomputed with " + wi;
    const std::filesystem::path tmp = o.report + ".zcorr-tmp";
    std::error_code ec;
    {
      std::ofstream f(tmp, std::ios::trunc);
      write_html_report(f, res, report_charts, h);
      f.close();
      if (!f) {
        std::filesystem::remove(tmp, ec);
        throw io::InputError("--report", o.report, "a file that can be written (writing it failed)");
      }
    }
    std::filesystem::rename(tmp, o.report, ec);
    if (ec) {
      std::filesystem::remove(tmp, ec);
      throw io::InputError("--report", o.report, "a file that can be replaced (renaming the new report onto it failed)");
    }
    std::cerr << "zcorr audit: report written to " << o.report << '\n';
  };

  AuditResult r;
  try {
    record::Log log(o.db, {record::OpenMode::read_only});
    r = run_audit(log, ao, built_in_methods());
  } catch (const record::LogError& e) {
    std::cerr << "zcorr audit: " << e.what() << '\n';
    return exit_unusable;
  }
  if (!o.report.empty()) write_report(r);
  const ReplayTotals& t = r.replay;
  const bool clean = r.counting() == 0;  // notices leave the exit status alone

  if (o.format == Format::json) {
    nlohmann::json j;
    j["db"] = o.db;
    j["log_id"] = r.log_id;
    j["records"] = r.records;
    j["snapshot_head_seq"] = r.head_seq;
    j["head_hash"] = r.head_hash_hex;
    j["replayed_by"] = record::engine_version();
    j["dew_margin_K"] = r.dew_margin_K;
    j["dew_margin_source"] = r.dew_margin_source;
    j["written_by"] = nlohmann::json::array();
    for (const auto& [v, n] : r.engine_versions) j["written_by"].push_back({{"engine_version", v}, {"intervals", n}});
    j["written_by_another_engine"] = written_by_another_engine(r);
    j["V_b_m3"] = record::decimal(r.V_b_um3, 6);
    j["E_MJ"] = record::decimal(r.E_J, 6);
    j["replay"] = {{"intervals", t.intervals},
                   {"replayed", t.replayed},
                   {"not_replayed", t.not_replayed},
                   {"over_bar", t.over_bar},
                   {"bar_ppm", recalculation_bar_ppm},
                   {"V_b_m3_logged", record::decimal(t.V_b_um3_logged, 6)},
                   {"V_b_m3_replayed", record::decimal(t.V_b_um3_replayed, 6)},
                   {"E_MJ_logged", record::decimal(t.E_J_logged, 6)},
                   {"E_MJ_replayed", record::decimal(t.E_J_replayed, 6)},
                   {"max_dZ_f_ppm", json_num(t.max_dZ_f_ppm)},
                   {"max_dZ_b_ppm", json_num(t.max_dZ_b_ppm)},
                   {"max_dC_ppm", json_num(t.max_dC_ppm)},
                   {"max_dV_b_ppm", json_num(t.max_dV_b_ppm)},
                   {"max_dE_ppm", json_num(t.max_dE_ppm)}};
    if (r.what_if_run) {
      j["what_if"] = {{"intervals", r.what_if.intervals},
                      {"recomputed", r.what_if.replayed},
                      {"V_b_m3_logged", record::decimal(r.what_if.V_b_um3_logged, 6)},
                      {"V_b_m3_what_if", record::decimal(r.what_if.V_b_um3_replayed, 6)},
                      {"E_MJ_logged", record::decimal(r.what_if.E_J_logged, 6)},
                      {"E_MJ_what_if", record::decimal(r.what_if.E_J_replayed, 6)},
                      {"combustion_reference", r.what_if_combustion},
                      {"difference_by_cause", nlohmann::json::array()}};
      for (const auto& st : r.what_if_steps)
        j["what_if"]["difference_by_cause"].push_back(
            {{"cause", st.cause}, {"V_b_m3_difference", record::decimal(st.V_b_um3, 6)}, {"E_MJ_difference", record::decimal(st.E_J, 6)}});
    }
    j["as_recorded"] = {{"V_b_m3", record::decimal(r.V_b_um3_as_recorded, 6)}, {"E_MJ", record::decimal(r.E_J_as_recorded, 6)}};
    j["correction_sets"] = nlohmann::json::array();
    for (const auto& c : r.corrections)
      j["correction_sets"].push_back({{"seq", c.seq},
                                      {"point", c.point},
                                      {"created", t_or_empty(c.created_utc_s)},
                                      {"from", t_or_empty(c.from_utc_s)},
                                      {"to", t_or_empty(c.to_utc_s)},
                                      {"change", c.change},
                                      {"reason", c.reason},
                                      {"intervals", c.intervals},
                                      {"V_b_m3_replaced", record::decimal(c.V_b_um3_replaced, 6)},
                                      {"V_b_m3_corrected", record::decimal(c.V_b_um3_corrected, 6)},
                                      {"E_MJ_replaced", record::decimal(c.E_J_replaced, 6)},
                                      {"E_MJ_corrected", record::decimal(c.E_J_corrected, 6)}});
    j["findings"] = nlohmann::json::array();
    for (const auto& f : r.findings)
      j["findings"].push_back({{"kind", kind_name(f.kind)},
                               {"severity", severity_name(f.severity)},
                               {"point", f.point},
                               {"from", t_or_empty(f.from_utc_s)},
                               {"to", t_or_empty(f.to_utc_s)},
                               {"from_utc_s", f.from_utc_s},
                               {"to_utc_s", f.to_utc_s},
                               {"intervals", f.intervals},
                               {"first_seq", f.first_seq},
                               {"last_seq", f.last_seq},
                               {"V_b_m3_affected", f.V_b_affected_m3},
                               {"E_MJ_affected", f.E_affected_MJ},
                               {"V_b_m3_difference", json_or_null(f.V_b_difference_m3)},
                               {"E_MJ_difference", json_or_null(f.E_difference_MJ)},
                               {"V_b_difference_ppm", json_or_null(f.V_b_difference_ppm())},
                               {"E_difference_ppm", json_or_null(f.E_difference_ppm())},
                               {"difference_estimated", f.difference_estimated},
                               {"difference_basis", f.difference_basis},
                               {"worst_ppm", json_num(f.worst_ppm)},
                               {"detail", f.detail}});
    for (std::size_t k = 0; k < r.findings.size(); ++k)
      if (r.findings[k].kind == Kind::alarm || r.findings[k].kind == Kind::two_phase) {
        j["findings"][k]["alarm_time_s"] = r.findings[k].alarm_time_s;
        j["findings"][k]["V_fault_m3"] = r.findings[k].V_fault_m3;
      }
    j["counting_findings"] = r.counting();
    j["caution"] = caution_text;
    j["intervals_over_bar"] = nlohmann::json::array();
    for (const auto& [iv, rp] : r.over_bar)
      j["intervals_over_bar"].push_back({{"seq", iv.seq}, {"point", iv.point}, {"start", record::format_time_utc(iv.start_utc_s)},
                                         {"Z_f_logged", json_num(iv.Z_f)}, {"Z_f_replayed", json_num(rp.Z_f)},
                                         {"V_b_m3_logged", iv.V_b_m3}, {"V_b_m3_replayed", rp.V_b_m3},
                                         {"V_b_difference_ppm", json_or_null(rp.dV_b_ppm)}, {"estimated", rp.estimated},
                                         {"worst_ppm", json_num(rp.worst_ppm())}});
    std::cout << json_text(j) << '\n';
  } else if (o.format == Format::csv) {
    std::cout << "kind,severity,point,from,to,intervals,first_seq,last_seq,V_b_m3_affected,E_MJ_affected,V_b_m3_difference,"
                 "E_MJ_difference,V_b_difference_ppm,difference_estimated,worst_ppm,alarm_time_s,V_fault_m3,difference_basis,detail\n";
    for (const auto& f : r.findings)
      std::cout << kind_name(f.kind) << ',' << severity_name(f.severity) << ',' << csv_field(f.point) << ','
                << t_or_empty(f.from_utc_s) << ',' << t_or_empty(f.to_utc_s) << ',' << f.intervals << ',' << f.first_seq << ','
                << f.last_seq << ',' << fixed(f.V_b_affected_m3, 6) << ',' << fixed(f.E_affected_MJ, 6) << ','
                << fixed(f.V_b_difference_m3, 6) << ',' << fixed(f.E_difference_MJ, 6) << ',' << fixed(f.V_b_difference_ppm(), 3) << ','
                << (f.difference_estimated ? "yes" : "no") << ',' << fixed(f.worst_ppm, 3) << ',' << f.alarm_time_s << ','
                << fixed(f.V_fault_m3, 6) << ',' << csv_field(f.difference_basis) << ',' << csv_field(f.detail) << '\n';
  } else {
    std::cout << "log        " << o.db << " (id " << r.log_id << "), " << r.records << " chained records up to seq " << r.head_seq
              << " (the audit's snapshot), head " << r.head_hash_hex << '\n';
    std::cout << "written by ";
    if (r.engine_versions.empty()) std::cout << "-: no intervals in the selection";
    for (std::size_t i = 0; i < r.engine_versions.size(); ++i)
      std::cout << (i ? "; " : "") << r.engine_versions[i].first << ": " << r.engine_versions[i].second << " interval(s)";
    std::cout << "\nreplayed   by " << record::engine_version()
              << (written_by_another_engine(r)
                      ? ", another engine version or revision than wrote the log: a difference may be due to the change"
                      : "")
              << '\n'
              << "intervals  " << t.intervals << " (" << t.replayed << " recomputed, " << t.not_replayed << " not)\n"
              << "base vol.  logged " << record::decimal(t.V_b_um3_logged, 6) << " m3, recomputed "
              << record::decimal(t.V_b_um3_replayed, 6) << " m3\n"
              << "energy     logged " << record::decimal(t.E_J_logged, 6) << " MJ, recomputed " << record::decimal(t.E_J_replayed, 6)
              << " MJ\n"
              << "largest    dZ_f " << fixed(t.max_dZ_f_ppm, 3) << " ppm, dZ_b " << fixed(t.max_dZ_b_ppm, 3) << " ppm, dC "
              << fixed(t.max_dC_ppm, 3) << " ppm, dV_b " << fixed(t.max_dV_b_ppm, 3) << " ppm, dE " << fixed(t.max_dE_ppm, 3)
              << " ppm\n"
              << "bar        " << t.over_bar << " interval(s) miss the " << recalculation_bar_ppm << " ppm recalculation bar\n";
    for (const auto& [iv, rp] : r.over_bar)
      std::cout << "  seq " << iv.seq << ' ' << iv.point << ' ' << record::format_time_utc(iv.start_utc_s) << "  Z_f "
                << fixed(iv.Z_f, 9) << " -> " << fixed(rp.Z_f, 9) << ", V_b " << fixed(iv.V_b_m3, 6) << " -> " << fixed(rp.V_b_m3, 6)
                << " m3 (" << (rp.estimated ? "~" : "") << fixed(rp.dV_b_ppm, 1) << " ppm), largest deviation " << fixed(rp.worst_ppm(), 1)
                << " ppm\n";
    if (r.over_bar_total > static_cast<std::int64_t>(r.over_bar.size()))
      std::cout << "  ... " << (r.over_bar_total - static_cast<std::int64_t>(r.over_bar.size())) << " more\n";
    if (r.what_if_run)
      std::cout << "what-if    " << r.what_if.replayed << " of " << r.what_if.intervals << " intervals recomputed: base volume "
                << record::decimal(r.what_if.V_b_um3_logged, 6) << " m3 logged, " << record::decimal(r.what_if.V_b_um3_replayed, 6)
                << " m3 what-if (" << record::decimal(r.what_if.V_b_um3_replayed - r.what_if.V_b_um3_logged, 6) << "); energy "
                << record::decimal(r.what_if.E_J_logged, 6) << " MJ logged, " << record::decimal(r.what_if.E_J_replayed, 6)
                << " MJ what-if (" << record::decimal(r.what_if.E_J_replayed - r.what_if.E_J_logged, 6) << ")\n"
                << "           " << r.what_if_combustion << '\n';
    if (r.what_if_run && r.what_if_steps.size() > 1)
      for (const auto& st : r.what_if_steps)
        std::cout << "           by cause: " << st.cause << ": V_b " << record::decimal(st.V_b_um3, 6) << " m3, energy "
                  << record::decimal(st.E_J, 6) << " MJ\n";
    if (!r.corrections.empty()) {
      std::cout << "corrected  base volume " << record::decimal(r.V_b_um3_as_recorded, 6) << " m3 as recorded, "
                << record::decimal(r.V_b_um3, 6) << " m3 corrected (" << record::decimal(r.V_b_um3 - r.V_b_um3_as_recorded, 6)
                << "); energy " << record::decimal(r.E_J_as_recorded, 6) << " MJ as recorded, " << record::decimal(r.E_J, 6)
                << " MJ corrected (" << record::decimal(r.E_J - r.E_J_as_recorded, 6) << ")\n";
      for (const auto& c : r.corrections)
        std::cout << "  correction set seq " << c.seq << ' ' << c.point << ' ' << t_or_empty(c.from_utc_s) << " .. " << t_or_empty(c.to_utc_s)
                  << ", " << c.intervals << " interval(s): " << c.change << "; V_b " << record::decimal(c.V_b_um3_replaced, 6) << " -> "
                  << record::decimal(c.V_b_um3_corrected, 6) << " m3, E " << record::decimal(c.E_J_replaced, 6) << " -> "
                  << record::decimal(c.E_J_corrected, 6) << " MJ\n      reason: " << c.reason << '\n';
      for (const auto& c : r.corrections)
        if (c.change.find("base_") != std::string::npos) {
          std::cout << "  (a set changes the base conditions: its volumes are at other base conditions, so the volume difference\n"
                       "   is mostly the change of reference; the energy compares directly)\n";
          break;
        }
    }
    if (r.findings.empty()) {
      std::cout << "result     nothing found\n";
    } else {
      const std::size_t notices = r.findings.size() - r.counting();
      std::cout << "result     " << r.findings.size() << " finding(s)";
      if (notices) std::cout << " (" << notices << " notice" << (notices == 1 ? "" : "s") << (clean ? ", nothing above a notice" : "") << ")";
      std::cout << "\n           affected = the logged figures of the records concerned; difference = recomputed or estimated minus\n"
                   "           logged (~ an estimate; negative: the log states too much), its ppm of the affected volume\n";
      for (const auto& f : r.findings) {
        std::cout << "  " << kind_name(f.kind) << " [" << severity_name(f.severity) << "] " << (f.point.empty() ? "-" : f.point) << ' '
                  << t_or_empty(f.from_utc_s) << " .. " << t_or_empty(f.to_utc_s) << ", " << f.intervals << " interval(s), seq "
                  << f.first_seq << ".." << f.last_seq << "\n      affected V_b " << fixed(f.V_b_affected_m3, 6) << " m3, E "
                  << fixed(f.E_affected_MJ, 6) << " MJ; difference V_b " << diff_text(f.V_b_difference_m3, f.difference_estimated)
                  << " m3";
        if (std::isfinite(f.V_b_difference_ppm())) std::cout << " (" << fixed(f.V_b_difference_ppm(), 1) << " ppm)";
        std::cout << ", E " << diff_text(f.E_difference_MJ, f.difference_estimated) << " MJ";
        if (f.kind == Kind::calc_difference) std::cout << "; largest deviation " << fixed(f.worst_ppm, 1) << " ppm";
        if (f.kind == Kind::alarm || f.kind == Kind::two_phase)
          std::cout << "\n      " << f.alarm_time_s << " s in alarm, fault volume " << fixed(f.V_fault_m3, 6) << " m3 (line)";
        std::cout << "\n      " << f.detail << "\n      difference: " << f.difference_basis << '\n';
      }
    }
    std::cout << '\n' << caution_text << '\n';
  }
  return clean ? exit_ok : exit_partial;
}

}  // namespace

void setup_audit(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<AuditCliOptions>();
  auto* sub = app.add_subcommand("audit", "Recompute an interval log and list what is wrong with it, with the volume and energy at stake");
  sub->add_option("--db", opt->db, "Interval log file")->required();
  sub->add_option("--point", opt->point, "Only this measurement point");
  sub->add_option("--from", opt->from, "Only intervals ending after this UTC time (2026-03-02T06:00:00Z)");
  sub->add_option("--to", opt->to, "Only intervals starting before this UTC time");
  sub->add_option("--contract", opt->contract,
                  "Contract file: key = value lines point, method, base_T, base_p, tolerance_ppm, dew_margin_K (see --help footer)");
  sub->add_option("--max-analysis-age", opt->max_age_h, "Largest allowed age of the gas analysis in force, hours")
      ->capture_default_str();
  sub->add_option("--tolerance-ppm", opt->tolerance_ppm, "Allowed recalculation difference, ppm (API 21.1 bar: 50)")
      ->capture_default_str();
  sub->add_option("--dew-margin", opt->dew_margin,
                  "near_dew_point findings: averaged line states less than this many kelvin above the hydrocarbon dew "
                  "temperature (default: the contract's dew_margin_K, else 5 K; 0 = none)");
  sub->add_option("--what-if-method", opt->wi_method, "What-if: recompute with this line method (totals side by side)");
  sub->add_option("--seal-key", opt->seal_key, "The key file the log was recorded with: a critical finding unless every seal is right "
                                             "and the log ends in one");
  sub->add_option("--expect-head", opt->expect_head,
                  "SEQ:HASH kept from an earlier run (record or verify print it): a critical finding unless that record is "
                  "still in the log with that hash");
  sub->add_option("--what-if-base-T", opt->wi_base_T, "What-if: base temperature, e.g. \"60 degF\"");
  sub->add_option("--what-if-base-p", opt->wi_base_p, "What-if: base pressure, absolute, e.g. \"14.73 psia\"");
  sub->add_option("--what-if-analysis", opt->wi_analysis, "What-if: use this gas_analysis record (seq) for every interval");
  sub->add_option("--what-if-combustion-ref", opt->wi_combustion,
                  "What-if: combustion reference of Hs: hold (as recorded), or 0, 15, 15.55, 20, 25 degC (default: see footer)");
  sub->add_option("--report", opt->report,
                  "Also write a self-contained HTML report (totals, findings, charts per point) to this file");
  add_format_option(*sub, opt->format);
  sub->footer(
      "\nFinding kinds: broken_chain, totals_mismatch, gap, overlap, duplicate, stale_analysis, contract_mismatch,\n"
      "outside_method_range, calc_difference, config_without_event, not_replayed, alarm, two_phase (a line state\n"
      "the GERG-2008 phase test finds two-phase: an alarm condition, critical), near_dew_point (an averaged line\n"
      "state less than the dew margin above the hydrocarbon dew temperature, warning; water is not assessed).\n"
      "Severities: notice (listed; leaves the exit status alone, e.g. an alarm the configuration handled as\n"
      "designed), warning, critical. Each finding has two figures of base volume and energy: affected (the\n"
      "logged figures of its records) and difference (recomputed or estimated minus logged, signed; estimates\n"
      "are marked and say how they were made; 'not known' where the log does not hold what is needed).\n"
      "A base-condition what-if keeps a stated Hs at its own combustion reference and computes a missing Hs at\n"
      "the reference usually paired with the new base temperature; --what-if-combustion-ref hold keeps the\n"
      "recorded one for every Hs, a temperature sets one. The energy difference is split by cause.\n"
      "Contract file example:\n  point = ST-1\n  method = gerg2008\n  base_T = 15 degC\n  base_p = 101.325 kPa\n  dew_margin_K = 5\n\n"
      "--report FILE.html writes one HTML file with no outside references (inline CSS and SVG charts of the replay\n"
      "deviation and the base volume over time); the normal output still goes to standard output.\n\n"
      "Exit status: 0 nothing above a notice, 1 warning or critical findings, 2 the log cannot be read.\n\n" +
      std::string(caution_text) + "\n\nExample:\n  zcorr audit --db station.db --contract contract.txt\n"
      "  zcorr audit --db station.db --report audit.html\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("audit", [&] { return run_audit_cmd(*opt); }); });
}

}  // namespace zcorr::cli
