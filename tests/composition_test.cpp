// Gas analyses from text: forms, errors and normalisation.
#include <gtest/gtest.h>

#include "io/composition_parse.hpp"
#include "io/input_error.hpp"

using namespace zcorr;
using io::InputError;

namespace {
io::CompositionOptions fractions() { return {}; }
io::CompositionOptions percent() {
  io::CompositionOptions o;
  o.unit = io::FractionUnit::mol_percent;
  return o;
}
std::string message_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}
}  // namespace

TEST(Composition, NameValueList) {
  auto c = io::parse_composition_list("CH4=0.95, C2H6=0.03; N2=0.02", fractions());
  EXPECT_DOUBLE_EQ(c.x[index(Component::methane)], 0.95);
  EXPECT_DOUBLE_EQ(c.x[index(Component::ethane)], 0.03);
  EXPECT_DOUBLE_EQ(c.x[index(Component::nitrogen)], 0.02);
  EXPECT_FALSE(c.normalised);
  EXPECT_NEAR(c.original_sum, 1.0, 1e-15);
}

TEST(Composition, MolPercentAndJson) {
  auto a = io::parse_composition_list("methane=95,ethane=3,nitrogen=2", percent());
  EXPECT_DOUBLE_EQ(a.x[index(Component::methane)], 0.95);
  auto b = io::parse_composition_json(R"({"unit":"mol%","components":{"CH4":95,"C2H6":3,"N2":2}})", fractions());
  EXPECT_EQ(a.x, b.x);
  auto c = io::parse_composition_json(R"({"methane":0.95,"ethane":0.03,"nitrogen":0.02})", fractions());
  EXPECT_DOUBLE_EQ(c.x[index(Component::nitrogen)], 0.02);
}

TEST(Composition, ErrorsNameTheFieldAndValue) {
  auto m = message_of([] { (void)io::parse_composition_list("methane=0.9", fractions()); });
  EXPECT_NE(m.find("sum"), std::string::npos) << m;
  EXPECT_NE(m.find("0.9"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=1.05,ethane=-0.05", fractions()); });
  EXPECT_NE(m.find("ethane"), std::string::npos) << m;
  EXPECT_NE(m.find("-0.05"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=0.9,xenon=0.1", fractions()); });
  EXPECT_NE(m.find("xenon"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=0.5,CH4=0.5", fractions()); });
  EXPECT_NE(m.find("twice"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=nan", fractions()); });
  EXPECT_NE(m.find("finite"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=inf", fractions()); });
  EXPECT_NE(m.find("finite"), std::string::npos) << m;
  m = message_of([] { (void)io::parse_composition_list("methane=95,ethane=5", fractions()); });
  EXPECT_NE(m.find("mol %"), std::string::npos) << m;  // a hint that the values look like percent
  m = message_of([] { (void)io::parse_composition_list("", fractions()); });
  EXPECT_FALSE(m.empty());
  m = message_of([] { (void)io::parse_composition_json("{not json", fractions()); });
  EXPECT_NE(m.find("JSON"), std::string::npos) << m;
}

TEST(Composition, NormalisationOnlyWhenAskedAndRecorded) {
  EXPECT_THROW((void)io::parse_composition_list("methane=0.97,ethane=0.02", fractions()), InputError);
  auto o = fractions();
  o.normalise = true;
  auto c = io::parse_composition_list("methane=0.97,ethane=0.02", o);
  EXPECT_TRUE(c.normalised);
  EXPECT_DOUBLE_EQ(c.original_sum, 0.99);
  EXPECT_NEAR(c.x[index(Component::methane)], 0.97 / 0.99, 1e-15);
  EXPECT_NE(c.provenance().find("0.99"), std::string::npos);
  // Normalising does not rescue a grossly wrong analysis.
  EXPECT_THROW((void)io::parse_composition_list("methane=0.9", o), InputError);
}

TEST(Composition, WithinToleranceIsKeptAsGiven) {
  auto c = io::parse_composition_list("methane=0.94999,ethane=0.03,nitrogen=0.02", fractions());
  EXPECT_FALSE(c.normalised);
  EXPECT_DOUBLE_EQ(c.x[index(Component::methane)], 0.94999);
}
