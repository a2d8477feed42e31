// zcorr evaluation layer: the method registry. Each method's adapter lives in
// its own file and provides a factory declared here.
#include "eval/line_method.hpp"

namespace zcorr {

// Factories of the methods built into this binary (defined in <method>_adapter.cpp).
std::unique_ptr<LineMethod> make_sgerg88_line_method();  // sgerg88_adapter.cpp
std::unique_ptr<LineMethod> make_gross1_line_method();   // sgerg88_adapter.cpp
std::unique_ptr<LineMethod> make_gross2_line_method();   // sgerg88_adapter.cpp

std::unique_ptr<LineMethod> make_line_method(MethodId m) {
  switch (m) {
    case MethodId::sgerg88: return make_sgerg88_line_method();
    case MethodId::gross1: return make_gross1_line_method();
    case MethodId::gross2: return make_gross2_line_method();
    default: break;
  }
  return nullptr;
}

}  // namespace zcorr
