// zcorr input layer: gas analyses from text.
//
// Accepted forms:
//   name=value lists   "methane=0.95, ethane=0.03, N2=0.02"   (',' or ';' or newlines)
//   CSV header + row   via composition_from_columns()
//   JSON               {"methane": 0.95, ...}  or  {"unit": "mol%", "components": {...}}
// Names: canonical names, formulas and aliases (core/components.hpp).
// Errors (InputError, naming the field and value): negative or non-finite
// values, unknown names, duplicates, a sum outside the tolerance. Values are
// never normalised unless asked; when they are, the original sum is kept.
#pragma once

#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "core/composition.hpp"

namespace zcorr::io {

enum class FractionUnit { mole_fraction, mol_percent };

struct CompositionOptions {
  FractionUnit unit = FractionUnit::mole_fraction;
  bool normalise = false;
  // Accepted |sum - 1| (in mole fraction) without normalisation. With
  // normalise = true, sums outside normalise_window are still refused.
  double sum_tolerance = default_sum_tolerance;
  double normalise_window = 0.05;
};

struct ParsedComposition {
  Fractions<double> x{};
  double original_sum = 0.0;  // sum as given, in mole fraction
  bool normalised = false;
  [[nodiscard]] std::string provenance() const;  // e.g. "as given (sum 0.99998)" / "normalised from sum 0.9987"
};

// From (name, value-text) pairs; the common back end of every form.
[[nodiscard]] ParsedComposition composition_from_pairs(const std::vector<std::pair<std::string, std::string>>& pairs,
                                                       const CompositionOptions& opt);
[[nodiscard]] ParsedComposition parse_composition_list(std::string_view text, const CompositionOptions& opt);
[[nodiscard]] ParsedComposition parse_composition_json(std::string_view json, const CompositionOptions& opt);
// Reads a file: JSON when it starts with '{', a two-line CSV (header, row) when the
// first line has commas and no '=', else a name=value list.
[[nodiscard]] ParsedComposition load_composition_file(const std::string& path, const CompositionOptions& opt);

// Validates an already numeric vector (e.g. columns of a batch row); throws InputError.
[[nodiscard]] ParsedComposition finish_composition(Fractions<double> x, const CompositionOptions& opt,
                                                   std::string_view where = "composition");

}  // namespace zcorr::io
