// Seals: an HMAC-SHA-256 of the chain head under a key the log never holds.
// With the key, the verifier finds what the chain alone cannot: the newest
// records removed, a chain re-hashed from a point, a whole log forged. The
// gas and the keys are the project's own test doubles.
#include <gtest/gtest.h>

#include <fstream>

#include "io/input_error.hpp"
#include "record/seal.hpp"
#include "record/verify.hpp"
#include "support/record_fixture.hpp"
#include "support/tamper.hpp"

using namespace zcorr;
using namespace zcorr::record;
using zcorr::testing::scalar;

namespace {

const std::int64_t t0 = *parse_time_utc("2026-03-02T06:00:00Z");

std::vector<std::uint8_t> key_of(char fill) { return std::vector<std::uint8_t>(32, static_cast<std::uint8_t>(fill)); }

std::filesystem::path sealed_log(const std::string& name, const std::vector<std::uint8_t>& key, int rows = 6 * 60 * 3) {
  const auto p = zcorr::testing::temp_log(name);
  Log log(p, {OpenMode::writer});
  if (!key.empty()) log.set_seal_key(key);
  zcorr::testing::VirialTestGas gas;
  RecordOptions ro;
  ro.batch_intervals = 30;
  auto cfg = zcorr::testing::test_config();
  Recorder rec(log, cfg, gas, ro);
  std::istringstream a(zcorr::testing::analysis_csv(t0));
  rec.add_analyses(read_analyses(a, "a.csv", io::CompositionOptions{}).analyses);
  std::istringstream in(zcorr::testing::sample_csv(t0, rows));
  SampleReader reader(in, "s.csv", cfg);
  rec.feed(reader);
  rec.finish();
  return p;
}

VerifyResult verify(const std::filesystem::path& p, std::span<const std::uint8_t> key = {}) {
  Log log(p, {OpenMode::read_only});
  return verify_log(log, 50, std::numeric_limits<std::int64_t>::max(), std::nullopt, key);
}

std::vector<std::string> kinds(const VerifyResult& r) {
  std::vector<std::string> k;
  for (const auto& f : r.findings) k.push_back(f.kind);
  return k;
}

}  // namespace

TEST(Seal, MacAndKeyIdAreFixedFunctionsOfTheirInputs) {
  const auto k = key_of('k');
  Digest h{};
  h[0] = 1;
  EXPECT_EQ(seal_mac(k, 7, h), seal_mac(k, 7, h));
  EXPECT_NE(seal_mac(k, 7, h), seal_mac(k, 8, h));
  EXPECT_NE(seal_mac(k, 7, h), seal_mac(key_of('j'), 7, h));
  h[31] = 1;
  EXPECT_NE(seal_mac(k, 7, h), seal_mac(k, 7, Digest{}));
  EXPECT_EQ(seal_key_id(k).size(), 16u);
  EXPECT_NE(seal_key_id(k), seal_key_id(key_of('j')));
}

TEST(Seal, KeyFilesShorterThan32BytesAreRefused) {
  const auto dir = zcorr::testing::temp_log("keys").parent_path();
  const auto shortk = dir / "short.key", goodk = dir / "good.key";
  std::ofstream(shortk, std::ios::binary) << "not a key";
  std::ofstream(goodk, std::ios::binary) << std::string(40, 'x');
  EXPECT_THROW((void)load_seal_key(shortk, "--seal-key"), io::InputError);
  EXPECT_THROW((void)load_seal_key(dir / "missing.key", "--seal-key"), io::InputError);
  EXPECT_EQ(load_seal_key(goodk, "--seal-key").size(), 40u);
}

TEST(Seal, ASealedRecordingEndsInASealAndVerifiesWithItsKey) {
  const auto key = key_of('s');
  const auto p = sealed_log("sealed", key);
  const auto r = verify(p, key);
  EXPECT_TRUE(r.findings.empty()) << r.findings[0].kind << ": " << r.findings[0].detail;
  EXPECT_TRUE(r.seals_checked);
  EXPECT_GE(r.seals, 6);  // 180 intervals in transactions of 30
  EXPECT_EQ(r.last_seal_seq, r.last_seq);
  // Without the key the chain verifies as before; the seals are counted, not checked.
  const auto plain = verify(p);
  EXPECT_TRUE(plain.findings.empty());
  EXPECT_FALSE(plain.seals_checked);
  EXPECT_EQ(plain.seals, r.seals);
  // Another key does not pass.
  const auto other = verify(p, key_of('t'));
  ASSERT_FALSE(other.findings.empty());
  EXPECT_EQ(other.findings[0].kind, "seal_mismatch");
  EXPECT_NE(other.findings[0].detail.find("another key"), std::string::npos);
}

TEST(Seal, TheNewestRecordsRemovedAreFoundWithTheKey) {
  const auto key = key_of('s');
  const auto p = sealed_log("sealed_cut", key);
  const std::int64_t head = verify(p).last_seq;
  std::int64_t cut = head - 60;
  {
    const zcorr::testing::OpenDb open(p);
    while (scalar(open.db, "SELECT count(*) FROM seal WHERE seq = " + std::to_string(cut)) > 0) --cut;  // not at a seal
    const zcorr::testing::TriggersAside aside(open.db);
    for (const auto& t : tables) zcorr::testing::exec_sql(open.db, "DELETE FROM " + std::string(t.name) + " WHERE seq > " + std::to_string(cut));
  }
  EXPECT_TRUE(verify(p).findings.empty());  // the chain alone cannot tell
  const auto r = verify(p, key);
  EXPECT_EQ(kinds(r), std::vector<std::string>{"unsealed_head"});
}

TEST(Seal, AChainReHashedFromAPointBreaksEverySealAfterIt) {
  const auto key = key_of('s');
  const auto p = sealed_log("sealed_rehash", key);
  {
    const zcorr::testing::OpenDb open(p);
    const zcorr::testing::TriggersAside aside(open.db);
    const auto seq = scalar(open.db, "SELECT seq FROM event ORDER BY seq LIMIT 1 OFFSET 2");
    zcorr::testing::exec_sql(open.db, "UPDATE event SET detail = 'rewritten' WHERE seq = " + std::to_string(seq));
    zcorr::testing::rehash_chain(open.db);
  }
  EXPECT_TRUE(verify(p).findings.empty());  // a consistent re-hash: the chain alone cannot tell
  const auto r = verify(p, key);
  ASSERT_FALSE(r.findings.empty());
  for (const auto& f : r.findings) EXPECT_EQ(f.kind, "seal_mismatch") << f.detail;
  EXPECT_EQ(r.findings_total, r.seals);  // every seal after the change (all of them: the change is early)
}

TEST(Seal, AWholeLogForgedWithoutTheKeyIsUnsealed) {
  const auto key = key_of('s');
  const auto forged = sealed_log("forged_unsealed", {});
  EXPECT_TRUE(verify(forged).findings.empty());
  EXPECT_EQ(kinds(verify(forged, key)), std::vector<std::string>{"unsealed"});
  // Forged with seals under a key of the forger's: named as another key.
  const auto forged2 = sealed_log("forged_other_key", key_of('f'));
  const auto r = verify(forged2, key);
  ASSERT_FALSE(r.findings.empty());
  EXPECT_EQ(r.findings[0].kind, "seal_mismatch");
}
