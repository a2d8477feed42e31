#include "io/csv.hpp"

namespace zcorr::io {

bool CsvReader::next(std::vector<std::string>& fields) {
  fields.clear();
  std::string line;
  for (;;) {
    if (!std::getline(in_, line)) return false;
    ++line_;
    if (!line.empty() && line.back() == '\r') line.pop_back();
    if (line.empty()) continue;  // blank lines carry no record
    break;
  }
  std::string field;
  bool quoted = false;
  std::size_t i = 0;
  for (;;) {
    if (i == line.size()) {
      if (quoted) {  // a quoted field spans a line break
        std::string more;
        if (!std::getline(in_, more)) break;
        ++line_;
        if (!more.empty() && more.back() == '\r') more.pop_back();
        field.push_back('\n');
        line = more;
        i = 0;
        continue;
      }
      break;
    }
    char c = line[i++];
    if (quoted) {
      if (c == '"') {
        if (i < line.size() && line[i] == '"') { field.push_back('"'); ++i; }
        else quoted = false;
      } else {
        field.push_back(c);
      }
    } else if (c == '"') {
      quoted = true;
    } else if (c == ',') {
      fields.push_back(std::move(field));
      field.clear();
    } else {
      field.push_back(c);
    }
  }
  fields.push_back(std::move(field));
  return true;
}

void write_csv_field(std::ostream& out, const std::string& f) {
  if (f.find_first_of(",\"\n\r") == std::string::npos) { out << f; return; }
  out << '"';
  for (char c : f) {
    if (c == '"') out << '"';
    out << c;
  }
  out << '"';
}

void write_csv_row(std::ostream& out, const std::vector<std::string>& fields) {
  for (std::size_t i = 0; i < fields.size(); ++i) {
    if (i) out << ',';
    write_csv_field(out, fields[i]);
  }
  out << '\n';
}

}  // namespace zcorr::io
