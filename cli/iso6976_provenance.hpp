// zcorr CLI: how ISO 6976 results state the confidence of the data behind them.
#pragma once

#include <string>

#include "methods/iso6976.hpp"

namespace zcorr::cli {

// "methane (Hs medium), propane (Z/s medium)" or "none".
[[nodiscard]] std::string doubtful_rows_text(const iso6976::DoubtfulRows& d);
// Constants below medium-high confidence, or "none".
[[nodiscard]] std::string constants_text(const iso6976::DoubtfulConstants& c);
extern const char* const data_source_text;

}  // namespace zcorr::cli
