-- zcorr interval log, migration 002: indexes for reading a point's records
-- by time (resume after a stop, replay of a time range). No data changes.
CREATE INDEX interval_point_start ON interval (point, start_utc_s);
CREATE INDEX qtr_point_period_end ON qtr (point, period, end_utc_s);
CREATE INDEX gas_analysis_point_valid ON gas_analysis (point, valid_from_utc_s);
