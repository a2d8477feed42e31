// zcorr engine core: the status carried by every result.
//
// Does not throw, does not allocate, does no I/O. Describing a status yields a
// pointer to a static string literal.
#pragma once

#include <cstdint>

namespace zcorr {

// Why a computation did or did not produce a usable number.
enum class Code : std::uint8_t {
  ok = 0,
  invalid_temperature,     // NaN, infinite or <= 0 K
  invalid_pressure,        // NaN, infinite or < 0 (or <= 0 where the method needs p > 0)
  invalid_composition,     // negative / non-finite fraction, empty mixture, bad sum
  out_of_range,            // refused: outside the method's validated (expanded) range
  no_convergence,          // iteration cap reached; the last iterate is returned
  no_gas_root,             // no gas-like density root at (T, p)
  two_phase,               // the state lies in the two-phase region
  coefficients_missing,    // the method's published coefficients are not known with
                           // confidence for this input (refused rather than invented)
  invalid_input,           // any other bad argument
};

// Where a state or composition lies relative to the method's stated ranges.
enum class RangeClass : std::uint8_t {
  not_classified = 0,  // the method has no range classification (or not yet run)
  normal,              // inside the normal (pipeline-quality) range
  expanded,            // inside the expanded / extended range only
  outside,             // outside every stated range (computed only when allowed)
};

// Extra information bits. Several can be set at once.
namespace flag {
inline constexpr std::uint16_t none = 0;
inline constexpr std::uint16_t extrapolated = 1u << 0;          // outside range, computed on request
inline constexpr std::uint16_t dew_point_suspected = 1u << 1;   // may be below the hydrocarbon dew point
inline constexpr std::uint16_t sum_not_unity = 1u << 2;         // mole fractions do not sum to 1 exactly
inline constexpr std::uint16_t iteration_cap = 1u << 3;         // iteration cap reached
inline constexpr std::uint16_t doubtful_data = 1u << 4;         // a component datum is of lower confidence
// A single-phase state within EvalOptions::dew_margin_K above the hydrocarbon dew temperature
// at its pressure (GERG-2008 phase check on the water-free gas, eval/phase_check.hpp).
inline constexpr std::uint16_t near_dew_point = 1u << 5;
}  // namespace flag

inline constexpr std::uint8_t no_component = 0xFF;

struct Status {
  Code code = Code::ok;
  RangeClass range = RangeClass::not_classified;
  std::uint16_t flags = flag::none;
  // Index (canonical order) of the component that caused the status, or no_component.
  std::uint8_t component = no_component;

  [[nodiscard]] constexpr bool ok() const noexcept { return code == Code::ok; }
  [[nodiscard]] constexpr bool has(std::uint16_t f) const noexcept { return (flags & f) != 0; }
};

[[nodiscard]] constexpr Status make_status(Code c, std::uint8_t component = no_component) noexcept {
  Status s;
  s.code = c;
  s.component = component;
  return s;
}

[[nodiscard]] constexpr const char* code_name(Code c) noexcept {
  switch (c) {
    case Code::ok: return "ok";
    case Code::invalid_temperature: return "invalid_temperature";
    case Code::invalid_pressure: return "invalid_pressure";
    case Code::invalid_composition: return "invalid_composition";
    case Code::out_of_range: return "out_of_range";
    case Code::no_convergence: return "no_convergence";
    case Code::no_gas_root: return "no_gas_root";
    case Code::two_phase: return "two_phase";
    case Code::coefficients_missing: return "coefficients_missing";
    case Code::invalid_input: return "invalid_input";
  }
  return "unknown";
}

[[nodiscard]] constexpr const char* range_name(RangeClass r) noexcept {
  switch (r) {
    case RangeClass::not_classified: return "not_classified";
    case RangeClass::normal: return "normal";
    case RangeClass::expanded: return "expanded";
    case RangeClass::outside: return "outside";
  }
  return "unknown";
}

}  // namespace zcorr
