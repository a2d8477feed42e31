// The detail method's compute path allocates nothing: this executable
// replaces the global operator new / delete with counting versions and
// checks that prepare() and state evaluation (templated method and the
// LineMethod adapter) make zero heap allocations.
#include <gtest/gtest.h>

#include "support/allocation_counter.hpp"

#include <atomic>
#include <cstdlib>
#include <new>

#include "eval/line_method.hpp"
#include "methods/detail.hpp"

namespace {
int* volatile g_escape = nullptr;  // keeps the self-check's allocation from being optimised away
}


using namespace zcorr;
using C = Component;

namespace {
// ISO 12213-2 Annex C gas 4 (14 components, hydrogen and CO; composition from
// the project's standards notes, from memory, medium). Only used as a
// realistic input here.
Fractions<double> gas4() {
  Fractions<double> x{};
  x[index(C::methane)] = 0.735;
  x[index(C::nitrogen)] = 0.100;
  x[index(C::carbon_dioxide)] = 0.016;
  x[index(C::ethane)] = 0.033;
  x[index(C::propane)] = 0.0074;
  x[index(C::isobutane)] = 0.0012;
  x[index(C::n_butane)] = 0.0012;
  x[index(C::isopentane)] = 0.0004;
  x[index(C::n_pentane)] = 0.0004;
  x[index(C::n_hexane)] = 0.0002;
  x[index(C::hydrogen)] = 0.095;
  x[index(C::carbon_monoxide)] = 0.010;
  x[index(C::n_heptane)] = 0.0001;
  x[index(C::n_octane)] = 0.0001;
  return x;
}
}  // namespace

TEST(DetailAllocations, CountingAllocatorSeesAllocations) {
  const long before = heap::allocations();
  g_escape = new int(3);
  delete g_escape;
  EXPECT_EQ(heap::allocations() - before, 1);  // the counter works
}

TEST(DetailAllocations, PrepareAndStateAllocateNothing) {
  const auto x = gas4();
  aga8_detail::Prepared<double> prep;
  SolveOptions opt;
  double sink = 0;
  const long before = heap::allocations();
  const Status s = aga8_detail::prepare(x, prep);
  for (double T : {270.0, 300.0, 330.0})
    for (double p : {1e5, 6e6, 12e6}) {
      const auto r = aga8_detail::evaluate(prep, T, p, opt, true);
      sink += r.Z + r.dZdT_per_K;
      const auto z = aga8_detail::z_factor(prep, T, p, opt);
      sink += z.Z;
    }
  sink += aga8_detail::evaluate(prep, -1.0, 1e6, opt).Z;  // a refused state too
  const long after = heap::allocations();
  EXPECT_TRUE(s.ok());
  EXPECT_GT(sink, 0.0);
  EXPECT_EQ(after - before, 0);
}

TEST(DetailAllocations, AdapterStateAllocatesNothing) {
  auto m = make_line_method(MethodId::detail);  // making the method allocates once (allowed)
  ASSERT_NE(m, nullptr);
  const auto x = gas4();
  EvalOptions opt;
  opt.derived = true;
  double sink = 0;
  const long before = heap::allocations();
  const Status s = m->prepare(x);
  for (double T : {270.0, 300.0, 330.0})
    for (double p : {1e5, 6e6, 12e6}) sink += m->state(T, p, opt)[Quantity::Z];
  const long after = heap::allocations();
  EXPECT_TRUE(s.ok());
  EXPECT_GT(sink, 0.0);
  EXPECT_EQ(after - before, 0);
}
