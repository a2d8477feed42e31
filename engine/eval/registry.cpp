// zcorr evaluation layer: the method registry. Each method's adapter lives in
// its own file and provides a factory declared here.
#include "eval/line_method.hpp"

namespace zcorr {

// Factories of the methods built into this binary (defined in <method>_adapter.cpp).
std::unique_ptr<LineMethod> make_detail_method();

std::unique_ptr<LineMethod> make_line_method(MethodId m) {
  switch (m) {
    case MethodId::detail: return make_detail_method();
    default: break;
  }
  return nullptr;
}

}  // namespace zcorr
