#include "progress.hpp"

#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cstdio>
#include <memory>

namespace zcorr::cli {

std::string progress_line(const std::string& label, std::int64_t done, std::int64_t total, int width) {
  const double f = total > 0 ? std::clamp(static_cast<double>(done) / static_cast<double>(total), 0.0, 1.0) : 1.0;
  const int full = static_cast<int>(f * width);
  std::string bar(static_cast<std::size_t>(full), '#');
  bar.append(static_cast<std::size_t>(width - full), '.');
  char tail[96];
  std::snprintf(tail, sizeof tail, "] %3d%%  %lld / %lld intervals", static_cast<int>(f * 100.0), static_cast<long long>(done),
                static_cast<long long>(total));
  return label + " [" + bar + tail;
}

std::function<void(std::int64_t, std::int64_t)> stderr_progress(std::string label) {
  if (!::isatty(STDERR_FILENO)) return {};
  struct State {
    std::string label;
    std::chrono::steady_clock::time_point last{};
    std::size_t drawn = 0;
  };
  auto st = std::make_shared<State>();
  st->label = std::move(label);
  return [st](std::int64_t done, std::int64_t total) {
    const auto now = std::chrono::steady_clock::now();
    const bool end = done >= total && done > 0;
    if (!end && done != 0 && now - st->last < std::chrono::milliseconds(100)) return;
    st->last = now;
    if (end) {  // erase the bar: the command's own output follows
      std::fprintf(stderr, "\r%s\r", std::string(st->drawn, ' ').c_str());
      std::fflush(stderr);
      st->drawn = 0;
      return;
    }
    const std::string line = progress_line(st->label, done, total);
    st->drawn = std::max(st->drawn, line.size());
    std::fprintf(stderr, "\r%s", line.c_str());
    std::fflush(stderr);
  };
}

}  // namespace zcorr::cli
