-- zcorr interval log, migration 003: correction sets.
--
-- A correction set is a what-if recomputation written to the log (zcorr
-- correct): for every interval of a point and time range, a new interval
-- record whose corrects_seq names the record it replaces, recomputed with
-- another method, base condition or gas analysis. When the method or the base
-- conditions change, a new point_config record corrects each configuration
-- in force (corrects_seq = the configuration it corrects), with its
-- config_change event. Nothing already logged changes. The correction_set
-- record is written last, in the same transaction as the records it covers,
-- and states what was changed, why, the chain positions it wrote and the
-- totals before and after.
CREATE TABLE correction_set (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT NOT NULL,        -- measurement point id
  created_utc_s     INTEGER NOT NULL,     -- when the set was written (wall clock), Unix s UTC
  from_utc_s        INTEGER NOT NULL,     -- first corrected interval start, Unix s UTC
  to_utc_s          INTEGER NOT NULL,     -- last corrected interval end, Unix s UTC
  reason            TEXT NOT NULL,        -- why (required, free text)
  method            TEXT,                 -- the method used instead, or NULL (unchanged)
  base_T_K          REAL,                 -- the base temperature used instead, K, or NULL
  base_p_Pa         REAL,                 -- the base pressure used instead, Pa absolute, or NULL
  analysis_seq      INTEGER,              -- the gas_analysis used for every interval instead, or NULL
  first_seq         INTEGER NOT NULL,     -- first record the set wrote (configurations, events, intervals)
  last_seq          INTEGER NOT NULL,     -- last record the set wrote before this one
  intervals         INTEGER NOT NULL,     -- correcting interval records
  V_b_um3_replaced  INTEGER NOT NULL,     -- sum of V_b_um3 of the records replaced, 1e-6 m3
  E_J_replaced      INTEGER NOT NULL,     -- sum of E_J of the records replaced, J
  V_b_um3_corrected INTEGER NOT NULL,     -- sum of V_b_um3 of the correcting records, 1e-6 m3
  E_J_corrected     INTEGER NOT NULL,     -- sum of E_J of the correcting records, J
  engine_version    TEXT NOT NULL,        -- zcorr version that computed it
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

CREATE TRIGGER correction_set_no_update BEFORE UPDATE ON correction_set BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER correction_set_no_delete BEFORE DELETE ON correction_set BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;

-- Which records are replaced (the audit's effective set), without a scan.
CREATE INDEX interval_corrects ON interval (corrects_seq) WHERE corrects_seq IS NOT NULL;
