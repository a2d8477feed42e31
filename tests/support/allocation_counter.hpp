// Counting replacements of the global operator new / delete, for the tests
// that show the compute path allocates nothing (engine rule: no heap after
// prepare). Include in exactly one translation unit of a test executable;
// read the count with zcorr::heap::allocations().
#pragma once

#include <atomic>
#include <cstdlib>
#include <new>

namespace zcorr::heap {
inline std::atomic<long> allocation_count{0};
inline long allocations() noexcept { return allocation_count.load(std::memory_order_relaxed); }
}  // namespace zcorr::heap

void* operator new(std::size_t n) {
  zcorr::heap::allocation_count.fetch_add(1, std::memory_order_relaxed);
  if (void* p = std::malloc(n == 0 ? 1 : n)) return p;
  throw std::bad_alloc();
}
void* operator new[](std::size_t n) {
  zcorr::heap::allocation_count.fetch_add(1, std::memory_order_relaxed);
  if (void* p = std::malloc(n == 0 ? 1 : n)) return p;
  throw std::bad_alloc();
}
void* operator new(std::size_t n, const std::nothrow_t&) noexcept {
  zcorr::heap::allocation_count.fetch_add(1, std::memory_order_relaxed);
  return std::malloc(n == 0 ? 1 : n);
}
void* operator new[](std::size_t n, const std::nothrow_t&) noexcept {
  zcorr::heap::allocation_count.fetch_add(1, std::memory_order_relaxed);
  return std::malloc(n == 0 ? 1 : n);
}
void operator delete(void* p) noexcept { std::free(p); }
void operator delete[](void* p) noexcept { std::free(p); }
void operator delete(void* p, std::size_t) noexcept { std::free(p); }
void operator delete[](void* p, std::size_t) noexcept { std::free(p); }
