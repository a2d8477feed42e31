// zcorr cases: runs every reference case, a line each, then "N passed, N failed".
#include <iostream>
#include <memory>

#include "cases/reference_case.hpp"
#include "commands.hpp"
#include "common.hpp"
#include "io/text.hpp"

namespace zcorr::cli {
namespace {

struct CasesOptions {
  std::string dir;
  std::string filter;
  bool verbose = false;
};

int run_cases(const CasesOptions& o) {
  const auto dir = o.dir.empty() ? cases::default_case_dir() : std::filesystem::path(o.dir);
  const auto all = cases::load_case_dir(dir);
  int passed = 0, failed = 0;
  for (const auto& c : all) {
    if (!o.filter.empty() && c.id.find(o.filter) == std::string::npos) continue;
    auto r = cases::run_case(c);
    (r.pass ? passed : failed)++;
    std::cout << (r.pass ? "pass  " : "FAIL  ") << c.id << "  [" << c.source << "]";
    if (!r.error.empty()) std::cout << "  error: " << r.error;
    std::cout << '\n';
    if (!r.pass || o.verbose)
      for (const auto& k : r.checks)
        std::cout << "        " << (k.pass ? "ok   " : "off  ") << k.name << " = " << io::format_sig(k.actual, 12)
                  << " expected " << io::format_sig(k.expected, 12) << " deviation " << io::format_sig(k.deviation, 3)
                  << '\n';
  }
  std::cout << caution_line << '\n' << passed << " passed, " << failed << " failed\n";
  return failed == 0 ? exit_ok : exit_partial;
}

}  // namespace

void setup_cases(CLI::App& app, int& exit_code) {
  auto opt = std::make_shared<CasesOptions>();
  auto* sub = app.add_subcommand("cases", "Run every reference case (published worked examples and reference data)");
  sub->add_option("--dir", opt->dir, "Folder of *.zcase files (default: $ZCORR_CASES_DIR or the source tree's reference_cases/)");
  sub->add_option("--filter", opt->filter, "Run only the cases whose id contains this text");
  sub->add_flag("-v,--verbose", opt->verbose, "Show every check, not only failing ones");
  sub->footer("\nExample:\n  zcorr cases --filter iso6976 -v\n");
  sub->callback([opt, &exit_code] { exit_code = guarded("cases", [&] { return run_cases(*opt); }); });
}

}  // namespace zcorr::cli
