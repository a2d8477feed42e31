// zcorr CLI: one setup function per command (each in cmd_<name>.cpp).
// Each stores its exit code in `exit_code` when the command runs.
#pragma once

#include <CLI/CLI.hpp>

namespace zcorr::cli {

void setup_z(CLI::App& app, int& exit_code);
void setup_cases(CLI::App& app, int& exit_code);
void setup_convert(CLI::App& app, int& exit_code);
void setup_demo(CLI::App& app, int& exit_code);
void setup_validate(CLI::App& app, int& exit_code);
void setup_props(CLI::App& app, int& exit_code);
void setup_record(CLI::App& app, int& exit_code);
void setup_verify(CLI::App& app, int& exit_code);
void setup_quantities(CLI::App& app, int& exit_code);
void setup_audit(CLI::App& app, int& exit_code);
void setup_correct(CLI::App& app, int& exit_code);
void setup_dewpoint(CLI::App& app, int& exit_code);

}  // namespace zcorr::cli
