// Zero heap allocations on the GERG-2008 compute path: this executable replaces
// the global operator new/delete with counting versions and evaluates states
// (templated engine in double and through the runtime LineMethod) between two
// reads of the counter.
#include <gtest/gtest.h>

#include "support/allocation_counter.hpp"

#include <atomic>
#include <cstdlib>
#include <new>

#include "eval/line_method.hpp"
#include "methods/gerg2008.hpp"

namespace {
}


using namespace zcorr;

namespace {
Fractions<double> gas() {
  Fractions<double> x{};
  x[index(Component::methane)] = 0.88;
  x[index(Component::nitrogen)] = 0.02;
  x[index(Component::carbon_dioxide)] = 0.015;
  x[index(Component::ethane)] = 0.045;
  x[index(Component::propane)] = 0.012;
  x[index(Component::n_butane)] = 0.002;
  x[index(Component::isobutane)] = 0.002;
  x[index(Component::n_pentane)] = 0.0008;
  x[index(Component::isopentane)] = 0.0007;
  x[index(Component::n_hexane)] = 0.0004;
  x[index(Component::hydrogen)] = 0.0215;
  x[index(Component::helium)] = 0.0006;
  return x;
}
}  // namespace

TEST(Gerg2008Allocations, CountingOperatorNewWorks) {
  const long before = heap::allocations();
  void* p = ::operator new(sizeof(int));  // a direct call cannot be elided
  ::operator delete(p);
  EXPECT_EQ(heap::allocations() - before, 1);
}

TEST(Gerg2008Allocations, PrepareAndStateDoNotAllocate) {
  static gerg2008::Prepared<double> p;  // static: the test itself must not allocate either
  const long before = heap::allocations();
  const auto st = gerg2008::prepare(gas(), p);
  double sum = 0;
  for (double T : {260.0, 288.15, 320.0})
    for (double P : {1e5, 5e6, 12e6}) sum += gerg2008::state(p, T, P).Z;
  // status paths too
  sum += gerg2008::state(p, -1.0, 1e6).Z + gerg2008::state(p, 900.0, 1e6).Z;
  const long after = heap::allocations();
  EXPECT_TRUE(st.ok());
  EXPECT_GT(sum, 7.0);  // nine computed states, Z about 0.8-1 each
  EXPECT_EQ(after - before, 0);
}

TEST(Gerg2008Allocations, LineMethodStateDoesNotAllocate) {
  auto m = make_line_method(MethodId::gerg2008);  // making the method allocates once, before counting
  ASSERT_NE(m, nullptr);
  EvalOptions opt;
  opt.derived = true;
  const long before = heap::allocations();
  const auto st = m->prepare(gas());
  double w = 0;
  for (double T : {260.0, 300.0, 340.0}) w += m->state(T, 8e6, opt)[Quantity::w_m_per_s];
  const long after = heap::allocations();
  EXPECT_TRUE(st.ok());
  EXPECT_GT(w, 900.0);
  EXPECT_EQ(after - before, 0);
}
