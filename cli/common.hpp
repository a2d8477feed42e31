// zcorr CLI: pieces shared by the commands (options for gases, formats,
// status text, exit codes). Parsing and formatting only, no physics.
#pragma once

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>

#include <cstdint>
#include <iosfwd>
#include <optional>
#include <string>

#include "core/status.hpp"
#include "io/composition_parse.hpp"

namespace zcorr::cli {

// Exit codes (DEVELOPERS.md interface contract).
inline constexpr int exit_ok = 0;        // everything computed / nothing found
inline constexpr int exit_partial = 1;   // some rows not computed, a case failed, findings
inline constexpr int exit_unusable = 2;  // unusable input

enum class Format { text, csv, json };
void add_format_option(CLI::App& app, Format& f);

inline constexpr const char* caution_text =
    "CAUTION: custody-transfer figures carry money. Check every result against the contract, local\n"
    "legal-metrology rules and licensed measurement practice before relying on it. High-pressure gas\n"
    "is dangerous: zcorr computes numbers, it does not make an installation safe.";

// The one-line form, last line of every human-readable output (and a
// `caution` field in JSON objects).
// JSON output as text, indented: a string that is not valid UTF-8 (a value
// logged from a file) has its bad bytes replaced by U+FFFD, so the output is
// always valid JSON and never fails after the work is done.
[[nodiscard]] inline std::string json_text(const nlohmann::json& j) {
  return j.dump(2, ' ', false, nlohmann::json::error_handler_t::replace);
}

inline constexpr const char* caution_line =
    "CAUTION: check every result against the contract, local legal-metrology rules and licensed measurement practice before relying on it.";

// A gas analysis given on the command line: --gas LIST or --gas-file FILE.
struct GasOptions {
  std::string gas;
  std::string gas_file;
  bool mol_percent = false;
  bool normalise = false;
  double sum_tolerance = default_sum_tolerance;
  void add_to(CLI::App& app, bool required);
  [[nodiscard]] bool given() const { return !gas.empty() || !gas_file.empty(); }
  [[nodiscard]] io::CompositionOptions composition_options() const;
  // Throws io::InputError.
  [[nodiscard]] io::ParsedComposition load() const;
};

// "ok", or "ok;range=expanded;extrapolated", or "invalid_pressure;...".
[[nodiscard]] std::string status_text(const Status& s);

// A --from / --to style option: UTC time text or Unix seconds. Throws io::InputError naming the option.
[[nodiscard]] std::int64_t parse_utc_option(const std::string& option, const std::string& value);

// Runs `body`, turning io::InputError and other exceptions into a one-line
// message on standard error and exit code 2.
int guarded(const char* command, const std::function<int()>& body);

}  // namespace zcorr::cli
