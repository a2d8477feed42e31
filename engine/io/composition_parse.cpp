#include "io/composition_parse.hpp"

#include <cmath>
#include <fstream>
#include <sstream>

#include <nlohmann/json.hpp>

#include "io/input_error.hpp"
#include "io/text.hpp"

namespace zcorr::io {

std::string ParsedComposition::provenance() const {
  if (normalised) return "normalised from sum " + format_sig(original_sum, 8);
  return "as given (sum " + format_sig(original_sum, 8) + ")";
}

ParsedComposition finish_composition(Fractions<double> x, const CompositionOptions& opt, std::string_view where) {
  double sum = 0.0;
  for (std::size_t i = 0; i < max_components; ++i) {
    if (!std::isfinite(x[i]))
      throw InputError(std::string(where) + "." + std::string(component_name(i)), format_number(x[i]),
                       "fractions must be finite");
    if (x[i] < 0.0)
      throw InputError(std::string(where) + "." + std::string(component_name(i)), format_number(x[i]),
                       "fractions must be >= 0");
    sum += x[i];
  }
  ParsedComposition r;
  r.original_sum = sum;
  if (sum <= 0.0) throw InputError(std::string(where), "sum 0", "at least one component must be present");
  const double dev = std::abs(sum - 1.0);
  if (opt.normalise) {
    if (dev > opt.normalise_window)
      throw InputError(std::string(where) + " sum", format_sig(sum, 8),
                       "normalisation is allowed only for sums within 1 +/- " + format_sig(opt.normalise_window, 3) +
                           "; check the analysis");
    for (auto& v : x) v /= sum;
    r.normalised = true;
  } else if (dev > opt.sum_tolerance) {
    std::string hint = "mole fractions must sum to 1 +/- " + format_sig(opt.sum_tolerance, 3) +
                       " (use --normalise to scale them, recording the original sum)";
    if (std::abs(sum - 100.0) < 5.0 && opt.unit == FractionUnit::mole_fraction)
      hint += "; the values look like mol % (use --mol-percent)";
    throw InputError(std::string(where) + " sum", format_sig(sum, 8), hint);
  }
  r.x = x;
  return r;
}

ParsedComposition composition_from_pairs(const std::vector<std::pair<std::string, std::string>>& pairs,
                                         const CompositionOptions& opt) {
  Fractions<double> x{};
  std::array<bool, max_components> seen{};
  const double scale = opt.unit == FractionUnit::mol_percent ? 0.01 : 1.0;
  if (pairs.empty()) throw InputError("composition", "", "at least one name=value pair is required");
  for (const auto& [name_raw, value] : pairs) {
    auto name = std::string(trim(name_raw));
    auto c = find_component(name);
    if (!c)
      throw InputError("composition", name,
                       "unknown component; use a canonical name (methane, nitrogen, carbon_dioxide, ethane, ...) "
                       "or a formula (CH4, N2, CO2, C2H6, iC4, nC4, ...)");
    auto i = index(*c);
    if (seen[i])
      throw InputError("composition." + std::string(component_name(i)), name,
                       "the component is given twice (check aliases: " + name + " is " +
                           std::string(component_name(i)) + ")");
    seen[i] = true;
    double v = parse_number(value, "composition." + std::string(component_name(i)));
    if (v < 0.0) throw InputError("composition." + std::string(component_name(i)), std::string(trim(value)), "fractions must be >= 0");
    x[i] = v * scale;
  }
  return finish_composition(x, opt);
}

ParsedComposition parse_composition_list(std::string_view text, const CompositionOptions& opt) {
  std::vector<std::pair<std::string, std::string>> pairs;
  std::string normal(text);
  for (auto& ch : normal)
    if (ch == ';' || ch == '\n' || ch == '\r') ch = ',';
  for (auto item : split(normal, ',')) {
    item = trim(item);
    if (item.empty() || item.front() == '#') continue;
    auto eq = item.find('=');
    if (eq == std::string_view::npos)
      throw InputError("composition", std::string(item), "expected name=value, e.g. methane=0.95");
    pairs.emplace_back(std::string(trim(item.substr(0, eq))), std::string(trim(item.substr(eq + 1))));
  }
  return composition_from_pairs(pairs, opt);
}

ParsedComposition parse_composition_json(std::string_view json, const CompositionOptions& opt_in) {
  nlohmann::json j;
  try {
    j = nlohmann::json::parse(json);
  } catch (const nlohmann::json::exception& e) {
    throw InputError("composition JSON", std::string(json.substr(0, 60)), std::string("not valid JSON: ") + e.what());
  }
  CompositionOptions opt = opt_in;
  const nlohmann::json* comps = &j;
  if (!j.is_object()) throw InputError("composition JSON", std::string(json.substr(0, 60)), "expected a JSON object");
  if (j.contains("components")) {
    comps = &j["components"];
    if (j.contains("unit")) {
      auto u = j["unit"].is_string() ? j["unit"].get<std::string>() : std::string("?");
      if (u == "mol%" || u == "mol_percent") opt.unit = FractionUnit::mol_percent;
      else if (u == "mole_fraction" || u == "fraction") opt.unit = FractionUnit::mole_fraction;
      else throw InputError("composition JSON unit", u, "use \"mole_fraction\" or \"mol%\"");
    }
  }
  if (!comps->is_object()) throw InputError("composition JSON components", comps->dump(), "expected an object of name: value");
  std::vector<std::pair<std::string, std::string>> pairs;
  for (auto it = comps->begin(); it != comps->end(); ++it) {
    if (!it.value().is_number())
      throw InputError("composition." + it.key(), it.value().dump(), "expected a number");
    pairs.emplace_back(it.key(), format_number(it.value().get<double>()));
  }
  return composition_from_pairs(pairs, opt);
}

ParsedComposition load_composition_file(const std::string& path, const CompositionOptions& opt) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError("composition file", path, "the file cannot be opened");
  std::stringstream ss;
  ss << in.rdbuf();
  std::string text = ss.str();
  auto t = trim(text);
  if (t.empty()) throw InputError("composition file", path, "the file is empty");
  if (t.front() == '{') return parse_composition_json(t, opt);
  auto nl = t.find('\n');
  auto first = t.substr(0, nl);
  if (first.find('=') == std::string_view::npos && first.find(',') != std::string_view::npos) {
    if (nl == std::string_view::npos) throw InputError("composition file", path, "a CSV composition needs a header line and a value line");
    auto header = split(first, ',');
    auto rest = trim(t.substr(nl + 1));
    auto row = split(rest.substr(0, rest.find('\n')), ',');
    if (header.size() != row.size())
      throw InputError("composition file", path, "the header has " + std::to_string(header.size()) + " columns and the row " +
                                                     std::to_string(row.size()));
    std::vector<std::pair<std::string, std::string>> pairs;
    for (std::size_t i = 0; i < header.size(); ++i) pairs.emplace_back(std::string(trim(header[i])), std::string(trim(row[i])));
    return composition_from_pairs(pairs, opt);
  }
  return parse_composition_list(t, opt);
}

}  // namespace zcorr::io
