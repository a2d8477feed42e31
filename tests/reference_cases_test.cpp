// One data-driven test walks reference_cases/ and names every case that fails.
#include <gtest/gtest.h>

#include "cases/reference_case.hpp"

using namespace zcorr;

TEST(ReferenceCases, EveryCasePasses) {
  const auto all = cases::load_case_dir(std::filesystem::path(ZCORR_SOURCE_DIR) / "reference_cases");
  ASSERT_GE(all.size(), 10u);
  for (const auto& c : all) {
    EXPECT_FALSE(c.source.empty()) << c.id;
    auto r = cases::run_case(c);
    EXPECT_TRUE(r.pass) << c.id << " (" << c.file << ":" << c.line << ") " << r.error;
    for (const auto& k : r.checks)
      EXPECT_TRUE(k.pass) << c.id << ": " << k.name << " = " << k.actual << ", expected " << k.expected
                          << ", deviation " << k.deviation;
  }
}

TEST(ReferenceCases, LoaderRejectsACaseWithoutSource) {
  const auto dir = std::filesystem::temp_directory_path() / "zcorr_case_loader_test";
  std::filesystem::create_directories(dir);
  const auto f = dir / "bad.zcase";
  {
    std::FILE* fp = std::fopen(f.string().c_str(), "w");
    ASSERT_NE(fp, nullptr);
    std::fputs("kind = unit\n[x.no_source]\nquantity = pressure\ntext = 1 kPa\nexpect SI = 1000 abs 0\n", fp);
    std::fclose(fp);
  }
  EXPECT_THROW((void)cases::load_case_file(f), std::exception);
  std::filesystem::remove_all(dir);
}
