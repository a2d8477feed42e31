// zcorr: the engine version and the source revision it was built from.
//
// engine_version() is the text every record that names its engine carries
// (log_header, point_config, interval, correction_set, schema_version) and
// the first line of `zcorr --version`: "zcorr 0.1.0 (revision 1a2b3c4)".
// The revision is the short commit hash of the git checkout the build came
// from, "-dirty" appended when tracked files differed from that commit, or
// "unknown" (a build from a tarball; -DZCORR_SOURCE_REVISION=... states it).
// Written at build time by cmake/source_revision.cmake.
#pragma once

#include <string>
#include <string_view>

namespace zcorr::record {

[[nodiscard]] const char* engine_release() noexcept;   // "0.1.0" (CMake PROJECT_VERSION)
[[nodiscard]] const char* source_revision() noexcept;  // "1a2b3c4", "1a2b3c4-dirty" or "unknown"
[[nodiscard]] const char* engine_version() noexcept;   // "zcorr 0.1.0 (revision 1a2b3c4)"

// A logged engine_version as engine_version() states it: records written
// before the revision was recorded say "zcorr 0.1.0", read as
// "zcorr 0.1.0 (revision unknown)"; an empty one is "an unknown version".
[[nodiscard]] std::string describe_engine_version(std::string_view logged);

}  // namespace zcorr::record
