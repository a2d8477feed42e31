// zcorr interval log: verification of the hash chain and of the totals.
//
// Reads every chained record in seq order (a merge over the tables), and
//  * checks that seq runs 1, 2, 3 ... without gaps or duplicates (a removed
//    or inserted record), that prev_hash equals the stored hash of the record
//    before (a link broken by a change that was re-hashed), and that the
//    stored hash equals SHA-256(prev_hash || canonical bytes) (a changed row);
//  * checks each interval's registers against its own computed quantities
//    (V_f_um3 = round(V_f_m3 / 1e-6 m3), ...), and every quantity transaction
//    record against the intervals before it: period totals equal the sums of
//    the intervals since the previous record of the same period, register
//    readings equal the running sums since the point's first interval, and
//    those intervals lie inside the period;
//  * checks that a correction (corrects_seq set) names an earlier record of
//    its own table and says why. Corrected records are left out of the
//    running totals here; the audit totals original and corrected sets.
// The first finding names the first bad row (table, seq, time).
// Streamed: memory does not grow with the log.
//
// Limits: a hash chain without a secret key proves the log is internally
// consistent; someone who rewrites every record after a change and
// re-hashes all of them produces a consistent chain. Compare the head hash
// (printed by `zcorr verify`) with a copy kept elsewhere to detect that, and
// removal of the most recent records.
#pragma once

#include <cstdint>
#include <limits>
#include <map>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "record/log.hpp"

namespace zcorr::record {

struct Finding {
  std::string table;   // where the bad record is
  std::int64_t seq;    // its chain position (= rowid)
  std::int64_t time_utc_s;  // its start or event time, or 0 when it has none
  std::string kind;    // changed, link_broken, removed, inserted, register_mismatch, total_mismatch, ...
  std::string detail;  // human-readable
  // totals_mismatch / register_mismatch: what the record's base volume and
  // energy should be minus what it says (the sum of its intervals minus its
  // total; a register's own quantity minus the register), in register units.
  std::optional<std::int64_t> V_b_um3_difference, E_J_difference;
};

struct PointTotals {
  std::int64_t intervals = 0;
  std::int64_t V_f_um3 = 0, V_b_um3 = 0, V_fault_um3 = 0, E_J = 0, mass_mg = 0;
};

struct VerifyResult {
  int schema_version = 0;
  std::string log_id;
  std::int64_t records = 0;
  std::int64_t last_seq = 0;
  Digest head_hash{};
  std::map<std::string, std::int64_t> per_table;
  std::map<int, std::int64_t> per_encoding;  // records by the canonical encoding they name (the record kept at each seq)
  std::string created_by;                    // the log header's engine_version (record::describe_engine_version)
  std::map<std::string, PointTotals> points;
  std::int64_t seals = 0;          // seal records (checked only when a key was given)
  std::int64_t last_seal_seq = 0;  // the newest seal's chain position (0: none)
  std::int64_t last_seal_utc_s = 0;
  bool seals_checked = false;      // a key was given: every seal's MAC was checked
  std::vector<Finding> findings;  // in chain order, at most max_findings
  std::int64_t findings_total = 0;
};

// A chain position and the hash its record had, kept outside the log (the
// head printed by `zcorr record` or `zcorr verify`): the log must still hold
// that record with that hash. It catches what the chain alone cannot: the
// newest records removed, the chain re-hashed from a point, a whole log forged.
struct Anchor {
  std::int64_t seq = 0;
  Digest hash{};
};
// Parses "SEQ:HASH" (HASH: 64 hex digits, as printed); throws io::InputError naming `field`.
[[nodiscard]] Anchor parse_anchor(std::string_view text, std::string_view field);

// head_seq: verify only the records up to that chain position (the audit's
// snapshot: the log is append-only, so the records up to a head it read once
// are one consistent prefix, whatever a writer appends meanwhile).
// anchor: the record it names must be in the log with its hash (findings
// anchor_mismatch, or removed when the log ends before it).
// seal_key: the key the log's writer sealed it with (record/seal.hpp): every
// seal's MAC must be right (seal_mismatch), the log must hold seals
// (unsealed) and end in one (unsealed_head: records after the last seal).
[[nodiscard]] VerifyResult verify_log(const Log& log, std::size_t max_findings = 50,
                                      std::int64_t head_seq = std::numeric_limits<std::int64_t>::max(),
                                      const std::optional<Anchor>& anchor = std::nullopt,
                                      std::span<const std::uint8_t> seal_key = {});
// The highest chain position in the log (0 when it holds none).
[[nodiscard]] std::int64_t head_seq(const Log& log);

}  // namespace zcorr::record
