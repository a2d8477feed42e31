// zcorr engine core: the 21 components of AGA Report No. 8 / GERG-2008.
//
// Canonical order and names are the interface contract of the batch CSV
// (see README and DEVELOPERS.md). The order is the GERG-2008 order of
// Kunz & Wagner, J. Chem. Eng. Data 57 (2012) 3032-3091, Table A5.
// Methods whose standard numbers components differently map by name.
//
// Does not throw, does not allocate, does no I/O.
#pragma once

#include <array>
#include <cstddef>
#include <cstdint>
#include <optional>
#include <string_view>

namespace zcorr {

inline constexpr std::size_t max_components = 21;

enum class Component : std::uint8_t {
  methane, nitrogen, carbon_dioxide, ethane, propane, n_butane, isobutane,
  n_pentane, isopentane, n_hexane, n_heptane, n_octane, n_nonane, n_decane,
  hydrogen, oxygen, carbon_monoxide, water, hydrogen_sulfide, helium, argon,
};

[[nodiscard]] constexpr std::size_t index(Component c) noexcept { return static_cast<std::size_t>(c); }

struct ComponentInfo {
  std::string_view name;     // canonical name (batch CSV column)
  std::string_view formula;  // formula as printed in tables
  std::array<std::string_view, 5> aliases;  // further accepted spellings (empty = unused)
};

// Aliases are matched case-insensitively with '-', '_', ' ' and '.' ignored,
// so "n-C4", "nC4" and "NC4" are the same key. "C4H10" and "C5H12" are not
// accepted: they do not say which isomer.
inline constexpr std::array<ComponentInfo, max_components> component_table{{
    {"methane", "CH4", {"C1", "", "", "", ""}},
    {"nitrogen", "N2", {"", "", "", "", ""}},
    {"carbon_dioxide", "CO2", {"", "", "", "", ""}},
    {"ethane", "C2H6", {"C2", "", "", "", ""}},
    {"propane", "C3H8", {"C3", "", "", "", ""}},
    {"n_butane", "n-C4H10", {"nC4", "butane", "normal_butane", "", ""}},
    {"isobutane", "i-C4H10", {"iC4", "i_butane", "2-methylpropane", "", ""}},
    {"n_pentane", "n-C5H12", {"nC5", "pentane", "normal_pentane", "", ""}},
    {"isopentane", "i-C5H12", {"iC5", "i_pentane", "2-methylbutane", "", ""}},
    {"n_hexane", "n-C6H14", {"C6", "nC6", "hexane", "C6H14", ""}},
    {"n_heptane", "n-C7H16", {"C7", "nC7", "heptane", "C7H16", ""}},
    {"n_octane", "n-C8H18", {"C8", "nC8", "octane", "C8H18", ""}},
    {"n_nonane", "n-C9H20", {"C9", "nC9", "nonane", "C9H20", ""}},
    {"n_decane", "n-C10H22", {"C10", "nC10", "decane", "C10H22", ""}},
    {"hydrogen", "H2", {"", "", "", "", ""}},
    {"oxygen", "O2", {"", "", "", "", ""}},
    {"carbon_monoxide", "CO", {"", "", "", "", ""}},
    {"water", "H2O", {"", "", "", "", ""}},
    {"hydrogen_sulfide", "H2S", {"", "", "", "", ""}},
    {"helium", "He", {"", "", "", "", ""}},
    {"argon", "Ar", {"", "", "", "", ""}},
}};

[[nodiscard]] constexpr std::string_view component_name(std::size_t i) noexcept {
  return i < max_components ? component_table[i].name : std::string_view{};
}

namespace detail_names {
[[nodiscard]] constexpr char fold(char c) noexcept {
  return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c;
}
[[nodiscard]] constexpr bool ignorable(char c) noexcept { return c == '-' || c == '_' || c == ' ' || c == '.'; }
// Compare two spellings with case and separators ignored.
[[nodiscard]] constexpr bool same_key(std::string_view a, std::string_view b) noexcept {
  std::size_t i = 0, j = 0;
  for (;;) {
    while (i < a.size() && ignorable(a[i])) ++i;
    while (j < b.size() && ignorable(b[j])) ++j;
    if (i == a.size() || j == b.size()) return i == a.size() && j == b.size();
    if (fold(a[i]) != fold(b[j])) return false;
    ++i;
    ++j;
  }
}
}  // namespace detail_names

// Finds a component by canonical name, formula or alias.
[[nodiscard]] constexpr std::optional<Component> find_component(std::string_view text) noexcept {
  if (text.empty()) return std::nullopt;
  for (std::size_t i = 0; i < max_components; ++i) {
    const auto& c = component_table[i];
    bool hit = detail_names::same_key(text, c.name) || detail_names::same_key(text, c.formula);
    for (auto a : c.aliases) hit = hit || (!a.empty() && detail_names::same_key(text, a));
    if (hit) return static_cast<Component>(i);
  }
  return std::nullopt;
}

}  // namespace zcorr
