// zcorr reference cases: the kinds of case and what each computes.
//
// A kind reads a case's inputs and returns named results; run_case compares
// them with the expectations. Each kind is registered in case_kinds.cpp.
#pragma once

#include <functional>
#include <map>
#include <string>
#include <string_view>

#include "cases/reference_case.hpp"

namespace zcorr::cases {

using KindFn = std::function<std::map<std::string, double>(const RefCase&)>;

// nullptr for an unknown kind.
[[nodiscard]] const KindFn* find_kind(std::string_view name);

}  // namespace zcorr::cases
