#include "cases/reference_case.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <fstream>

#include "cases/case_kinds.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"

#ifndef ZCORR_SOURCE_DIR
#define ZCORR_SOURCE_DIR "."
#endif

namespace zcorr::cases {

const std::string& RefCase::input(const std::string& key) const {
  auto it = inputs.find(key);
  if (it == inputs.end()) throw io::InputError("case " + id + " input '" + key + "'", "", "the case file must give it");
  return it->second;
}

namespace {

Expectation parse_expectation(const std::string& where, std::string_view name, std::string_view rhs) {
  Expectation e;
  e.name = std::string(io::trim(name));
  std::vector<std::string_view> parts;
  for (auto p : io::split(io::trim(rhs), ' '))
    if (!io::trim(p).empty()) parts.push_back(io::trim(p));
  if (parts.size() != 3 || (parts[1] != "abs" && parts[1] != "rel"))
    throw io::InputError(where, std::string(rhs), "expected 'expect NAME = VALUE abs|rel TOLERANCE'");
  e.value = io::parse_number(parts[0], where + " value");
  e.relative = parts[1] == "rel";
  e.tolerance = io::parse_number(parts[2], where + " tolerance");
  if (!(e.tolerance >= 0.0)) throw io::InputError(where, std::string(parts[2]), "the tolerance must be >= 0");
  return e;
}

}  // namespace

std::vector<RefCase> load_case_file(const std::filesystem::path& file) {
  std::ifstream in(file);
  if (!in) throw io::InputError("case file", file.string(), "the file cannot be opened");
  std::map<std::string, std::string> defaults;
  std::vector<RefCase> out;
  std::string raw;
  int lineno = 0;
  RefCase* cur = nullptr;
  while (std::getline(in, raw)) {
    ++lineno;
    auto line = io::trim(raw);
    if (line.empty() || line.front() == '#') continue;
    const std::string where = file.filename().string() + ":" + std::to_string(lineno);
    if (line.front() == '[') {
      if (line.back() != ']' || line.size() < 3) throw io::InputError(where, std::string(line), "expected [case.id]");
      RefCase c;
      c.id = std::string(io::trim(line.substr(1, line.size() - 2)));
      c.file = file.string();
      c.line = lineno;
      out.push_back(std::move(c));
      cur = &out.back();
      continue;
    }
    auto eq = line.find('=');
    if (eq == std::string_view::npos) throw io::InputError(where, std::string(line), "expected key = value");
    auto key = io::trim(line.substr(0, eq));
    auto value = io::trim(line.substr(eq + 1));
    if (key.rfind("expect ", 0) == 0) {
      if (!cur) throw io::InputError(where, std::string(line), "an expectation must follow a [case.id] line");
      cur->expect.push_back(parse_expectation(where, key.substr(7), value));
    } else if (cur) {
      cur->inputs[std::string(key)] = std::string(value);
    } else {
      defaults[std::string(key)] = std::string(value);
    }
  }
  for (auto& c : out) {
    for (const auto& [k, v] : defaults) c.inputs.emplace(k, v);  // case values win
    c.kind = c.inputs.count("kind") ? c.inputs["kind"] : "";
    c.source = c.inputs.count("source") ? c.inputs["source"] : "";
    const std::string where = file.filename().string() + ":" + std::to_string(c.line) + " [" + c.id + "]";
    if (c.kind.empty()) throw io::InputError(where, "kind", "every case needs a kind");
    if (c.source.empty()) throw io::InputError(where, "source", "every case must name its source");
    if (c.expect.empty()) throw io::InputError(where, "expect", "every case needs at least one expectation");
  }
  return out;
}

std::vector<RefCase> load_case_dir(const std::filesystem::path& dir) {
  if (!std::filesystem::is_directory(dir)) throw io::InputError("case folder", dir.string(), "not a folder");
  std::vector<std::filesystem::path> files;
  for (const auto& e : std::filesystem::recursive_directory_iterator(dir))
    if (e.is_regular_file() && e.path().extension() == ".zcase") files.push_back(e.path());
  std::sort(files.begin(), files.end());
  std::vector<RefCase> all;
  for (const auto& f : files) {
    auto part = load_case_file(f);
    all.insert(all.end(), std::make_move_iterator(part.begin()), std::make_move_iterator(part.end()));
  }
  for (std::size_t i = 0; i < all.size(); ++i)
    for (std::size_t j = i + 1; j < all.size(); ++j)
      if (all[i].id == all[j].id)
        throw io::InputError("case id", all[i].id, "ids must be unique (" + all[i].file + " and " + all[j].file + ")");
  return all;
}

CaseOutcome run_case(const RefCase& c) {
  CaseOutcome o;
  try {
    const auto* kind = find_kind(c.kind);
    if (!kind) {
      o.error = "unknown case kind '" + c.kind + "'";
      return o;
    }
    auto values = (*kind)(c);
    o.pass = true;
    for (const auto& e : c.expect) {
      CheckResult r;
      r.name = e.name;
      r.expected = e.value;
      auto it = values.find(e.name);
      if (it == values.end()) {
        o.error = "the kind '" + c.kind + "' does not produce '" + e.name + "'";
        o.pass = false;
        return o;
      }
      r.actual = it->second;
      double diff = std::abs(r.actual - e.value);
      r.deviation = e.relative ? diff / std::abs(e.value) : diff;
      r.pass = std::isfinite(r.actual) && r.deviation <= e.tolerance;
      o.pass = o.pass && r.pass;
      o.checks.push_back(r);
    }
  } catch (const std::exception& ex) {
    o.pass = false;
    o.error = ex.what();
  }
  return o;
}

std::filesystem::path default_case_dir() {
  if (const char* env = std::getenv("ZCORR_CASES_DIR"); env && *env) return env;
  return std::filesystem::path(ZCORR_SOURCE_DIR) / "reference_cases";
}

}  // namespace zcorr::cases
