// zcorr reference cases: the data-file format and its loader.
//
// One loader serves the tests and `zcorr cases`. Format (files *.zcase under
// reference_cases/, read in sorted order):
//
//   # comment lines start with '#'
//   kind = iso6976                 <- keys before the first [id] are file defaults
//   source = ISO 6976:2016 Table 3 (recalled, confidence medium)
//
//   [iso6976.methane.hs25]         <- stable id of one case
//   composition = methane=1
//   combustion_T = 25 degC
//   expect Hs_kJ_per_mol = 890.58 abs 0.005     <- name = value (abs|rel) tolerance
//
// Every case must end up with a kind, a source and at least one expectation.
#pragma once

#include <filesystem>
#include <map>
#include <string>
#include <vector>

namespace zcorr::cases {

struct Expectation {
  std::string name;
  double value = 0.0;
  double tolerance = 0.0;
  bool relative = false;
};

struct RefCase {
  std::string id;
  std::string file;
  int line = 0;
  std::string kind;
  std::string source;
  std::map<std::string, std::string> inputs;
  std::vector<Expectation> expect;
  [[nodiscard]] const std::string& input(const std::string& key) const;  // throws InputError if missing
  [[nodiscard]] bool has(const std::string& key) const { return inputs.count(key) != 0; }
};

// Throws io::InputError naming the file and line on a malformed file.
[[nodiscard]] std::vector<RefCase> load_case_file(const std::filesystem::path& file);
[[nodiscard]] std::vector<RefCase> load_case_dir(const std::filesystem::path& dir);

struct CheckResult {
  std::string name;
  double expected = 0.0;
  double actual = 0.0;
  double deviation = 0.0;  // absolute or relative, as the expectation says
  bool pass = false;
};

struct CaseOutcome {
  bool pass = false;
  std::string error;  // why the case could not run (empty when it ran)
  std::vector<CheckResult> checks;
};

// Runs one case through the engine. Never throws.
[[nodiscard]] CaseOutcome run_case(const RefCase& c);

// The default folder: $ZCORR_CASES_DIR, else the source tree's reference_cases/.
[[nodiscard]] std::filesystem::path default_case_dir();

}  // namespace zcorr::cases
