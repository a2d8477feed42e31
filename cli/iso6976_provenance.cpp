#include "iso6976_provenance.hpp"

#include "core/components.hpp"

namespace zcorr::cli {

std::string doubtful_rows_text(const iso6976::DoubtfulRows& d) {
  if (d.count == 0) return "none";
  std::string out;
  for (std::size_t i = 0; i < d.count; ++i) {
    const auto& r = d.rows[i];
    if (!out.empty()) out += ", ";
    out += std::string(component_name(index(r.component))) + " (";
    if (r.zs_doubtful) out += "Z/s " + std::string(iso6976::data::confidence_name(r.zs));
    if (r.zs_doubtful && r.hs_doubtful) out += ", ";
    if (r.hs_doubtful) out += "Hs " + std::string(iso6976::data::confidence_name(r.hs));
    out += ")";
  }
  return out;
}

std::string constants_text(const iso6976::DoubtfulConstants& c) {
  std::string out;
  if (c.L_water) out += "L(t) of water " + std::string(iso6976::data::confidence_name(c.L_water_confidence)) + " (net values)";
  if (c.Z_air) {
    if (!out.empty()) out += ", ";
    out += "Z_air " + std::string(iso6976::data::confidence_name(c.Z_air_confidence)) + " (d, Wobbe indices)";
  }
  return out.empty() ? "none" : out;
}

const char* const data_source_text =
    "ISO 6976:2016 Tables 1-3 as recalled in the project data set (not read from the standard; "
    "rows not recalled for 2016 are ISO 6976:1995 values; 15.55 C values interpolated)";

}  // namespace zcorr::cli
