// zcorr evaluation layer: the method registry. Each method's adapter lives in
// its own file (<method>_adapter.cpp) and provides a factory declared here.
#include "eval/line_method.hpp"

namespace zcorr {

// Factories of the methods built into this binary, one line each.
std::unique_ptr<LineMethod> make_iso6976_line_method();
std::unique_ptr<LineMethod> make_gerg2008_method();
std::unique_ptr<LineMethod> make_sgerg88_line_method();  // sgerg88_adapter.cpp
std::unique_ptr<LineMethod> make_gross1_line_method();   // sgerg88_adapter.cpp
std::unique_ptr<LineMethod> make_gross2_line_method();   // sgerg88_adapter.cpp

std::unique_ptr<LineMethod> make_line_method(MethodId m) {
  switch (m) {
    case MethodId::iso6976: return make_iso6976_line_method();
    case MethodId::gerg2008: return make_gerg2008_method();
    case MethodId::sgerg88: return make_sgerg88_line_method();
    case MethodId::gross1: return make_gross1_line_method();
    case MethodId::gross2: return make_gross2_line_method();
    default: break;
  }
  return nullptr;
}

}  // namespace zcorr
