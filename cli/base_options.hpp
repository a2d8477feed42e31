// zcorr CLI: choosing base conditions (a preset or custom T and p).
#pragma once

#include <CLI/CLI.hpp>

#include <string>

#include "core/base_conditions.hpp"

namespace zcorr::cli {

struct BaseOptions {
  std::string preset = "iso15";
  std::string T, p;  // custom base conditions (both, overriding the preset)
  void add_to(CLI::App& app);
  // Throws io::InputError.
  [[nodiscard]] BaseConditions resolve() const;
};

}  // namespace zcorr::cli
