// Writes an interval log recorded with the invented test-double gas, for the
// CLI tests of `zcorr verify` and `zcorr quantities` (which must not depend
// on a published method being built in).
//   make_test_log FILE [--tamper]
// --tamper then changes one interval row behind the triggers' back, the way
// someone with the sqlite3 shell would, and prints its seq.
#include <iostream>

#include "support/record_fixture.hpp"

int main(int argc, char** argv) {
  if (argc < 2) {
    std::cerr << "usage: make_test_log FILE [--tamper]\n";
    return 2;
  }
  const std::filesystem::path p = argv[1];
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(p.string() + suffix);
  const std::int64_t t0 = *zcorr::record::parse_time_utc("2026-03-02T06:00:00Z");
  {
    zcorr::record::Log log(p, {zcorr::record::OpenMode::writer});
    zcorr::testing::VirialTestGas gas;
    zcorr::testing::record_text(log, zcorr::testing::test_config(), gas, zcorr::testing::sample_csv(t0, 6 * 60 * 26),
                                zcorr::testing::analysis_csv(t0));
  }
  if (argc > 2 && std::string(argv[2]) == "--tamper") {
    std::int64_t seq = 0;
    {
      zcorr::record::Log log(p, {zcorr::record::OpenMode::read_only});
      seq = zcorr::testing::scalar(log.db(), "SELECT seq FROM interval ORDER BY seq LIMIT 1 OFFSET 500");
    }
    if (zcorr::testing::run_shell(p, "DROP TRIGGER interval_no_update; UPDATE interval SET V_b_m3 = V_b_m3 + 0.5 WHERE seq = " +
                                         std::to_string(seq)) != 0)
      return 1;
    std::cout << seq << '\n';
  }
  return 0;
}
