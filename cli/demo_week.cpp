// zcorr demo, the week: Hollin Ford town-border station, meter run HF-1 (a
// fictional scenario; every number here is invented for the demonstration).
// One week of 1-minute samples (line pressure and temperature swings, the
// turbine meter's volume), a gas analysis every 15 minutes from the station's
// chromatograph, one pressure-transmitter spike (conversion stopped, fault
// register counting, alarm events), and a configuration change after the
// meter was proved (meter factor 1.0000 -> 1.0021). The files are written to
// the demo folder in the formats `zcorr record` reads, recorded the same way
// the command does, and the log is verified.
#include "demo_week.hpp"

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iomanip>
#include <iostream>
#include <numbers>
#include <sstream>

#include "common.hpp"
#include "eval/line_method.hpp"
#include "io/input_error.hpp"
#include "io/text.hpp"
#include "record/config.hpp"
#include "record/input.hpp"
#include "record/log.hpp"
#include "record/quantities.hpp"
#include "record/recorder.hpp"
#include "record/tables.hpp"
#include "record/timeutil.hpp"
#include "record/verify.hpp"

namespace zcorr::cli {
namespace {

using namespace zcorr::record;

// The scenario's clock: contract days start at 06:00 local, local = UTC+01:00.
constexpr const char* week_start = "2026-03-02T05:00:00Z";  // Monday 06:00 local
constexpr int minutes = 7 * 24 * 60;
constexpr int change_minute = 3 * 24 * 60 + 6 * 60;         // Thursday 12:00 local: meter proved
constexpr int spike_minute = 2 * 24 * 60 + 8 * 60 + 7;      // Wednesday 14:07 local, three minutes
constexpr double atm_kPa = 100.9;                           // site barometric pressure

// A small deterministic noise source (xorshift), so every run is the same.
struct Noise {
  std::uint64_t s = 0x9E3779B97F4A7C15ull;
  double next() {  // in [-1, 1)
    s ^= s << 13;
    s ^= s >> 7;
    s ^= s << 17;
    return static_cast<double>(s >> 11) / static_cast<double>(1ull << 52) - 1.0;
  }
};

std::string config_text(const DemoWeekOptions& o, double meter_factor, const std::string& note) {
  std::ostringstream c;
  c << "# Hollin Ford town-border station, meter run HF-1 (fictional)\n"
    << "point = HF-1\n"
    << "method = " << o.method << '\n';
  if (o.base.name == "custom")
    c << "base_T = " << io::format_number(o.base.T_K) << " K\nbase_p = " << io::format_number(o.base.p_Pa) << " Pa\n";
  else
    c << "base = " << o.base.name << '\n';
  c << "atm = " << atm_kPa << " kPa\n"
    << "pressure = gauge\n"
    << "meter = volume\n"
    << "meter_factor = " << io::format_number(meter_factor) << '\n'
    << "interval = 60\n"
    << "contract_hour = 6\n"
    << "utc_offset = +01:00\n"
    << "averaging = flow_linear\n"
    << "integration = per_sample\n"
    << "p_min = 1500 kPa\np_max = 6000 kPa\n"  // gauge, as the transmitter reads
    << "T_min = -15 degC\nT_max = 45 degC\n"
    << "energy_unit = GJ\n"
    << "note = " << note << '\n';
  return c.str();
}

// Writes rows [from, to) of the week's samples.
void write_samples(const std::filesystem::path& file, std::int64_t t0, int from, int to) {
  std::ofstream f(file);
  f << "# Hollin Ford HF-1, 1-minute samples (fictional). p gauge, T line, V turbine meter volume in the minute.\n"
    << "time,p_kPa,T_degC,V_m3\n";
  Noise n;
  const double two_pi = 2.0 * std::numbers::pi;
  for (int i = 0; i < to; ++i) {
    const double noise_p = n.next(), noise_T = n.next(), noise_v = n.next();
    if (i < from) continue;
    const double h = static_cast<double>(i) / 60.0;           // hours since Monday 06:00 local
    const double clock = std::fmod(h + 6.0, 24.0);             // local clock hour
    const int day = static_cast<int>(h / 24.0);
    const double weekend = day >= 5 ? 0.78 : 1.0;
    double p = 4150.0 + 80.0 * std::sin(two_pi * (clock - 10.0) / 24.0) - 25.0 * std::sin(two_pi * h / 168.0) + 1.5 * noise_p;
    const double T = 9.0 + 3.0 * std::sin(two_pi * (clock - 15.0) / 24.0) + 0.8 * std::sin(two_pi * h / 168.0) + 0.05 * noise_T;
    const double q_m3_per_h = weekend * (1400.0 + 900.0 * std::exp(-std::pow((clock - 8.0) / 1.8, 2)) +
                                         1100.0 * std::exp(-std::pow((clock - 18.5) / 2.2, 2)));
    const double v = q_m3_per_h / 60.0 * (1.0 + 0.01 * noise_v);
    if (i >= spike_minute && i < spike_minute + 3) p = 9999.0;  // the transmitter spike
    f << format_time_utc(t0 + 60 * (i + 1)) << ',' << std::fixed << std::setprecision(1) << p << ',' << std::setprecision(2) << T << ','
      << std::setprecision(4) << v << '\n';
  }
}

void write_analyses(const std::filesystem::path& file, std::int64_t t0) {
  // The station's gas with slow swings, renormalised to sum 1 exactly (to 1e-6).
  std::ofstream f(file);
  f << "# Hollin Ford HF-1, chromatograph analyses every 15 minutes (fictional). Mole fractions.\n"
    << "valid_from,sampled,source,methane,ethane,propane,isobutane,n_butane,isopentane,n_pentane,n_hexane,nitrogen,carbon_dioxide\n";
  const double two_pi = 2.0 * std::numbers::pi;
  for (int k = 0; k < minutes / 15; ++k) {
    const double h = k * 0.25;
    const double s = std::sin(two_pi * h / 31.0), c = std::cos(two_pi * h / 53.0);
    double x[10] = {0, 0.0450 + 0.0020 * s, 0.0110 + 0.0006 * s, 0.0015, 0.0018, 0.0005, 0.0004, 0.0003,
                    0.0165 + 0.0015 * c, 0.0110 - 0.0010 * c};
    double rest = 0;
    for (int i = 1; i < 10; ++i) {
      x[i] = std::round(x[i] * 1e6) / 1e6;
      rest += x[i];
    }
    x[0] = std::round((1.0 - rest) * 1e6) / 1e6;
    const std::int64_t t = t0 + 900 * k;
    f << format_time_utc(t) << ',' << format_time_utc(t - 300) << ",GC-HF1 run " << (4400 + k);
    f << std::fixed << std::setprecision(6);
    for (double v : x) f << ',' << v;
    f << '\n';
  }
}

RecordStats record_files(const std::filesystem::path& db, const std::filesystem::path& conf, const std::filesystem::path& samples,
                         const std::filesystem::path& analyses) {
  const PointConfig cfg = load_point_config(conf.string());
  const auto id = method_from_name(cfg.method);
  auto method = id ? make_line_method(*id) : nullptr;
  if (!method) throw io::InputError("--method", cfg.method, "this method is not available in this build of zcorr");
  std::ifstream af(analyses);
  const auto a = read_analyses(af, analyses.string(), {});
  std::ifstream sf(samples);
  SampleReader reader(sf, samples.string(), cfg);
  Log log(db, {OpenMode::writer});
  RecordOptions ro;
  ro.input_name = samples.filename().string();
  Recorder rec(log, cfg, *method, ro);
  for (const auto& b : a.bad) rec.add_bad_analysis(b);
  rec.add_analyses(a.analyses);
  rec.feed(reader);
  rec.finish();
  return rec.stats();
}

std::string fixed(double v, int d) {
  std::ostringstream s;
  s << std::fixed << std::setprecision(d) << v;
  return s.str();
}

}  // namespace

int run_demo_week(const DemoWeekOptions& o) {
  const std::filesystem::path dir = o.dir;
  std::filesystem::create_directories(dir);
  const auto db = dir / "hollin-ford.db";
  for (auto suffix : {"", "-wal", "-shm", "-writer.lock"}) std::filesystem::remove(db.string() + suffix);
  const std::int64_t t0 = *parse_time_utc(week_start);
  {
    std::ofstream(dir / "hf1.conf") << config_text(o, 1.0, "turbine meter TM-2207, factor from the last proving");
    std::ofstream(dir / "hf1-proved.conf") << config_text(o, 1.0021, "meter proved Thursday 11:40, factor 1.0021");
  }
  write_samples(dir / "samples-mon-thu.csv", t0, 0, change_minute);
  write_samples(dir / "samples-thu-mon.csv", t0, change_minute, minutes);
  write_analyses(dir / "analyses.csv", t0);

  std::cout << "zcorr demo: Hollin Ford town-border station, meter run HF-1 (a fictional scenario)\n"
            << "One week of 1-minute samples, an analysis every 15 minutes, a pressure-transmitter spike on\n"
            << "Wednesday 14:07-14:10 and a meter factor change on Thursday 12:00, recorded to an interval log:\n"
            << "  zcorr record --db " << db.string() << " --config " << (dir / "hf1.conf").string() << " --samples "
            << (dir / "samples-mon-thu.csv").string() << " --analyses " << (dir / "analyses.csv").string() << '\n'
            << "  zcorr record --db " << db.string() << " --config " << (dir / "hf1-proved.conf").string() << " --samples "
            << (dir / "samples-thu-mon.csv").string() << " --analyses " << (dir / "analyses.csv").string() << "\n\n";
  const auto s1 = record_files(db, dir / "hf1.conf", dir / "samples-mon-thu.csv", dir / "analyses.csv");
  const auto s2 = record_files(db, dir / "hf1-proved.conf", dir / "samples-thu-mon.csv", dir / "analyses.csv");

  Log log(db, {OpenMode::read_only});
  const auto days = read_quantities(log, "HF-1", "day");
  std::cout << "Daily quantity transaction records (contract day from 06:00 local, UTC+01:00; base " << o.base.name << ", "
            << o.method << "; registers exact to 1e-6 m3 and 1 J)\n"
            << " contract day  flow h  alarm s   p kPa abs   T degC           V_f m3            V_b m3      fault m3         energy MJ  Hs MJ/m3\n";
  std::int64_t vf = 0, vb = 0, vx = 0, e = 0;
  for (const auto& d : days) {
    std::cout << ' ' << std::left << std::setw(12) << d.contract_day << std::right << std::setw(8)
              << fixed(static_cast<double>(d.flow_time_s) / 3600.0, 2) << std::setw(9) << d.alarm_time_s << std::setw(12)
              << (d.p_avg_Pa ? fixed(*d.p_avg_Pa / 1000.0, 2) : "") << std::setw(9) << (d.T_avg_K ? fixed(*d.T_avg_K - 273.15, 2) : "")
              << std::setw(17) << decimal(d.V_f_um3, 6) << std::setw(18) << decimal(d.V_b_um3, 6) << std::setw(14)
              << decimal(d.V_fault_um3, 6) << std::setw(18) << decimal(d.E_J, 6) << std::setw(10)
              << (d.Hs_avg_MJ_per_m3 ? fixed(*d.Hs_avg_MJ_per_m3, 4) : "") << '\n';
    vf += d.V_f_um3;
    vb += d.V_b_um3;
    vx += d.V_fault_um3;
    e += d.E_J;
  }
  std::cout << " week        " << std::setw(8 + 9 + 12 + 9 + 17) << decimal(vf, 6) << std::setw(18) << decimal(vb, 6) << std::setw(14)
            << decimal(vx, 6) << std::setw(18) << decimal(e, 6) << "\n\n";
  {
    Stmt ev(log.db(), "SELECT time_utc_s, kind, detail FROM event WHERE kind IN ('alarm_begin', 'alarm_end', 'config_change') ORDER BY seq");
    std::cout << "Events (alarms and configuration changes; all events are in the log):\n";
    while (ev.step())
      std::cout << "  " << format_time_utc(ev.i64(0)) << "  " << std::left << std::setw(14) << ev.text(1) << std::right << ev.text(2) << '\n';
  }
  const auto v = verify_log(log);
  std::cout << "\nLog " << db.string() << ": " << v.records << " records (" << (s1.intervals + s2.intervals) << " intervals, "
            << (s1.hours + s2.hours) << " hourly and " << (s1.days + s2.days) << " daily records, " << (s1.events + s2.events)
            << " events, " << (s1.analyses + s2.analyses) << " analyses), "
            << std::filesystem::file_size(db) / 1024 << " KiB\n"
            << "verify: " << (v.findings_total == 0 ? "clean" : std::to_string(v.findings_total) + " finding(s)") << ", head seq " << v.last_seq
            << " hash " << to_hex(v.head_hash) << '\n'
            << "Check it yourself: zcorr verify --db " << db.string() << "\n"
            << "Audit it (every interval recomputed), with a report to open in a browser:\n"
            << "  zcorr audit --db " << db.string() << " --report " << (dir / "audit.html").string() << "\n"
            << "What if the contract's base pressure were 101.56 kPa; then write that as a correction set:\n"
            << "  zcorr audit --db " << db.string() << " --what-if-base-p \"101.56 kPa\"\n"
            << "  zcorr correct --db " << db.string() << " --point HF-1 --base-p \"101.56 kPa\" --reason \"contract base pressure\"\n\n"
            << caution_text << '\n';
  return v.findings_total == 0 ? exit_ok : exit_partial;
}

}  // namespace zcorr::cli
