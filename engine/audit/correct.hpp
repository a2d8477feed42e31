// zcorr correct: a what-if recomputation written to the log as a correction
// set (schema/003_correction_sets.sql), never changing a logged record.
//
// For one point and an optional time range, every interval that no later
// correction replaces is recomputed by the replay (audit/replay.hpp) with the
// changes asked for (method, base conditions, gas analysis), and written as a
// new interval record with corrects_seq = the record it replaces and
// correction_reason = "correction set: <reason>". When the method or the base
// conditions change, each configuration in force gets a correcting
// point_config record (corrects_seq = that configuration) and its
// config_change event, and the new intervals name it; a changed analysis is
// named by the new intervals' analysis_seq. The correction_set record comes
// last and states the change, the reason, the records written and the totals
// before and after. Everything is one transaction: a set is written whole or
// not at all (a failure, a refused state or a killed process leaves the log
// as it was).
//
// Refused (io::InputError, nothing written): no reason, no change, no
// interval to correct, an unknown method, an analysis that is not a
// gas_analysis record of the point, a log that does not verify, an interval
// the replay cannot recompute, a state the method refuses or an analysis it
// cannot use where the record had neither problem, a recomputation that
// converts nothing where the record converted volume.
// An interval whose conversion was stopped as logged (fault volume) keeps
// its fault volume and the flags that say why: the log has no samples to
// convert it from; CorrectionOutcome::unconverted counts them.
#pragma once

#include <cstdint>
#include <filesystem>
#include <functional>
#include <optional>
#include <string>

#include "audit/audit.hpp"
#include "audit/replay.hpp"

namespace zcorr::audit {

struct CorrectionRequest {
  std::string point;                           // required
  std::optional<std::int64_t> from_utc_s;      // intervals ending after
  std::optional<std::int64_t> to_utc_s;        // intervals starting before
  WhatIf change;                               // at least one change
  std::string reason;                          // required: why (in every correcting record)
  std::vector<std::uint8_t> seal_key;          // when the log is sealed: the key, to seal the correction set
  std::function<void(std::int64_t done, std::int64_t total)> progress;
};

struct CorrectionOutcome {
  CorrectionSetSummary set;     // seq = the correction_set record
  std::int64_t first_seq = 0;   // first record written
  std::int64_t configs = 0;     // correcting configurations written
  std::int64_t unconverted = 0; // intervals with line volume and, as logged, none converted (they stay so)
};

// Opens the log for writing (the single writer; it must exist) and appends the set.
[[nodiscard]] CorrectionOutcome write_correction_set(const std::filesystem::path& file, const CorrectionRequest& req,
                                                     MethodFactory methods);

// "method detail; base_T 288.706 K; base_p 101560 Pa; analysis seq 22"
[[nodiscard]] std::string describe_change(const WhatIf& w);

}  // namespace zcorr::audit
