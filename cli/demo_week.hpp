// zcorr demo, the week: a fictional measurement point recorded to an
// interval log (see demo_week.cpp).
#pragma once

#include <string>

#include "core/base_conditions.hpp"

namespace zcorr::cli {

struct DemoWeekOptions {
  std::string method = "gerg2008";
  BaseConditions base = base_presets[0];
  std::string dir = "zcorr-demo";  // where the input files and the log are written
};

// Writes the scenario's input files, records them with the recorder (two
// runs: a configuration change in the middle of the week), prints the daily
// quantity transaction records and verifies the log. Returns an exit code.
int run_demo_week(const DemoWeekOptions& o);

}  // namespace zcorr::cli
