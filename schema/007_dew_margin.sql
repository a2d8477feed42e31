-- zcorr interval log, migration 007: the dew-point margin of a measurement point.
--
-- dew_margin_K: a converted line state less than this many kelvin above the
-- hydrocarbon dew temperature at its pressure (GERG-2008 on the analysis in
-- force) is flagged near_dew_point (interval flag bit 13). NULL in a
-- configuration written before 007 (read as the default, 5 K). Added in
-- canonical encoding version 4. No row is updated.
ALTER TABLE point_config ADD COLUMN dew_margin_K REAL;  -- K, 0 to 50
