// ISO 6976:2016 properties of an 11-component gas (ISO 12213 example gas 1,
// from memory, project standards notes), double and cpp_bin_float_50.
#include <benchmark/benchmark.h>

#include <boost/multiprecision/cpp_bin_float.hpp>

#include "methods/iso6976.hpp"

namespace {

zcorr::Fractions<double> gas1() {
  using zcorr::Component;
  zcorr::Fractions<double> x{};
  auto set = [&](Component c, double v) { x[zcorr::index(c)] = v; };
  set(Component::methane, 0.965);
  set(Component::nitrogen, 0.003);
  set(Component::carbon_dioxide, 0.006);
  set(Component::ethane, 0.018);
  set(Component::propane, 0.0045);
  set(Component::isobutane, 0.001);
  set(Component::n_butane, 0.001);
  set(Component::isopentane, 0.0005);
  set(Component::n_pentane, 0.0003);
  set(Component::n_hexane, 0.0007);
  return x;
}

void BM_iso6976_double(benchmark::State& st) {
  const auto x = gas1();
  for (auto _ : st) {
    auto r = zcorr::iso6976::properties(x, zcorr::iso6976::CombustionRef::t25C, zcorr::iso6976::MeteringRef::t0C);
    benchmark::DoNotOptimize(r);
  }
}
BENCHMARK(BM_iso6976_double);

void BM_iso6976_mp50(benchmark::State& st) {
  using mp = boost::multiprecision::cpp_bin_float_50;
  const auto x = zcorr::convert_fractions<mp>(gas1());
  for (auto _ : st) {
    auto r = zcorr::iso6976::properties(x, zcorr::iso6976::CombustionRef::t25C, zcorr::iso6976::MeteringRef::t0C, mp(101325));
    benchmark::DoNotOptimize(r);
  }
}
BENCHMARK(BM_iso6976_mp50);

}  // namespace
