// zcorr verify: checks an interval log's hash chain and totals. Exit 0
// clean, 1 findings (the first names the first bad row), 2 unreadable log.
#include <iostream>
#include <limits>
#include <optional>
#include <memory>

#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "common.hpp"
#include "record/quantities.hpp"
#include "record/timeutil.hpp"
#include "record/seal.hpp"
#include "record/verify.hpp"

namespace zcorr::cli {
namespace {

struct VerifyOptions {
  std::string db;
  Format format = Format::text;
  std::size_t max_findings = 20;
  std::string expect_head, seal_key;
};

int run_verify(const VerifyOptions& o) {
  using namespace zcorr::record;
  VerifyResult r;
  std::optional<Anchor> anchor;
  if (!o.expect_head.empty()) anchor = parse_anchor(o.expect_head, "--expect-head");
  std::vector<std::uint8_t> key;
  if (!o.seal_key.empty()) key = load_seal_key(o.seal_key, "--seal-key");
  try {
    Log log(o.db, {OpenMode::read_only});
    r = verify_log(log, o.max_findings, std::numeric_limits<std::int64_t>::max(), anchor, key);
  } catch (const LogError& e) {
    std::cerr << "zcorr verify: " << e.what() << '\n';
    return exit_unusable;
  }
  const bool clean = r.findings_total == 0;
  if (o.format == Format::json) {
    nlohmann::json j;
    j["db"] = o.db;
    j["caution"] = caution_line;
    j["schema_version"] = r.schema_version;
    j["log_id"] = r.log_id;
    j["records"] = r.records;
    j["head_seq"] = r.last_seq;
    j["head_hash"] = to_hex(r.head_hash);
    j["seals"] = r.seals;
    j["seals_checked"] = r.seals_checked;
    j["last_seal_seq"] = r.last_seal_seq;
    if (anchor) j["expected_head"] = std::to_string(anchor->seq) + ":" + to_hex(anchor->hash);
    j["tables"] = r.per_table;
    j["created_by"] = r.created_by;
    for (const auto& [k, n] : r.per_encoding) j["encodings"][k ? "zcorr.record.v" + std::to_string(k) : std::string("unknown")] = n;
    for (const auto& [name, p] : r.points)
      j["points"][name] = {{"intervals", p.intervals}, {"V_f_m3", decimal(p.V_f_um3, 6)}, {"V_b_m3", decimal(p.V_b_um3, 6)},
                           {"V_fault_m3", decimal(p.V_fault_um3, 6)}, {"E_MJ", decimal(p.E_J, 6)}, {"mass_kg", decimal(p.mass_mg, 6)}};
    j["findings_total"] = r.findings_total;
    j["findings"] = nlohmann::json::array();
    for (const auto& f : r.findings)
      j["findings"].push_back({{"table", f.table}, {"seq", f.seq}, {"time", f.time_utc_s ? format_time_utc(f.time_utc_s) : ""},
                               {"kind", f.kind}, {"detail", f.detail}});
    std::cout << json_text(j) << '\n';
  } else {
    std::cout << "log       " << o.db << " (schema " << r.schema_version << ", id " << r.log_id << ")\n"
              << "records   " << r.records << " (";
    bool first = true;
    for (const auto& [t, n] : r.per_table) {
      std::cout << (first ? "" : ", ") << t << ' ' << n;
      first = false;
    }
    std::cout << ")\n"
              << "encoding  ";
    first = true;
    for (const auto& [k, n] : r.per_encoding) {
      std::cout << (first ? "" : ", ") << (k ? "zcorr.record.v" + std::to_string(k) : std::string("unknown")) << ' ' << n;
      first = false;
    }
    std::cout << (r.created_by.empty() ? std::string() : "; log created by " + r.created_by) << '\n'
              << "head      seq " << r.last_seq << ", hash " << to_hex(r.head_hash) << '\n';
    if (r.seals > 0 || r.seals_checked)
      std::cout << "seals     " << r.seals
                << (r.seals ? ", the last at seq " + std::to_string(r.last_seal_seq) + " (" + format_time_utc(r.last_seal_utc_s) + ")"
                            : std::string())
                << (r.seals_checked ? "; checked with the key given" : "; not checked (no --seal-key)") << '\n';
    if (anchor) {
      bool bad = false;
      for (const auto& f : r.findings) bad |= f.kind == "anchor_mismatch" || (f.kind == "removed" && f.seq < anchor->seq);
      std::cout << "expected  seq " << anchor->seq << ", hash " << to_hex(anchor->hash)
                << (bad ? ": NOT in the log as it was (see the findings)" : ": in the log, as it was") << '\n';
    }
    for (const auto& [name, p] : r.points)
      std::cout << "point     " << name << ": " << p.intervals << " intervals, V_b " << decimal(p.V_b_um3, 6) << " m3, V_f "
                << decimal(p.V_f_um3, 6) << " m3, fault " << decimal(p.V_fault_um3, 6) << " m3, energy " << decimal(p.E_J, 6)
                << " MJ\n";
    if (clean) {
      std::cout << "result    clean: the chain is unbroken and every total adds up\n";
    } else {
      const auto& f0 = r.findings.front();
      std::cout << "result    " << r.findings_total << " finding(s); first bad row: " << f0.table << " seq " << f0.seq
                << (f0.time_utc_s ? " (" + format_time_utc(f0.time_utc_s) + ")" : std::string()) << '\n';
      for (const auto& f : r.findings)
        std::cout << "  " << f.kind << "  " << f.table << " seq " << f.seq << ": " << f.detail << '\n';
      if (r.findings_total > static_cast<std::int64_t>(r.findings.size()))
        std::cout << "  ... " << (r.findings_total - static_cast<std::int64_t>(r.findings.size())) << " more\n";
    }
    std::cout << caution_line << '\n';
  }
  return clean ? exit_ok : exit_partial;
}

}  // namespace

void setup_verify(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<VerifyOptions>();
  auto* sub = app.add_subcommand("verify", "Check an interval log's hash chain and totals; name the first bad row");
  sub->add_option("--db", opt->db, "Interval log file")->required();
  sub->add_option("--max-findings", opt->max_findings, "Findings to list")->capture_default_str();
  sub->add_option("--seal-key", opt->seal_key,
                  "The key file the log was recorded with: every seal's MAC is checked and the log must end in a seal "
                  "(catches truncation, re-hashing and a forged log)");
  sub->add_option("--expect-head", opt->expect_head,
                  "SEQ:HASH kept from an earlier run (record or verify print it): that record must still be in the log with "
                  "that hash; catches the newest records removed, a re-hashed chain, a forged log");
  add_format_option(*sub, opt->format);
  sub->footer("\nExit status: 0 clean, 1 findings, 2 the log cannot be read.\n"
              "Keep a copy of the printed head (seq and hash) elsewhere, away from the log: a later\n"
              "`zcorr verify --expect-head SEQ:HASH` proves that nothing up to it was removed or rewritten.\n\nExample:\n  zcorr verify --db station.db\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("verify", [&] { return run_verify(*opt); }); });
}

}  // namespace zcorr::cli
