// zcorr audit: everything wrong with an interval log, each finding with the
// intervals it concerns, a severity, and two figures of base volume and
// energy: the amount *affected* and the *difference*.
//
// Finding kinds (kind_name()):
//   broken_chain         the hash chain does not hold (record changed, removed, inserted,
//                        link broken, bad correction) -- from record::verify_log
//   totals_mismatch      an interval register or a quantity transaction record's totals
//                        do not add up -- from record::verify_log
//   gap                  time between two intervals of a point with no interval, or an
//                        interval the recorder flagged for missing data
//   overlap              an interval starting before the previous one of the point ended
//   duplicate            a second interval with the same start and end (not a correction)
//   stale_analysis       the gas analysis in force is older than the allowed age
//   contract_mismatch    base conditions or method differ from the contract file
//   outside_method_range the averaged state lies outside the method's normal range
//                        (expanded range, extrapolated, or refused)
//   calc_difference      the replay differs from the log beyond the tolerance (ppm)
//   config_without_event a configuration record with no matching config_change event
//   not_replayed         an interval that could not be recomputed (unknown method, missing record)
//   alarm                intervals with the conversion stopped (an input out of range or
//                        unreadable, a state the method refused, no usable analysis): their
//                        duration, fault volume and the base volume a substitution would give
//   two_phase            intervals with a line state the GERG-2008 phase test finds two-phase
//                        (logged by the recorder, iflag::two_phase, or found again at the
//                        averaged state): an alarm condition, critical
//   near_dew_point       intervals whose averaged line state, recomputed, lies less than the
//                        dew margin above the hydrocarbon dew temperature at its pressure
//                        (single-phase, converted): a warning
// The phase check runs on the analysis in force with every method (GERG-2008 on that
// analysis, water left out). The dew margin: AuditOptions::dew_margin_K (zcorr audit
// --dew-margin), else the contract's dew_margin_K for the points it applies to, else each
// point configuration's dew_margin_K (5 K, EvalOptions::default_dew_margin_K, in one
// written before schema 7).
// Consecutive intervals with the same kind and cause form one finding.
//
// The two figures of every finding (base volume V_b in m3 and energy in MJ):
//  * affected: the logged volume and energy of the records the finding concerns
//    (a gap concerns none: 0);
//  * difference: signed, recomputed or estimated minus logged: what the log
//    over- (negative) or under- (positive) states. NaN when the log does not
//    hold what is needed to say (difference_basis says why). Estimates are
//    marked (difference_estimated) and say how they were made:
//      calc_difference  recomputed minus logged (per_sample intervals: an
//                       estimate from the averages, see replay.hpp)
//      gap              the flow on either side times the missing time; 0
//                       where the meter reading after the gap carries the volume
//      duplicate        minus the duplicate's own volume (counted twice)
//      overlap          minus the overlapping share of the later interval
//      contract_mismatch the intervals recomputed to the contract's method and
//                       base conditions, minus logged
//      totals_mismatch  the sum of the intervals minus the record's total
//      alarm            the fault volume times the conversion factor of the
//                       last converting interval before it (a substitution)
//      two_phase        the same substitution for its fault volume (the converted
//                       volume of a two-phase state has no recomputation to compare with)
//      near_dew_point   0 (converted as logged; the finding says what is at stake)
//
// Severity: notice (listed, leaves the exit status alone: an alarm the
// configuration handled as designed), warning, critical.
//
// Contract file (our own format): `key = value` lines, '#' comments.
//   point   = ID           the point it applies to (absent: every point)
//   method  = NAME         required line method (gerg2008, detail, ...)
//   base_T  = 15 degC      contractual base temperature (units as in the point configuration)
//   base_p  = 101.325 kPa  contractual base pressure, absolute
//   tolerance_ppm = 1      allowed relative difference of base_T and base_p (default 1 ppm)
//   dew_margin_K  = 5      near_dew_point margin above the hydrocarbon dew temperature, kelvin
//                          (0 to 50; default 5 K)
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "audit/replay.hpp"
#include "record/verify.hpp"

namespace zcorr::audit {

enum class Kind {
  broken_chain,
  totals_mismatch,
  gap,
  overlap,
  duplicate,
  stale_analysis,
  contract_mismatch,
  outside_method_range,
  calc_difference,
  config_without_event,
  not_replayed,
  alarm,
  two_phase,
  near_dew_point
};
inline constexpr std::size_t kind_count = 14;
[[nodiscard]] std::string_view kind_name(Kind k) noexcept;

enum class Severity { notice, warning, critical };
[[nodiscard]] std::string_view severity_name(Severity s) noexcept;

struct AuditFinding {
  Kind kind{};
  Severity severity = Severity::warning;
  std::string point;             // empty when not tied to a point
  std::int64_t from_utc_s = 0;   // interval range [from, to); 0/0 when unknown
  std::int64_t to_utc_s = 0;
  std::int64_t intervals = 0;    // intervals concerned
  std::int64_t first_seq = 0;    // first record concerned
  std::int64_t last_seq = 0;
  double V_b_affected_m3 = 0;    // logged base volume of the records concerned
  double E_affected_MJ = 0;      // their logged energy
  double V_b_difference_m3 = nan_v;  // recomputed or estimated minus logged; NaN = not known
  double E_difference_MJ = nan_v;
  bool difference_estimated = false;
  std::string difference_basis;  // how the difference was obtained, or why it is not known
  double worst_ppm = 0;          // calc_difference: the largest deviation of Z_f, Z_b, C, V_b or energy
  std::int64_t alarm_time_s = 0; // alarm: time with the conversion stopped
  double V_fault_m3 = 0;         // alarm, two_phase: line volume counted in the fault register
  std::string detail;
  // The differences in ppm of the affected figures (NaN when either is not known or nothing is affected).
  [[nodiscard]] double V_b_difference_ppm() const noexcept;
  [[nodiscard]] double E_difference_ppm() const noexcept;
  [[nodiscard]] bool counts() const noexcept { return severity != Severity::notice; }  // for the exit status
};

struct Contract {
  std::optional<std::string> point;
  std::optional<std::string> method;
  std::optional<double> base_T_K, base_p_Pa;
  double tolerance_ppm = 1.0;
  std::optional<double> dew_margin_K;  // near_dew_point margin, kelvin
};
// Throws io::InputError naming the line.
[[nodiscard]] Contract parse_contract(std::string_view text, std::string_view source);
[[nodiscard]] Contract load_contract(const std::string& path);

// A correction set of the log (schema/003): what-if results written as new
// interval records that name the records they replace. Totals over the
// correcting intervals in the selection.
struct CorrectionSetSummary {
  std::int64_t seq = 0;               // the correction_set record
  std::string point, reason, change;  // change: what was recomputed differently ("base_p 101560 Pa; method detail")
  std::int64_t created_utc_s = 0, from_utc_s = 0, to_utc_s = 0;
  std::int64_t intervals = 0;
  std::int64_t V_b_um3_replaced = 0, E_J_replaced = 0;    // the records the set replaces
  std::int64_t V_b_um3_corrected = 0, E_J_corrected = 0;  // the set's own records
};

struct AuditOptions {
  Selection selection;
  std::optional<Contract> contract;
  double max_analysis_age_h = 840;     // 35 days (common practice: a monthly spot sample, with margin)
  double tolerance_ppm = recalculation_bar_ppm;
  // The near_dew_point margin in kelvin; unset: the contract's, else EvalOptions::default_dew_margin_K.
  std::optional<double> dew_margin_K;
  std::size_t max_chain_findings = 1000;
  // A head kept outside the log (record::Anchor): the verifier's findings say when the log no longer holds it.
  std::optional<record::Anchor> expected_head;
  // The key the log was sealed with (record/seal.hpp): the verifier checks every seal and the head's.
  std::vector<std::uint8_t> seal_key;
  WhatIf what_if;        // when any() is set: a second replay with these changes, totals side by side
  bool parallel = true;  // check the chain on a second connection in a second thread while replaying
  // Called for every interval of the selection as it is replayed, in (point,
  // start, seq) order. `effective` is false for a record that a later
  // correction replaces (it is then not part of the log's totals).
  std::function<void(const LoggedInterval&, const IntervalReplay&, bool effective)> observe;
  // Called now and then while replaying: intervals done, intervals in the
  // selection (counted first when this is set). Last call: done == total.
  std::function<void(std::int64_t done, std::int64_t total)> progress;
};

// The what-if's total changes split into their causes: the changes applied
// one after the other (method, analysis, base conditions with the combustion
// reference held, then the combustion reference), each step's totals minus
// the step before.
struct WhatIfStep {
  std::string cause;               // "method detail", "base conditions", "combustion reference", ...
  std::int64_t V_b_um3 = 0, E_J = 0;  // the step's change
};

struct AuditResult {
  std::vector<AuditFinding> findings;
  // Findings above a notice (they set the exit status).
  [[nodiscard]] std::size_t counting() const noexcept;
  ReplayTotals replay;
  std::int64_t records = 0;          // chained records checked
  double dew_margin_K = EvalOptions::default_dew_margin_K;  // the near_dew_point margin used (the contract's point: see dew_margin_source)
  std::string dew_margin_source = "default";                // "option", "contract", "point configuration ..." or "default"

  std::int64_t head_seq = 0;         // the snapshot: every record read is at or before this chain position
  std::string log_id;
  std::string head_hash_hex;
  // The log's own totals (every interval that is not corrected) in the selection.
  std::int64_t V_b_um3 = 0, E_J = 0;
  // The totals as first recorded (every interval that is not itself a
  // correction), and the correction sets; with no correction both equal V_b_um3 / E_J.
  std::int64_t V_b_um3_as_recorded = 0, E_J_as_recorded = 0;
  std::vector<CorrectionSetSummary> corrections;
  std::vector<std::pair<LoggedInterval, IntervalReplay>> over_bar;  // at most 100 intervals missing the bar, for the report
  std::int64_t over_bar_total = 0;
  bool what_if_run = false;
  std::string what_if_combustion;    // which combustion reference the what-if uses, in words
  std::vector<WhatIfStep> what_if_steps;
  ReplayTotals what_if;  // V_b_um3_logged / E_J_logged: as logged; *_replayed: with the what-if changes
  // The engine versions that wrote the intervals of the selection, as
  // record::describe_engine_version() states them ("zcorr 0.1.0 (revision
  // unknown)" for a log written before revisions were recorded), each with
  // its number of intervals, in the order they first appear in the log.
  std::vector<std::pair<std::string, std::int64_t>> engine_versions;
};

// Whether an engine version other than this one (record::engine_version())
// wrote some of the intervals: the replay then says so.
[[nodiscard]] bool written_by_another_engine(const AuditResult& r);

// Runs every check. Throws record::LogError when the log cannot be read.
[[nodiscard]] AuditResult run_audit(const record::Log& log, const AuditOptions& opt, MethodFactory methods);

}  // namespace zcorr::audit
