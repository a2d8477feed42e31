// Sample gases shared by tests and benchmarks. Fictional analyses made up for
// testing (mole fractions summing to 1); no published source.
#pragma once

#include "core/composition.hpp"

namespace zcorr::samples {

// A 12-component pipeline gas.
inline Fractions<double> pipeline_gas_12() {
  Fractions<double> x{};
  x[index(Component::methane)] = 0.9;
  x[index(Component::nitrogen)] = 0.02;
  x[index(Component::carbon_dioxide)] = 0.015;
  x[index(Component::ethane)] = 0.045;
  x[index(Component::propane)] = 0.012;
  x[index(Component::n_butane)] = 0.002;
  x[index(Component::isobutane)] = 0.002;
  x[index(Component::n_pentane)] = 0.0008;
  x[index(Component::isopentane)] = 0.0007;
  x[index(Component::n_hexane)] = 0.0004;
  x[index(Component::hydrogen)] = 0.0015;
  x[index(Component::helium)] = 0.0006;
  return x;
}

}  // namespace zcorr::samples
