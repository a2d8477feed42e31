-- zcorr interval log, migration 004: the canonical encoding each record names,
-- and the engine version of configuration records.
--
-- Every chained record from this version on names the version of the
-- canonical encoding it was hashed with (schema/README.md, "Integrity"):
-- canon_version 2 covers the columns of version 1 and the columns added here.
-- The records already in the log are not touched: ADD COLUMN leaves their
-- rows as they are and the new columns read as NULL, which is what a record
-- of version 1 holds in every column its encoding does not cover (NULL
-- canon_version = version 1). No row is updated, so the no-update triggers
-- stay in place and never fire.
--
-- The engine version is "zcorr 0.1.0 (revision 1a2b3c4)" from this version on
-- (the source revision it was built from; "unknown" when not built from a git
-- checkout); interval, log_header and correction_set had the column already.
ALTER TABLE log_header ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);      -- canonical encoding of the record (NULL = 1)
ALTER TABLE point_config ADD COLUMN engine_version TEXT;                                  -- zcorr version that wrote the configuration (NULL before 004)
ALTER TABLE point_config ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
ALTER TABLE gas_analysis ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
ALTER TABLE interval ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
ALTER TABLE event ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
ALTER TABLE qtr ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
ALTER TABLE correction_set ADD COLUMN canon_version INTEGER CHECK (canon_version >= 2);
