-- zcorr interval log, migration 005: the maximum flow of a measurement point.
--
-- max_flow_m3_per_h: the largest indicated flow rate (m3/h at line conditions,
-- after the meter factor) the point's meter can pass. A sample whose volume
-- increment exceeds max_flow_m3_per_h * interval_s / 3600 is refused as bad
-- input (event bad_input, interval flag bad_input): its volume enters no
-- register. NULL in a configuration written before 005 (read as the default,
-- 1e6 m3/h). Added in canonical encoding version 3. No row is updated.
ALTER TABLE point_config ADD COLUMN max_flow_m3_per_h REAL;  -- m3/h, indicated volume after the meter factor
