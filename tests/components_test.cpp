// Component table and name lookup.
#include <gtest/gtest.h>

#include "core/components.hpp"

using namespace zcorr;

TEST(Components, CanonicalOrderIsTheBatchContract) {
  // Order and names of the batch CSV contract (DEVELOPERS.md), which is the
  // GERG-2008 order of Kunz & Wagner (2012).
  const char* expected[] = {"methane", "nitrogen", "carbon_dioxide", "ethane", "propane", "n_butane", "isobutane",
                            "n_pentane", "isopentane", "n_hexane", "n_heptane", "n_octane", "n_nonane", "n_decane",
                            "hydrogen", "oxygen", "carbon_monoxide", "water", "hydrogen_sulfide", "helium", "argon"};
  ASSERT_EQ(std::size(expected), max_components);
  for (std::size_t i = 0; i < max_components; ++i) EXPECT_EQ(component_name(i), expected[i]);
}

TEST(Components, FormulaAndAliasLookup) {
  EXPECT_EQ(find_component("CH4"), Component::methane);
  EXPECT_EQ(find_component("C2H6"), Component::ethane);
  EXPECT_EQ(find_component("C3H8"), Component::propane);
  EXPECT_EQ(find_component("iC4H10"), Component::isobutane);
  EXPECT_EQ(find_component("i-C4"), Component::isobutane);
  EXPECT_EQ(find_component("nC4H10"), Component::n_butane);
  EXPECT_EQ(find_component("iC5"), Component::isopentane);
  EXPECT_EQ(find_component("nC5"), Component::n_pentane);
  EXPECT_EQ(find_component("C6"), Component::n_hexane);
  EXPECT_EQ(find_component("C10"), Component::n_decane);
  EXPECT_EQ(find_component("N2"), Component::nitrogen);
  EXPECT_EQ(find_component("co2"), Component::carbon_dioxide);
  EXPECT_EQ(find_component("CO"), Component::carbon_monoxide);
  EXPECT_EQ(find_component("H2O"), Component::water);
  EXPECT_EQ(find_component("H2S"), Component::hydrogen_sulfide);
  EXPECT_EQ(find_component("He"), Component::helium);
  EXPECT_EQ(find_component("Ar"), Component::argon);
  EXPECT_EQ(find_component("carbon dioxide"), Component::carbon_dioxide);
}

TEST(Components, AmbiguousAndUnknownNamesAreNotFound) {
  EXPECT_FALSE(find_component("C4H10"));  // which butane?
  EXPECT_FALSE(find_component("C5H12"));
  EXPECT_FALSE(find_component("xenon"));
  EXPECT_FALSE(find_component(""));
}
