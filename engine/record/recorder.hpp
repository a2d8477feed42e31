// zcorr recording: samples of one measurement point -> interval records,
// events, gas analyses, configuration records and hourly / daily quantity
// transaction records, appended to the log.
//
// Intervals are aligned to multiples of interval_s (UTC). A sample at time t
// belongs to the interval (start, start + interval_s] that contains t. An
// interval is written when a sample at or after its end has been read; the
// rows of an incomplete last interval are left for the next run (which skips
// every row at or before the end of the last recorded interval, so a
// recording can be stopped, killed or restarted on overlapping input).
//
// Flush policy: one write transaction per `batch_intervals` intervals (and
// the records that belong with them); the last batch is committed by
// finish(). Events found in an interval (alarms, bad rows, gaps) are written
// just before that interval, in the same transaction, so a killed process
// loses at most the uncommitted batch, and the next run recomputes it from
// the same input.
//
// Hourly records: one per local clock hour, plus one at every configuration
// change (the hour is closed early). Daily records: one per contract day.
// Both are written as soon as their last interval is.
#pragma once

#include <cstdint>
#include <deque>
#include <string>
#include <vector>

#include "eval/line_method.hpp"
#include "record/config.hpp"
#include "record/input.hpp"
#include "record/interval_calc.hpp"
#include "record/log.hpp"

namespace zcorr::record {

struct RecordOptions {
  std::int64_t batch_intervals = 100;  // intervals per transaction
  EvalOptions eval{};
  std::string input_name = "-";        // for the recording_start event
};

struct RecordStats {
  std::int64_t rows = 0;              // sample rows read
  std::int64_t skipped = 0;           // rows at or before the last recorded interval (already recorded)
  std::int64_t bad_rows = 0;          // rows logged as bad_input events
  std::int64_t intervals = 0, hours = 0, days = 0, events = 0, analyses = 0, configs = 0, commits = 0;
  std::int64_t rows_left = 0;         // rows of an incomplete last interval, left for the next run
  std::int64_t last_end_utc_s = 0;    // end of the last recorded interval
  std::int64_t read_back = 0;         // records read back and checked after the last commit (Log::recheck_appended)
};

class Recorder {
 public:
  // Reads the point's state from the log (last configuration, analysis,
  // interval, open hour and day, register readings).
  Recorder(Log& log, const PointConfig& cfg, LineMethod& method, const RecordOptions& opt = {});
  Recorder(const Recorder&) = delete;
  Recorder& operator=(const Recorder&) = delete;

  // Analyses in time order; those already in the log are recognised.
  void add_analyses(const std::vector<AnalysisInput>& analyses);
  // A row of the analysis file that was refused.
  void add_bad_analysis(const BadRow& bad);
  void add_sample(const RawSample& s);
  void add_bad_row(const BadRow& bad);
  // Feeds every sample and bad row of the reader, in order (finish() not included).
  void feed(SampleReader& reader);
  // Commits what is complete; the rows of an incomplete last interval are left.
  void finish();
  [[nodiscard]] const RecordStats& stats() const noexcept { return stats_; }

 private:
  struct Registers {
    std::int64_t V_f = 0, V_b = 0, V_fault = 0, E = 0, m = 0;
  };
  struct Period {
    bool open = false;
    std::int64_t start = 0, n = 0, flow_s = 0, alarm_s = 0, flags = 0;
    Registers sum;
    double wp = 0, wT = 0, w = 0, tp = 0, tT = 0, tw = 0;  // flow-weighted and plain sums
  };

  void load_state();
  void ensure_tx();
  void maybe_commit();
  void event(std::int64_t t, std::string kind, std::string severity, std::string detail, std::int64_t line = 0,
             std::int64_t ref_seq = 0, double value = nan_v, double limit = nan_v);
  void flush_pending_events();
  void open_interval(std::int64_t start);
  void close_interval();
  void close_periods_before(std::int64_t t);
  void write_period(bool hour, std::int64_t end);
  void set_gas(const Fractions<double>& x, double Hs, std::int64_t seq);
  void add_to_periods(std::int64_t start, std::int64_t end, std::int64_t flow_s, std::int64_t alarm_s, const Registers& r,
                      double p, double T, double V_f, std::int64_t flags);

  Log& log_;
  PointConfig cfg_;
  LineMethod& method_;
  RecordOptions opt_;
  RecordStats stats_;

  std::int64_t config_seq_ = 0;       // 0: not yet written in this log
  bool config_pending_ = false;       // the configuration must be (re)written at the next interval
  std::vector<std::string> config_changes_;
  std::int64_t last_end_ = INT64_MIN; // end of the last recorded interval
  std::int64_t prev_t_ = INT64_MIN;   // time of the previous sample
  bool started_ = false;

  GasInForce gas_;
  Fractions<double> gas_x_{};
  bool have_gas_x_ = false;
  std::int64_t last_analysis_from_ = INT64_MIN;
  std::deque<AnalysisInput> analyses_;

  bool alarm_ = false;                // conversion currently stopped by an input alarm
  std::string alarm_cause_;
  bool calc_bad_ = false;
  bool two_phase_ = false;            // the last interval had a two-phase line state

  bool in_interval_ = false;
  std::int64_t cur_start_ = 0, cur_end_ = 0, cur_flags_ = 0, cur_rows_ = 0;
  std::vector<Sample> cur_;
  std::vector<std::vector<Value>> pending_events_;
  std::vector<AnalysisInput> cur_analyses_;  // analyses coming into force with the open interval
  bool apply_config_ = false;                // write the configuration with the open interval
  bool no_gas_reported_ = false;
  bool skipping_ = true;                     // still reading rows that were recorded before
  std::int64_t hour_floor_ = INT64_MIN;      // end of the last hourly record

  Period hour_, day_;
  Registers cum_;
  std::int64_t since_commit_ = 0;
  std::vector<Value> row_;
};

}  // namespace zcorr::record
