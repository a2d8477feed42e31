// Property: no method returns a non-finite number with status ok. Random
// compositions (pipeline-like and arbitrary), temperatures and pressures
// from far below to far above every method's range, denormals and zeros
// included, through every line method of the build and the gross inputs of
// the gross methods. The inputs are random (fixed seeds); the property is the
// engine's own rule (DEVELOPERS.md: no NaN or infinity leaves with status ok).
#include <gtest/gtest.h>

#include <cmath>
#include <limits>
#include <random>

#include "core/components.hpp"
#include "eval/line_method.hpp"

using namespace zcorr;

namespace {

double log_uniform(std::mt19937_64& g, double lo, double hi) {
  std::uniform_real_distribution<double> u(std::log(lo), std::log(hi));
  return std::exp(u(g));
}

// A temperature or pressure: mostly log-uniform over a huge span, sometimes an edge value.
double edge_or(std::mt19937_64& g, double lo, double hi, std::initializer_list<double> edges) {
  std::uniform_int_distribution<int> pick(0, 9);
  if (pick(g) == 0) {
    std::uniform_int_distribution<std::size_t> e(0, edges.size() - 1);
    return *(edges.begin() + e(g));
  }
  return log_uniform(g, lo, hi);
}

Fractions<double> random_gas(std::mt19937_64& g) {
  Fractions<double> x{};
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const bool pipeline = u(g) < 0.6;
  double sum = 0;
  for (std::size_t i = 0; i < max_components; ++i) {
    const double r = u(g);
    x[i] = pipeline ? (r < 0.5 ? 0.0 : r * 0.05) : (r < 0.3 ? 0.0 : r);
    sum += x[i];
  }
  if (pipeline) {  // methane (component 0) makes up the rest
    x[0] = 0;
    sum = 0;
    for (double v : x) sum += v;
    if (sum > 0.12) for (auto& v : x) v *= 0.12 / sum;
    sum = 0;
    for (double v : x) sum += v;
    x[0] = 1.0 - sum;
    return x;
  }
  if (sum == 0) x[0] = sum = 1;
  for (auto& v : x) v /= sum;
  return x;
}

// Returns how many states came back ok. Half the states are drawn near the
// metering range (250-330 K, 0.1-12 MPa) so that many are computed.
int expect_no_non_finite_ok(LineMethod& m, std::mt19937_64& g, int states, const char* what) {
  static constexpr double tiny = std::numeric_limits<double>::denorm_min();
  int ok = 0;
  for (int k = 0; k < states; ++k) {
    const bool near = (k % 2) == 0;
    const double T = near ? log_uniform(g, 250, 330) : edge_or(g, 1e-3, 1e5, {tiny, 1e-300, 90.0, 1e300});
    const double p = near ? log_uniform(g, 1e5, 1.2e7) : edge_or(g, 1e-6, 1e12, {tiny, 1e-300, 1e300, std::numeric_limits<double>::max()});
    EvalOptions opt;
    opt.derived = (k % 3) == 0;
    const StateOutput out = m.state(T, p, opt);
    if (!out.status.ok()) continue;
    ++ok;
    for (std::size_t q = 0; q < out.q.size(); ++q)
      if (!std::isnan(out.q[q]))
        EXPECT_TRUE(std::isfinite(out.q[q])) << what << ": " << quantity_names[q] << " = " << out.q[q] << " with status ok at T = " << T
                                             << " K, p = " << p << " Pa";
    EXPECT_TRUE(std::isfinite(out[Quantity::Z]) && out[Quantity::Z] > 0)
        << what << ": Z = " << out[Quantity::Z] << " with status ok at T = " << T << " K, p = " << p << " Pa";
  }
  return ok;
}

}  // namespace

TEST(NoNonFiniteOk, EveryLineMethodOverRandomCompositionsAndStates) {
  std::mt19937_64 g(20261202);
  for (const MethodId id : {MethodId::gerg2008, MethodId::detail, MethodId::sgerg88, MethodId::gross1, MethodId::gross2}) {
    auto m = make_line_method(id);
    if (!m) continue;  // not in this build
    const std::string name(method_name(id));
    int prepared = 0, ok = 0;
    for (int c = 0; c < 40; ++c) {
      const auto x = random_gas(g);
      if (!m->prepare(x).ok()) continue;
      ++prepared;
      ok += expect_no_non_finite_ok(*m, g, 60, name.c_str());
    }
    EXPECT_GT(prepared, 0) << name << " prepared none of the random gases";
    // The gross methods take few random analyses (narrow ranges); the next test gives them gross inputs.
    if (id == MethodId::gerg2008 || id == MethodId::detail) EXPECT_GT(ok, 50) << name << ": too few states computed for the property to say much";
  }
}

TEST(NoNonFiniteOk, GrossMethodsOverRandomGrossInputs) {
  std::mt19937_64 g(7);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (const MethodId id : {MethodId::sgerg88, MethodId::gross1, MethodId::gross2}) {
    auto m = make_line_method(id);
    if (!m) continue;
    const std::string name(method_name(id));
    int prepared = 0, ok = 0;
    for (int c = 0; c < 120; ++c) {
      GrossInputs in;
      in.Hs_MJ_per_m3 = u(g) < 0.1 ? std::numeric_limits<double>::denorm_min() : 10 + 50 * u(g);
      in.d = u(g) < 0.1 ? 1e-300 : 0.3 + 0.8 * u(g);
      in.x_CO2 = 0.3 * u(g);
      in.x_H2 = u(g) < 0.5 ? 0.0 : 0.1 * u(g);
      in.x_N2 = 0.5 * u(g);
      if (!m->prepare_gross(in).ok()) continue;
      ++prepared;
      ok += expect_no_non_finite_ok(*m, g, 40, name.c_str());
    }
    EXPECT_GT(prepared, 5) << name;
    EXPECT_GT(ok, 40) << name << ": too few states computed for the property to say much";
  }
}
