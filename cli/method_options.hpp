// zcorr CLI: choosing a method and building it.
#pragma once

#include <CLI/CLI.hpp>

#include <memory>
#include <string>

#include "eval/line_method.hpp"

namespace zcorr::cli {

struct MethodOptions {
  std::string method = "gerg2008";
  bool allow_outside_range = false;
  void add_to(CLI::App& app);
  // Throws io::InputError when the name is unknown or the method is not built in.
  [[nodiscard]] std::unique_ptr<LineMethod> make() const;
  [[nodiscard]] EvalOptions eval_options(bool derived) const;
};

}  // namespace zcorr::cli
