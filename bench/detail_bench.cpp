// Speed of the AGA8 detail method (methods/detail.hpp): prepare() for a
// 12-component gas (target <= 10 us) and Z(T, p) for a prepared composition
// (target <= 0.5 us median). Run with --benchmark_repetitions=10
// --benchmark_report_aggregates_only=true for medians.
#include <benchmark/benchmark.h>

#include "eval/line_method.hpp"
#include "methods/detail.hpp"

using namespace zcorr;
using C = Component;

namespace {

// A 12-component pipeline gas (illustrative composition, normal range).
Fractions<double> gas12() {
  Fractions<double> x{};
  x[index(C::methane)] = 0.9000;
  x[index(C::nitrogen)] = 0.0200;
  x[index(C::carbon_dioxide)] = 0.0150;
  x[index(C::ethane)] = 0.0450;
  x[index(C::propane)] = 0.0120;
  x[index(C::isobutane)] = 0.0025;
  x[index(C::n_butane)] = 0.0030;
  x[index(C::isopentane)] = 0.0008;
  x[index(C::n_pentane)] = 0.0007;
  x[index(C::n_hexane)] = 0.0005;
  x[index(C::hydrogen)] = 0.0003;
  x[index(C::helium)] = 0.0002;
  return x;
}

void BM_DetailPrepare12(benchmark::State& state) {
  const auto x = gas12();
  aga8_detail::Prepared<double> p;
  for (auto _ : state) {
    benchmark::DoNotOptimize(aga8_detail::prepare(x, p));
    benchmark::ClobberMemory();
  }
}
BENCHMARK(BM_DetailPrepare12);

// Z and density at a line state (6 MPa, 285 K), prepared composition.
void BM_DetailZ(benchmark::State& state) {
  aga8_detail::Prepared<double> p;
  (void)aga8_detail::prepare(gas12(), p);
  const SolveOptions opt;
  double T = 285.0, P = 6.0e6;
  for (auto _ : state) {
    benchmark::DoNotOptimize(T);
    benchmark::DoNotOptimize(P);
    auto z = aga8_detail::z_factor(p, T, P, opt);
    benchmark::DoNotOptimize(z);
  }
}
BENCHMARK(BM_DetailZ);

// Z over a spread of states (base to 12 MPa, 265-335 K).
void BM_DetailZSweep(benchmark::State& state) {
  aga8_detail::Prepared<double> p;
  (void)aga8_detail::prepare(gas12(), p);
  const SolveOptions opt;
  const double Ts[4] = {265.0, 288.15, 310.0, 335.0}, Ps[4] = {101325.0, 2.0e6, 7.0e6, 12.0e6};
  std::size_t k = 0;
  for (auto _ : state) {
    auto z = aga8_detail::z_factor(p, Ts[k & 3u], Ps[(k >> 2) & 3u], opt);
    benchmark::DoNotOptimize(z);
    ++k;
  }
}
BENCHMARK(BM_DetailZSweep);

// Everything (Z, densities, B, C, dZ/dp, dZ/dT) through the LineMethod adapter.
void BM_DetailAdapterDerived(benchmark::State& state) {
  auto m = make_line_method(MethodId::detail);
  (void)m->prepare(gas12());
  EvalOptions opt;
  opt.derived = true;
  for (auto _ : state) {
    auto out = m->state(285.0, 6.0e6, opt);
    benchmark::DoNotOptimize(out);
  }
}
BENCHMARK(BM_DetailAdapterDerived);

}  // namespace
