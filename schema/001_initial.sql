-- zcorr interval log, migration 001: the initial schema.
--
-- Conventions (see schema/README.md for the canonical record encoding):
--   * times are INTEGER Unix seconds, UTC (`*_utc_s`); resolution 1 s;
--   * units live in column names (`_Pa`, `_K`, `_m3`, `_MJ`, `_kg`, `_s`);
--   * register quantities are exact integers at a fixed resolution:
--     `_um3` = 1e-6 m3 (one cubic centimetre), `_J` = 1 J, `_mg` = 1e-6 kg;
--     each interval's value is rounded once (half away from zero) from the
--     computed double, and every total is an integer sum of those;
--   * every chained table starts with `seq` (the record's position in the
--     log's single hash chain, unique across all chained tables, 1, 2, 3 ...)
--     and ends with `prev_hash` and `hash` (SHA-256, 32 bytes each):
--       hash = SHA-256(prev_hash || canonical bytes of the record);
--   * chained records are never updated or deleted (triggers below refuse it);
--     a correction is a new record whose `corrects_seq` names the one it
--     corrects and whose `correction_reason` says why.

-- The schema version: one row per applied migration (never updated).
CREATE TABLE schema_version (
  version        INTEGER PRIMARY KEY,  -- migration number, NNN of schema/NNN_*.sql
  name           TEXT NOT NULL,        -- migration file name
  applied_utc_s  INTEGER NOT NULL,     -- when it was applied, Unix s UTC
  engine_version TEXT NOT NULL         -- zcorr version that applied it
) STRICT;

-- First record of every log: identifies the log and states its resolutions.
CREATE TABLE log_header (
  seq               INTEGER PRIMARY KEY,  -- chain position (always 1)
  log_id            TEXT NOT NULL,        -- random 128-bit id, hex
  created_utc_s     INTEGER NOT NULL,     -- creation time, Unix s UTC
  engine_version    TEXT NOT NULL,        -- zcorr version that created the log
  hash_scheme       TEXT NOT NULL,        -- canonical encoding + digest, 'zcorr.record.v1/sha256'
  volume_quantum_m3 REAL NOT NULL,        -- resolution of *_um3 registers, m3 (1e-6)
  energy_quantum_J  REAL NOT NULL,        -- resolution of *_J registers, J (1)
  mass_quantum_kg   REAL NOT NULL,        -- resolution of *_mg registers, kg (1e-6)
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),  -- 32 zero bytes for the first record
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Configuration history of measurement points. A point's configuration is
-- in force from valid_from_utc_s until the next configuration of the point.
CREATE TABLE point_config (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT NOT NULL,        -- measurement point id (our own naming)
  valid_from_utc_s  INTEGER NOT NULL,     -- in force from (an interval boundary), Unix s UTC
  method            TEXT NOT NULL,        -- line-condition method: gerg2008, detail, sgerg88, ...
  base_name         TEXT NOT NULL,        -- base-condition preset id (iso15, us60f_14.73, ...) or 'custom'
  base_T_K          REAL NOT NULL,        -- base temperature, K
  base_p_Pa         REAL NOT NULL,        -- base pressure, Pa absolute
  atm_p_Pa          REAL NOT NULL,        -- atmospheric pressure added to gauge readings, Pa
  pressure_input    TEXT NOT NULL CHECK (pressure_input IN ('absolute', 'gauge')),  -- how P samples are read
  meter_input       TEXT NOT NULL CHECK (meter_input IN ('volume', 'pulses')),      -- volume increments or pulse counts
  k_factor_per_m3   REAL,                 -- pulses per m3 of indicated volume (meter_input = 'pulses'), 1/m3
  meter_factor      REAL NOT NULL,        -- dimensionless; V_f = V_ind * meter_factor
  interval_s        INTEGER NOT NULL CHECK (interval_s > 0),      -- interval length, s (intervals align to multiples)
  contract_hour     INTEGER NOT NULL CHECK (contract_hour BETWEEN 0 AND 23),  -- local hour the contract day starts
  utc_offset_min    INTEGER NOT NULL,     -- fixed local offset of the contract clock from UTC, min (no DST)
  averaging         TEXT NOT NULL,        -- P/T averaging: time_linear, flow_linear, time_formulaic, flow_formulaic
  integration       TEXT NOT NULL,        -- per_sample (correct each sample, then sum) or average_then_correct
  p_min_Pa          REAL NOT NULL,        -- lowest valid line pressure (absolute), Pa; below = alarm
  p_max_Pa          REAL NOT NULL,        -- highest valid line pressure (absolute), Pa; above = alarm
  T_min_K           REAL NOT NULL,        -- lowest valid line temperature, K
  T_max_K           REAL NOT NULL,        -- highest valid line temperature, K
  volume_unit       TEXT NOT NULL,        -- unit for reports (m3, ft3, Mcf); the log itself is SI
  energy_unit       TEXT NOT NULL,        -- unit for reports (MJ, kWh, MMBtu, ...)
  note              TEXT,                 -- free text from the configuration file
  corrects_seq      INTEGER,              -- seq of the configuration this one corrects, or NULL
  correction_reason TEXT,                 -- why (with corrects_seq), or NULL
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Gas analyses (mole fractions), each in force from valid_from_utc_s until
-- the next analysis of the point. Applied at interval boundaries.
CREATE TABLE gas_analysis (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT NOT NULL,        -- measurement point id
  valid_from_utc_s  INTEGER NOT NULL,     -- in force from, Unix s UTC
  sampled_utc_s     INTEGER,              -- when the gas was sampled / analysed, Unix s UTC, or NULL
  source            TEXT NOT NULL,        -- where it came from (chromatograph id, laboratory report, file:line)
  x_methane REAL NOT NULL, x_nitrogen REAL NOT NULL, x_carbon_dioxide REAL NOT NULL,  -- mole fractions (1)
  x_ethane REAL NOT NULL, x_propane REAL NOT NULL, x_n_butane REAL NOT NULL, x_isobutane REAL NOT NULL,
  x_n_pentane REAL NOT NULL, x_isopentane REAL NOT NULL, x_n_hexane REAL NOT NULL, x_n_heptane REAL NOT NULL,
  x_n_octane REAL NOT NULL, x_n_nonane REAL NOT NULL, x_n_decane REAL NOT NULL, x_hydrogen REAL NOT NULL,
  x_oxygen REAL NOT NULL, x_carbon_monoxide REAL NOT NULL, x_water REAL NOT NULL, x_hydrogen_sulfide REAL NOT NULL,
  x_helium REAL NOT NULL, x_argon REAL NOT NULL,
  sum_as_given      REAL NOT NULL,        -- sum of the fractions as supplied (1)
  normalised        INTEGER NOT NULL CHECK (normalised IN (0, 1)),  -- 1 when scaled to sum 1 on input
  Hs_MJ_per_m3      REAL,                 -- volumetric gross calorific value at the point's base conditions, MJ/m3, or NULL
  hs_ref            TEXT,                 -- reference conditions of Hs (combustion / metering), text, or NULL
  corrects_seq      INTEGER,              -- seq of the analysis this one corrects, or NULL
  correction_reason TEXT,
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Metered intervals: inputs, every factor, and the register increments.
CREATE TABLE interval (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT NOT NULL,        -- measurement point id
  config_seq        INTEGER NOT NULL,     -- seq of the point_config in force
  analysis_seq      INTEGER,              -- seq of the gas_analysis in force, NULL when none
  start_utc_s       INTEGER NOT NULL,     -- interval start (inclusive), Unix s UTC
  end_utc_s         INTEGER NOT NULL,     -- interval end (exclusive), Unix s UTC
  flow_time_s       INTEGER NOT NULL,     -- time with flow (V_ind > 0), s
  alarm_time_s      INTEGER NOT NULL,     -- time with the conversion stopped (input out of range / failed), s
  samples           INTEGER NOT NULL,     -- sample rows in the interval
  samples_used      INTEGER NOT NULL,     -- rows used in the averages (flow, no alarm)
  averaging         TEXT NOT NULL,        -- averaging method of p_avg_Pa / T_avg_K
  integration       TEXT NOT NULL,        -- per_sample or average_then_correct
  p_avg_Pa          REAL,                 -- averaged line pressure, Pa absolute (NULL: no usable sample)
  T_avg_K           REAL,                 -- averaged line temperature, K
  pulses            INTEGER,              -- pulse count (meter_input = 'pulses'), or NULL
  V_ind_m3          REAL NOT NULL,        -- indicated volume at line conditions, m3
  V_f_m3            REAL NOT NULL,        -- line volume V_ind * meter_factor, m3
  Z_f               REAL,                 -- compressibility at (p_avg_Pa, T_avg_K), 1
  Z_b               REAL,                 -- compressibility at base conditions, 1
  Fp                REAL,                 -- p_avg / p_b, 1
  Ft                REAL,                 -- T_b / T_avg, 1
  Fz                REAL,                 -- Z_b / Z_f, 1
  C                 REAL,                 -- effective conversion factor V_b / V_conv (= Fp Ft Fz for average_then_correct), 1
  I_m3_Pa_per_K     REAL,                 -- integral value sum(V_f p / (T Z_f)) over converted samples, m3 Pa/K
  V_b_m3            REAL NOT NULL,        -- converted (base) volume, m3 (I * T_b Z_b / p_b)
  Hs_MJ_per_m3      REAL,                 -- gross calorific value used, MJ/m3 at base conditions, or NULL
  E_MJ              REAL,                 -- energy V_b * Hs, MJ, or NULL
  rho_f_kg_per_m3   REAL,                 -- line density at the averages, kg/m3, or NULL
  mass_kg           REAL,                 -- mass of the converted gas, kg, or NULL
  V_f_um3           INTEGER NOT NULL,     -- unconverted register increment (always counts), 1e-6 m3
  V_b_um3           INTEGER NOT NULL,     -- converted register increment (stops in alarm), 1e-6 m3
  V_fault_um3       INTEGER NOT NULL,     -- unconverted volume while the conversion was stopped, 1e-6 m3
  E_J               INTEGER NOT NULL,     -- energy register increment, J
  mass_mg           INTEGER NOT NULL,     -- mass register increment, 1e-6 kg
  flags             INTEGER NOT NULL,     -- status bits (schema/README.md: alarm, no_flow, ...)
  calc_status       TEXT NOT NULL,        -- the method's status text for Z_f ('ok', 'out_of_range', ...)
  method            TEXT NOT NULL,        -- method used
  engine_version    TEXT NOT NULL,        -- zcorr version that computed it
  corrects_seq      INTEGER,              -- seq of the interval this one corrects, or NULL
  correction_reason TEXT,
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Events: configuration and analysis changes, alarms, bad input, recordings.
CREATE TABLE event (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT,                 -- measurement point id, NULL for log-wide events
  time_utc_s        INTEGER NOT NULL,     -- when it happened (data time), Unix s UTC
  kind              TEXT NOT NULL,        -- config_change, analysis_change, alarm_begin, alarm_end, bad_input, gap, ...
  severity          TEXT NOT NULL CHECK (severity IN ('info', 'warning', 'alarm')),
  detail            TEXT NOT NULL,        -- human-readable description
  input_line        INTEGER,              -- line of the input file, or NULL
  ref_seq           INTEGER,              -- seq of the record concerned, or NULL
  value             REAL,                 -- offending value (SI), or NULL
  limit_value       REAL,                 -- limit it crossed (SI), or NULL
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Quantity transaction records: hourly (a new one each hour and one more at
-- every configuration change) and daily (contract day), with period totals
-- and register readings. Totals are exact sums of the interval registers.
CREATE TABLE qtr (
  seq               INTEGER PRIMARY KEY,  -- chain position
  point             TEXT NOT NULL,        -- measurement point id
  period            TEXT NOT NULL CHECK (period IN ('hour', 'day')),
  start_utc_s       INTEGER NOT NULL,     -- period start (inclusive), Unix s UTC
  end_utc_s         INTEGER NOT NULL,     -- period end (exclusive), Unix s UTC
  contract_day      TEXT NOT NULL,        -- contract day, YYYY-MM-DD (local, starting at contract_hour)
  config_seq        INTEGER NOT NULL,     -- point_config in force at the end of the period
  intervals         INTEGER NOT NULL,     -- intervals in the period
  flow_time_s       INTEGER NOT NULL,     -- time with flow, s
  alarm_time_s      INTEGER NOT NULL,     -- time with the conversion stopped, s
  p_avg_Pa          REAL,                 -- flow-weighted (V_f) average of the intervals' p_avg_Pa, Pa
  T_avg_K           REAL,                 -- flow-weighted average of the intervals' T_avg_K, K
  Hs_avg_MJ_per_m3  REAL,                 -- energy / base volume, MJ/m3, or NULL
  V_f_um3           INTEGER NOT NULL,     -- period total, unconverted register, 1e-6 m3
  V_b_um3           INTEGER NOT NULL,     -- period total, converted register, 1e-6 m3
  V_fault_um3       INTEGER NOT NULL,     -- period total, unconverted volume in alarm, 1e-6 m3
  E_J               INTEGER NOT NULL,     -- period total energy, J
  mass_mg           INTEGER NOT NULL,     -- period total mass, 1e-6 kg
  cum_V_f_um3       INTEGER NOT NULL,     -- register reading at end_utc_s (since the point's first interval), 1e-6 m3
  cum_V_b_um3       INTEGER NOT NULL,     -- converted register reading, 1e-6 m3
  cum_V_fault_um3   INTEGER NOT NULL,     -- fault register reading, 1e-6 m3
  cum_E_J           INTEGER NOT NULL,     -- energy register reading, J
  cum_mass_mg       INTEGER NOT NULL,     -- mass register reading, 1e-6 kg
  flags             INTEGER NOT NULL,     -- OR of the intervals' flags
  corrects_seq      INTEGER,              -- seq of the record this one corrects, or NULL
  correction_reason TEXT,
  prev_hash         BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash              BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

-- Records are never updated or deleted.
CREATE TRIGGER schema_version_no_update BEFORE UPDATE ON schema_version BEGIN SELECT RAISE(ABORT, 'zcorr log: schema_version rows are never updated'); END;
CREATE TRIGGER schema_version_no_delete BEFORE DELETE ON schema_version BEGIN SELECT RAISE(ABORT, 'zcorr log: schema_version rows are never deleted'); END;
CREATE TRIGGER log_header_no_update BEFORE UPDATE ON log_header BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER log_header_no_delete BEFORE DELETE ON log_header BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
CREATE TRIGGER point_config_no_update BEFORE UPDATE ON point_config BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER point_config_no_delete BEFORE DELETE ON point_config BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
CREATE TRIGGER gas_analysis_no_update BEFORE UPDATE ON gas_analysis BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER gas_analysis_no_delete BEFORE DELETE ON gas_analysis BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
CREATE TRIGGER interval_no_update BEFORE UPDATE ON interval BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER interval_no_delete BEFORE DELETE ON interval BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
CREATE TRIGGER event_no_update BEFORE UPDATE ON event BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER event_no_delete BEFORE DELETE ON event BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
CREATE TRIGGER qtr_no_update BEFORE UPDATE ON qtr BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER qtr_no_delete BEFORE DELETE ON qtr BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
