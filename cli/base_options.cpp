#include "base_options.hpp"

#include "io/input_error.hpp"
#include "io/units_parse.hpp"

namespace zcorr::cli {

void BaseOptions::add_to(CLI::App& app) {
  std::string names;
  for (const auto& b : base_presets) names += std::string(names.empty() ? "" : ", ") + std::string(b.name);
  app.add_option("--base", preset, "Base conditions preset: " + names)->capture_default_str();
  app.add_option("--base-T", T, "Custom base temperature, e.g. \"15 degC\" (with --base-p)");
  app.add_option("--base-p", p, "Custom base pressure (absolute), e.g. \"14.65 psia\" (with --base-T)");
}

BaseConditions BaseOptions::resolve() const {
  if (!T.empty() || !p.empty()) {
    if (T.empty() || p.empty()) throw io::InputError("--base-T/--base-p", T + "/" + p, "give both for custom base conditions");
    BaseConditions b{"custom", io::parse_temperature_K(T, "--base-T"), io::parse_pressure_Pa(p, "--base-p"), "custom"};
    io::check_base_T(b.T_K, "--base-T");
    io::check_base_p(b.p_Pa, "--base-p");
    return b;
  }
  const auto* b = find_base_preset(preset);
  if (!b) {
    std::string names;
    for (const auto& x : base_presets) names += " " + std::string(x.name);
    throw io::InputError("--base", preset, "presets are:" + names + " (or --base-T and --base-p)");
  }
  return *b;
}

}  // namespace zcorr::cli
