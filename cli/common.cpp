#include "common.hpp"

#include <iostream>

#include "core/components.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "io/status_text.hpp"
#include "record/timeutil.hpp"

namespace zcorr::cli {

void add_format_option(CLI::App& app, Format& f) {
  app.add_option("--format", f, "Output format: text (default), csv or json")
      ->transform(CLI::CheckedTransformer(std::map<std::string, Format>{{"text", Format::text}, {"csv", Format::csv}, {"json", Format::json}},
                                          CLI::ignore_case));
}

void GasOptions::add_to(CLI::App& app, bool required) {
  auto* g = app.add_option("--gas", gas, "Gas analysis as name=value pairs, e.g. \"methane=0.95,ethane=0.03,N2=0.02\"");
  auto* f = app.add_option("--gas-file", gas_file, "Gas analysis file: name=value lines, a CSV header+row, or JSON")
                ->check(CLI::ExistingFile);
  g->excludes(f);
  app.add_flag("--mol-percent", mol_percent, "Values are mol % instead of mole fractions");
  app.add_flag("--normalise", normalise, "Scale the analysis to sum 1 (the original sum is reported)");
  app.add_option("--sum-tolerance", sum_tolerance, "Accepted |sum - 1| without normalising (mole fraction; at most the engine's 1e-4)")
      ->check(CLI::Range(0.0, default_sum_tolerance));
  if (required) {
    // One of the two must be given; checked when the command runs.
  }
}

io::CompositionOptions GasOptions::composition_options() const {
  io::CompositionOptions o;
  o.unit = mol_percent ? io::FractionUnit::mol_percent : io::FractionUnit::mole_fraction;
  o.normalise = normalise;
  o.sum_tolerance = sum_tolerance;
  return o;
}

io::ParsedComposition GasOptions::load() const {
  if (!gas_file.empty()) return io::load_composition_file(gas_file, composition_options());
  if (gas.empty()) throw io::InputError("--gas", "", "give the gas analysis with --gas or --gas-file");
  return io::parse_composition_list(gas, composition_options());
}

std::string status_text(const Status& s) { return io::status_text(s); }

std::int64_t parse_utc_option(const std::string& option, const std::string& value) {
  const auto t = record::parse_time_utc(value);
  if (!t) throw io::InputError(option, value, "a UTC time such as 2026-03-02T06:00:00Z or Unix seconds");
  return *t;
}

int guarded(const char* command, const std::function<int()>& body) {
  try {
    return body();
  } catch (const io::InputError& e) {
    std::cerr << "zcorr " << command << ": " << e.what() << '\n';
    return exit_unusable;
  } catch (const std::exception& e) {  // one line whatever the message holds
    std::cerr << "zcorr " << command << ": " << io::printable(e.what(), 1000) << '\n';
    return exit_unusable;
  }
}

}  // namespace zcorr::cli
