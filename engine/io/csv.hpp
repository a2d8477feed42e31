// zcorr input layer: a small streaming CSV reader and writer (RFC 4180
// quoting; '#' lines before the header are comments).
#pragma once

#include <istream>
#include <ostream>
#include <string>
#include <vector>

namespace zcorr::io {

class CsvReader {
 public:
  explicit CsvReader(std::istream& in) : in_(in) {}
  // Reads the next record into `fields`; false at end of input.
  bool next(std::vector<std::string>& fields);
  [[nodiscard]] long line() const noexcept { return line_; }  // 1-based line of the last record read

 private:
  std::istream& in_;
  long line_ = 0;
};

// Writes one field, quoting when needed.
void write_csv_field(std::ostream& out, const std::string& field);
void write_csv_row(std::ostream& out, const std::vector<std::string>& fields);

}  // namespace zcorr::io
