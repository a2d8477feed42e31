#include "method_options.hpp"

#include "io/input_error.hpp"

namespace zcorr::cli {

void MethodOptions::add_to(CLI::App& app) {
  app.add_option("--method", method, "Method: gerg2008, detail, sgerg88, gross1, gross2, iso6976 (reference conditions only)")->capture_default_str();
  app.add_flag("--allow-outside-range", allow_outside_range,
               "Compute states outside the method's validated range (flagged 'extrapolated' in the status)");
}

std::unique_ptr<LineMethod> MethodOptions::make() const {
  auto id = method_from_name(method);
  if (!id)
    throw io::InputError("--method", method, "use gerg2008, detail, sgerg88, gross1, gross2 or iso6976 (reference conditions only)");
  auto m = make_line_method(*id);
  if (!m) throw io::InputError("--method", method, "this method is not available in this build of zcorr");
  return m;
}

EvalOptions MethodOptions::eval_options(bool derived) const {
  EvalOptions o;
  o.solve.allow_outside_range = allow_outside_range;
  o.derived = derived;
  return o;
}

}  // namespace zcorr::cli
