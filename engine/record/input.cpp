#include "record/input.hpp"

#include <cmath>

#include "core/units.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "record/timeutil.hpp"

namespace zcorr::record {
namespace {

std::string join_row(const std::vector<std::string>& r) {
  std::string s;
  for (std::size_t i = 0; i < r.size(); ++i) {
    if (i) s += ',';
    s += r[i];
  }
  if (s.size() > 200) s = s.substr(0, 200) + "...";
  return s;
}

// Reads the header, skipping '#' comment lines before it.
bool read_header(io::CsvReader& csv, std::vector<std::string>& header) {
  while (csv.next(header))
    if (header.empty() || io::trim(header[0]).substr(0, 1) != "#") return true;
  return false;
}

bool read_number(const std::string& text, double& v) {
  try {
    v = io::parse_number(text, "value");
    return true;
  } catch (const io::InputError&) {
    return false;
  }
}

}  // namespace

SampleReader::SampleReader(std::istream& in, std::string name, const PointConfig& cfg) : csv_(in), name_(std::move(name)), cfg_(cfg) {
  std::vector<std::string> header;
  if (!read_header(csv_, header)) throw io::InputError(name_, "", "the sample file is empty (a header line is required)");
  ncols_ = header.size();
  for (std::size_t i = 0; i < header.size(); ++i) {
    const std::string h(io::trim(header[i]));
    const int c = static_cast<int>(i);
    auto set = [&](int& slot) {
      if (slot >= 0) throw io::InputError(name_ + " header", h, "only one column of each kind (time, p, T, volume)");
      slot = c;
    };
    if (h == "time") set(c_time_);
    else if (h == "p_Pa") { set(c_p_); p_factor_ = 1; }
    else if (h == "p_kPa") { set(c_p_); p_factor_ = units::kPa; }
    else if (h == "p_MPa") { set(c_p_); p_factor_ = units::MPa; }
    else if (h == "p_bar") { set(c_p_); p_factor_ = units::bar; }
    else if (h == "p_psi") { set(c_p_); p_factor_ = units::psi; }
    else if (h == "T_K") { set(c_T_); T_kind_ = 0; }
    else if (h == "T_degC") { set(c_T_); T_kind_ = 1; }
    else if (h == "T_degF") { set(c_T_); T_kind_ = 2; }
    else if (h == "V_m3") { set(c_V_); V_factor_ = 1; }
    else if (h == "V_ft3") { set(c_V_); V_factor_ = units::ft3; }
    else if (h == "V_L") { set(c_V_); V_factor_ = units::L; }
    else if (h == "pulses") { set(c_V_); pulses_ = true; }
  }
  if (c_time_ < 0 || c_p_ < 0 || c_T_ < 0 || c_V_ < 0)
    throw io::InputError(name_ + " header", join_row(header),
                         "needs time, a pressure column (p_kPa, ...), a temperature column (T_K, T_degC, T_degF) and "
                         "V_m3 / V_ft3 / V_L or pulses");
  if (pulses_ != cfg_.pulses)
    throw io::InputError(name_ + " header", pulses_ ? "pulses" : "volume",
                         std::string("the point configuration says meter = ") + (cfg_.pulses ? "pulses" : "volume"));
}

SampleReader::Next SampleReader::next(RawSample& s, BadRow& bad) {
  if (!csv_.next(row_)) return Next::end;
  s = RawSample{};
  s.line = csv_.line();
  auto fail = [&](std::string why, std::optional<std::int64_t> t) {
    bad = BadRow{csv_.line(), join_row(row_), std::move(why), t};
    return Next::bad;
  };
  if (row_.size() != ncols_)
    return fail("has " + std::to_string(row_.size()) + " fields, the header has " + std::to_string(ncols_), std::nullopt);
  auto t = parse_time_utc(row_[static_cast<std::size_t>(c_time_)]);
  if (!t) return fail("the time '" + row_[static_cast<std::size_t>(c_time_)] + "' cannot be read", std::nullopt);
  s.t_utc_s = *t;
  const auto& vtext = row_[static_cast<std::size_t>(c_V_)];
  double v = 0;
  if (!read_number(vtext, v) || v < 0 || (pulses_ && v != std::floor(v)))
    return fail("the meter increment '" + vtext + "' cannot be read (a number >= 0" + (pulses_ ? ", whole pulses)" : ")"), t);
  if (pulses_) {
    s.pulses = static_cast<std::int64_t>(v);
    s.V_ind_m3 = v / cfg_.k_factor_per_m3;
  } else {
    s.V_ind_m3 = v * V_factor_;
  }
  double p = 0, T = 0;
  if (read_number(row_[static_cast<std::size_t>(c_p_)], p)) {
    s.p_Pa = p * p_factor_ + (cfg_.gauge ? cfg_.atm_p_Pa : 0.0);
  } else {
    s.problem = "pressure '" + row_[static_cast<std::size_t>(c_p_)] + "' unreadable";
  }
  if (read_number(row_[static_cast<std::size_t>(c_T_)], T)) {
    s.T_K = T_kind_ == 0 ? T : T_kind_ == 1 ? units::celsius_to_K(T) : units::fahrenheit_to_K(T);
  } else {
    if (!s.problem.empty()) s.problem += "; ";
    s.problem += "temperature '" + row_[static_cast<std::size_t>(c_T_)] + "' unreadable";
  }
  return Next::sample;
}

AnalysisFile read_analyses(std::istream& in, const std::string& name, const io::CompositionOptions& opt) {
  io::CsvReader csv(in);
  std::vector<std::string> header, row;
  if (!read_header(csv, header)) throw io::InputError(name, "", "the analysis file is empty (a header line is required)");
  int c_from = -1, c_sampled = -1, c_source = -1, c_hs = -1, c_ref = -1;
  std::array<int, max_components> c_x;
  c_x.fill(-1);
  for (std::size_t i = 0; i < header.size(); ++i) {
    const std::string h(io::trim(header[i]));
    const int c = static_cast<int>(i);
    if (h == "valid_from") c_from = c;
    else if (h == "sampled") c_sampled = c;
    else if (h == "source") c_source = c;
    else if (h == "Hs_MJ_per_m3") c_hs = c;
    else if (h == "hs_ref") c_ref = c;
    else if (auto comp = find_component(h); comp && h == component_name(index(*comp))) c_x[index(*comp)] = c;
  }
  bool any = false;
  for (int c : c_x) any = any || c >= 0;
  if (c_from < 0 || !any)
    throw io::InputError(name + " header", join_row(header), "needs valid_from and component columns by canonical name");
  AnalysisFile out;
  while (csv.next(row)) {
    const long line = csv.line();
    auto bad = [&](std::string why) { out.bad.push_back(BadRow{line, join_row(row), std::move(why), std::nullopt}); };
    if (row.size() != header.size()) { bad("has " + std::to_string(row.size()) + " fields, the header has " + std::to_string(header.size())); continue; }
    AnalysisInput a;
    auto t = parse_time_utc(row[static_cast<std::size_t>(c_from)]);
    if (!t) { bad("valid_from '" + row[static_cast<std::size_t>(c_from)] + "' cannot be read"); continue; }
    a.valid_from_utc_s = *t;
    if (c_sampled >= 0 && !io::trim(row[static_cast<std::size_t>(c_sampled)]).empty()) {
      a.sampled_utc_s = parse_time_utc(row[static_cast<std::size_t>(c_sampled)]);
      if (!a.sampled_utc_s) { bad("sampled '" + row[static_cast<std::size_t>(c_sampled)] + "' cannot be read"); continue; }
    }
    a.source = c_source >= 0 && !io::trim(row[static_cast<std::size_t>(c_source)]).empty()
                   ? std::string(io::trim(row[static_cast<std::size_t>(c_source)]))
                   : name + ":" + std::to_string(line);
    if (c_ref >= 0) a.hs_ref = std::string(io::trim(row[static_cast<std::size_t>(c_ref)]));
    try {
      if (c_hs >= 0 && !io::trim(row[static_cast<std::size_t>(c_hs)]).empty()) {
        a.Hs_MJ_per_m3 = io::parse_number(row[static_cast<std::size_t>(c_hs)], "Hs_MJ_per_m3");
        if (!(a.Hs_MJ_per_m3 > 0 && a.Hs_MJ_per_m3 < 200)) throw io::InputError("Hs_MJ_per_m3", row[static_cast<std::size_t>(c_hs)], "between 0 and 200 MJ/m3");
      }
      Fractions<double> x{};
      for (std::size_t i = 0; i < max_components; ++i)
        if (c_x[i] >= 0 && !io::trim(row[static_cast<std::size_t>(c_x[i])]).empty())
          x[i] = io::parse_number(row[static_cast<std::size_t>(c_x[i])], component_name(i));
      auto comp = io::finish_composition(x, opt, "analysis");
      a.x = comp.x;
      a.sum_as_given = comp.original_sum;
      a.normalised = comp.normalised;
    } catch (const io::InputError& e) {
      bad(e.what());
      continue;
    }
    if (!out.analyses.empty() && a.valid_from_utc_s <= out.analyses.back().valid_from_utc_s) {
      bad("valid_from is not later than the previous analysis");
      continue;
    }
    out.analyses.push_back(std::move(a));
  }
  return out;
}

}  // namespace zcorr::record
