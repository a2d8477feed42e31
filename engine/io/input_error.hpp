// zcorr input layer: the one error type for bad input.
//
// Everything in engine/io may throw InputError; the CLI turns it into a
// one-line message and exit code 2 (what() is always one line of valid
// UTF-8; field(), value() and allowed() keep what was given). The engine core never throws.
#pragma once

#include <stdexcept>
#include <string>

#include "io/text.hpp"

namespace zcorr::io {

class InputError : public std::runtime_error {
 public:
  // field: which input; value: what was given; allowed: what would be accepted.
  InputError(std::string field, std::string value, std::string allowed)
      : std::runtime_error(compose(field, value, allowed)),
        field_(std::move(field)), value_(std::move(value)), allowed_(std::move(allowed)) {}
  [[nodiscard]] const std::string& field() const noexcept { return field_; }
  [[nodiscard]] const std::string& value() const noexcept { return value_; }
  [[nodiscard]] const std::string& allowed() const noexcept { return allowed_; }

 private:
  static std::string compose(const std::string& f, const std::string& v, const std::string& a) {
    // One line whatever was given: the value cut to io::shown_value_bytes,
    // control characters and bytes that are not UTF-8 escaped.
    return printable(f, 200) + ": '" + printable(v) + "' is not accepted; " + printable(a, 400);
  }
  std::string field_, value_, allowed_;
};

}  // namespace zcorr::io
