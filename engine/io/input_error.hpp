// zcorr input layer: the one error type for bad input.
//
// Everything in engine/io may throw InputError; the CLI turns it into a
// one-line message and exit code 2. The engine core never throws.
#pragma once

#include <stdexcept>
#include <string>

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
    return f + ": '" + v + "' is not accepted; " + a;
  }
  std::string field_, value_, allowed_;
};

}  // namespace zcorr::io
