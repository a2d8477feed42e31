#include "record/version.hpp"

namespace zcorr::record {

std::string describe_engine_version(std::string_view logged) {
  if (logged.empty()) return "an unknown version (revision unknown)";
  if (logged.find("(revision ") != std::string_view::npos) return std::string(logged);
  return std::string(logged) + " (revision unknown)";
}

}  // namespace zcorr::record
