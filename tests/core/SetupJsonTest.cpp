#include "SetupJson.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>

using namespace sagline;
using nlohmann::json;

namespace {

json validSetup()
{
    return json::parse(R"({
      "nameplate": {"rated_power_va": 50, "primary_voltage_v": 120, "frequency_hz": 60,
                    "secondary_voltage_v": 24, "secondary_no_load_voltage_v": 26.4,
                    "regulation_percent": null, "construction": "toroidal", "winding_material": "copper"},
      "bench": {"steps": 10, "top_fraction": 1.0, "overload_factor": 1.0, "allow_overload": false,
                "rheostat": {"total_resistance_ohm": 100, "power_rating_w": 50},
                "fuse": {"rating_a": 1.0, "type": "time-lag"},
                "fuse_factor": null, "magnetizing_fraction": null, "dwell_s": 10}
    })");
}

// Parses `document` and expects an error on `field` whose rule mentions `ruleWord`.
void expectFieldError(const json &document, const std::string &field, const std::string &ruleWord)
{
    const SetupParse parsed = parseSetupJson(document.dump());
    EXPECT_FALSE(parsed.setup.has_value()) << field;
    const auto hit = std::find_if(parsed.errors.begin(), parsed.errors.end(),
                                  [&](const FieldError &e) { return e.field == field; });
    ASSERT_NE(hit, parsed.errors.end()) << "no error names " << field << "; got "
                                        << (parsed.errors.empty() ? "none" : parsed.errors[0].message());
    EXPECT_NE(hit->rule.find(ruleWord), std::string::npos) << hit->message();
}

} // namespace

TEST(SetupJson, ReadsTheDesignExample)
{
    const SetupParse parsed = parseSetupJson(validSetup().dump());
    ASSERT_TRUE(parsed.setup) << parsed.errors[0].message();
    const sagline::Setup &s = *parsed.setup;
    EXPECT_DOUBLE_EQ(s.nameplate.ratedPowerVa, 50.0);
    EXPECT_DOUBLE_EQ(*s.nameplate.secondaryNoLoadVoltageV, 26.4);
    EXPECT_EQ(s.nameplate.construction, Construction::Toroidal);
    EXPECT_EQ(s.bench.steps, 10);
    ASSERT_TRUE(s.bench.rheostat);
    EXPECT_DOUBLE_EQ(s.bench.rheostat->powerRatingW, 50.0);
    ASSERT_TRUE(s.bench.fuse);
    EXPECT_EQ(s.bench.fuse->type, FuseType::TimeLag);
    EXPECT_FALSE(s.bench.fuseFactor);
}

TEST(SetupJson, AcceptsStringsWithUnits)
{
    json d = validSetup();
    d["nameplate"]["secondary_voltage_v"] = "13,8 V";
    d["nameplate"]["secondary_no_load_voltage_v"] = "15.2V";
    d["bench"]["fuse"]["rating_a"] = "630 mA";
    d["bench"]["rheostat"]["total_resistance_ohm"] = "1.5 kΩ";
    d["bench"]["top_fraction"] = "80 %";
    const SetupParse parsed = parseSetupJson(d.dump());
    ASSERT_TRUE(parsed.setup) << parsed.errors[0].message();
    EXPECT_DOUBLE_EQ(parsed.setup->nameplate.secondaryVoltageV, 13.8);
    EXPECT_DOUBLE_EQ(parsed.setup->bench.fuse->ratingA, 0.63);
    EXPECT_DOUBLE_EQ(parsed.setup->bench.rheostat->totalResistanceOhm, 1500.0);
    EXPECT_DOUBLE_EQ(parsed.setup->bench.topFraction, 0.8);
}

TEST(SetupJson, ReportsDefaultsUsed)
{
    json d = validSetup();
    d["nameplate"].erase("frequency_hz");
    d["bench"].erase("steps");
    const SetupParse parsed = parseSetupJson(d.dump());
    ASSERT_TRUE(parsed.setup);
    EXPECT_NE(std::find(parsed.defaultsUsed.begin(), parsed.defaultsUsed.end(), "nameplate.frequency_hz"),
              parsed.defaultsUsed.end());
    EXPECT_NE(std::find(parsed.defaultsUsed.begin(), parsed.defaultsUsed.end(), "bench.steps"), parsed.defaultsUsed.end());
}

TEST(SetupJson, RoundTripsThroughCanonicalJson)
{
    const SetupParse first = parseSetupJson(validSetup().dump());
    ASSERT_TRUE(first.setup);
    const SetupParse second = parseSetupJson(setupToJson(*first.setup));
    ASSERT_TRUE(second.setup) << second.errors[0].message();
    EXPECT_EQ(setupToJson(*first.setup), setupToJson(*second.setup));
}

TEST(SetupJson, MissingRequiredFieldIsNamed)
{
    json d = validSetup();
    d["nameplate"].erase("rated_power_va");
    expectFieldError(d, "nameplate.rated_power_va", "required");
}

TEST(SetupJson, NonNumericValueIsNamed)
{
    json d = validSetup();
    d["nameplate"]["primary_voltage_v"] = "twelve";
    expectFieldError(d, "nameplate.primary_voltage_v", "not a number");
    d = validSetup();
    d["nameplate"]["primary_voltage_v"] = true;
    expectFieldError(d, "nameplate.primary_voltage_v", "must be a number");
}

TEST(SetupJson, ZeroAndNegativeValuesAreNamed)
{
    json d = validSetup();
    d["nameplate"]["rated_power_va"] = 0;
    expectFieldError(d, "nameplate.rated_power_va", "at least 0.1 VA");
    d = validSetup();
    d["bench"]["rheostat"]["power_rating_w"] = -5;
    expectFieldError(d, "bench.rheostat.power_rating_w", "at least 0.1 W");
    d = validSetup();
    d["bench"]["fuse"]["rating_a"] = 0;
    expectFieldError(d, "bench.fuse.rating_a", "at least 0.01 A");
}

TEST(SetupJson, NaNAndInfinityAreNamed)
{
    json d = validSetup();
    d["nameplate"]["secondary_voltage_v"] = "nan";
    expectFieldError(d, "nameplate.secondary_voltage_v", "not a number");
    // JSON has no infinity literal; an overflowing number is how it arrives.
    std::string text = validSetup().dump();
    text.replace(text.find("\"primary_voltage_v\":120"), 23, "\"primary_voltage_v\":1e999");
    const SetupParse parsed = parseSetupJson(text);
    ASSERT_FALSE(parsed.setup);
    EXPECT_NE(parsed.errors[0].rule.find("finite"), std::string::npos) << parsed.errors[0].message();
}

TEST(SetupJson, NoLoadVoltageMustBeAboveFullLoadVoltage)
{
    json d = validSetup();
    d["nameplate"]["secondary_no_load_voltage_v"] = 24;
    expectFieldError(d, "nameplate.secondary_no_load_voltage_v", "must be above");
}

TEST(SetupJson, NeedsNoLoadVoltageOrRegulation)
{
    json d = validSetup();
    d["nameplate"].erase("secondary_no_load_voltage_v");
    d["nameplate"].erase("regulation_percent");
    expectFieldError(d, "nameplate.secondary_no_load_voltage_v", "regulation_percent");
    d["nameplate"]["regulation_percent"] = 10;
    EXPECT_TRUE(parseSetupJson(d.dump()).setup);
}

TEST(SetupJson, DisagreeingNoLoadVoltageAndRegulationAreRefused)
{
    json d = validSetup();
    d["nameplate"]["regulation_percent"] = 20; // implies 28.8 V, not 26.4 V
    expectFieldError(d, "nameplate.regulation_percent", "disagrees");
}

TEST(SetupJson, StepsHaveBounds)
{
    json d = validSetup();
    d["bench"]["steps"] = 0;
    expectFieldError(d, "bench.steps", "at least 1");
    d["bench"]["steps"] = 100000;
    expectFieldError(d, "bench.steps", "at most 200");
    d["bench"]["steps"] = 2.5;
    expectFieldError(d, "bench.steps", "whole number");
}

TEST(SetupJson, UnknownChoicesAreNamedWithTheAllowedOnes)
{
    json d = validSetup();
    d["nameplate"]["construction"] = "ring";
    expectFieldError(d, "nameplate.construction", "laminated, toroidal, other");
    d = validSetup();
    d["nameplate"]["winding_material"] = "silver";
    expectFieldError(d, "nameplate.winding_material", "copper");
    d = validSetup();
    d["bench"]["fuse"]["type"] = "slow";
    expectFieldError(d, "bench.fuse.type", "time-lag, quick-acting");
}

TEST(SetupJson, ARefusedFieldIsReportedOnce)
{
    // A value with the wrong unit is refused for its unit only, not also judged out of range
    // on the 0 that stands in for it ("got 0 VA" would send the user looking for a zero).
    json d = validSetup();
    d["nameplate"]["rated_power_va"] = "60 V";
    const SetupParse parsed = parseSetupJson(d.dump());
    const auto count = std::count_if(parsed.errors.begin(), parsed.errors.end(),
                                     [](const FieldError &e) { return e.field == "nameplate.rated_power_va"; });
    EXPECT_EQ(count, 1);
    expectFieldError(d, "nameplate.rated_power_va", "apparent power");
}

TEST(SetupJson, WrongUnitIsNamed)
{
    json d = validSetup();
    d["nameplate"]["secondary_voltage_v"] = "12 A";
    expectFieldError(d, "nameplate.secondary_voltage_v", "a voltage");
}

TEST(SetupJson, UnknownFieldsAreRefusedSoTyposAreNotIgnored)
{
    json d = validSetup();
    d["bench"]["alow_overload"] = true;
    expectFieldError(d, "bench.alow_overload", "not a setup field");
}

TEST(SetupJson, InvalidJsonNamesLineAndColumn)
{
    const SetupParse parsed = parseSetupJson("{\n  \"nameplate\": {\n    \"rated_power_va\": 50,,\n");
    ASSERT_FALSE(parsed.setup);
    EXPECT_NE(parsed.errors[0].rule.find("line 3"), std::string::npos) << parsed.errors[0].message();
}

TEST(SetupJson, ReportsEveryBadFieldAtOnce)
{
    json d = validSetup();
    d["nameplate"]["rated_power_va"] = -1;
    d["bench"]["dwell_s"] = -3;
    const SetupParse parsed = parseSetupJson(d.dump());
    EXPECT_GE(parsed.errors.size(), 2u);
}

TEST(SetupJson, UnreadableFileIsAnError)
{
    const SetupParse parsed = loadSetupFile("/nonexistent/setup.json");
    ASSERT_FALSE(parsed.setup);
    EXPECT_NE(parsed.errors[0].rule.find("no such file"), std::string::npos) << parsed.errors[0].rule;
}

TEST(SetupJson, DesignNameIsOptionalTrimmedAndKept)
{
    json document = validSetup();
    SetupParse parsed = parseSetupJson(document.dump());
    ASSERT_TRUE(parsed.setup.has_value());
    EXPECT_TRUE(parsed.setup->design.empty());
    EXPECT_EQ(json::parse(setupToJson(*parsed.setup)).contains("design"), false);
    document["design"] = "  PT-60 rev B ";
    parsed = parseSetupJson(document.dump());
    ASSERT_TRUE(parsed.setup.has_value());
    EXPECT_EQ(parsed.setup->design, "PT-60 rev B");
    const SetupParse again = parseSetupJson(setupToJson(*parsed.setup));
    ASSERT_TRUE(again.setup.has_value());
    EXPECT_EQ(again.setup->design, "PT-60 rev B");
}

TEST(SetupJson, BadDesignNamesAreNamed)
{
    json document = validSetup();
    document["design"] = 60;
    expectFieldError(document, "design", "text");
    document["design"] = "   ";
    expectFieldError(document, "design", "empty");
    document["design"] = std::string(81, 'x');
    expectFieldError(document, "design", "80");
    document["design"] = "line one\nline two";
    expectFieldError(document, "design", "printable");
}

TEST(SetupJson, AnEmptyOrUnprintableUnknownKeyIsNamedPrintably)
{
    // Found by the setup-reader fuzzer: an unknown key "" gave an error naming no field, and a key
    // holding an escape character carried it into the message.
    const SetupParse parsed = parseSetupJson(R"({"": 1, "a\u001bb": 2, "nameplate": {"": 3}})");
    ASSERT_FALSE(parsed.setup);
    bool namedEmpty = false;
    for (const FieldError &error : parsed.errors) {
        EXPECT_FALSE(error.field.empty()) << error.rule;
        EXPECT_EQ(error.message().find('\x1b'), std::string::npos) << error.message();
        namedEmpty = namedEmpty || error.field == "\"\"";
    }
    EXPECT_TRUE(namedEmpty);
}
