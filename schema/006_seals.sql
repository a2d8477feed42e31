-- zcorr interval log, migration 006: seals.
--
-- A seal is a chained record a writer given a key file appends as the last
-- record of every transaction: an HMAC-SHA-256, under that key, of the chain
-- head it follows. The key is never in the log. Whoever holds the key can
-- check that the log ends in a seal, that every seal's MAC is right, and so
-- that no record up to the last seal was removed, re-hashed or forged:
-- things the hash chain alone cannot show (schema/README.md, "Seals").
--   mac = HMAC-SHA-256(key, "zcorr.seal.v1" 0x00 || sealed_seq (8 bytes,
--         big-endian two's complement) || hash of record sealed_seq)
CREATE TABLE seal (
  seq            INTEGER PRIMARY KEY,  -- chain position
  time_utc_s     INTEGER NOT NULL,     -- when the seal was written (wall clock), Unix s UTC
  sealed_seq     INTEGER NOT NULL,     -- the record it seals: always seq - 1, the head it follows
  key_id         TEXT NOT NULL,        -- names the key without revealing it: 16 hex digits of SHA-256("zcorr.seal.key" 0x00 || key)
  mac            BLOB NOT NULL CHECK (length(mac) = 32),  -- see above
  engine_version TEXT NOT NULL,        -- zcorr version that wrote it
  canon_version  INTEGER CHECK (canon_version >= 2),      -- canonical encoding the record was hashed with
  prev_hash      BLOB NOT NULL CHECK (length(prev_hash) = 32),
  hash           BLOB NOT NULL CHECK (length(hash) = 32)
) STRICT;

CREATE TRIGGER seal_no_update BEFORE UPDATE ON seal BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never updated'); END;
CREATE TRIGGER seal_no_delete BEFORE DELETE ON seal BEGIN SELECT RAISE(ABORT, 'zcorr log: records are never deleted'); END;
