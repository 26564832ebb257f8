// The setup's `meters` and `specification` sections (DESIGN.md): read with units, every bad
// field named with its rule, written back by setupToJson.
#include "SetupJson.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <algorithm>

using namespace sagline;
using nlohmann::json;

namespace {

json setupWithSections()
{
    return json::parse(R"json({
      "nameplate": {"rated_power_va": 50, "primary_voltage_v": 120, "secondary_voltage_v": 24,
                    "secondary_no_load_voltage_v": 26.4},
      "meters": {
        "voltmeter": {"gain_percent_of_reading": 0.3, "offset_v": 0.02, "resolution_v": 0.01},
        "ammeter": {"gain_percent_of_reading": "0.5 %", "offset_a": "3 mA", "resolution_a": "1 mA"},
        "winding_temperature_u_c": "1.5 °C"
      },
      "specification": {
        "regulation_max_percent": 12.0,
        "full_load_voltage_v": {"min": "23.5 V", "max": 24.5},
        "no_load_voltage_v": {"max": 27},
        "series_resistance_max_ohm": "1.3 Ω",
        "source": "customer drawing (scenario of our own)"
      }
    })json");
}

bool names(const SetupParse &parsed, const std::string &field, const std::string &ruleWord)
{
    return std::any_of(parsed.errors.begin(), parsed.errors.end(), [&](const FieldError &e) {
        return e.field == field && e.rule.find(ruleWord) != std::string::npos;
    });
}

std::string listed(const SetupParse &parsed)
{
    std::string text;
    for (const FieldError &e : parsed.errors)
        text += e.message() + "\n";
    return text;
}

} // namespace

TEST(SetupMeters, ReadsMetersAndSpecificationWithUnits)
{
    const SetupParse parsed = parseSetupJson(setupWithSections().dump());
    ASSERT_TRUE(parsed.setup) << listed(parsed);
    ASSERT_TRUE(parsed.setup->meters);
    const MeterSpecs &m = *parsed.setup->meters;
    EXPECT_DOUBLE_EQ(m.voltmeter.gainPercentOfReading, 0.3);
    EXPECT_DOUBLE_EQ(m.voltmeter.offset, 0.02);
    EXPECT_DOUBLE_EQ(m.voltmeter.resolution, 0.01);
    EXPECT_DOUBLE_EQ(m.ammeter.gainPercentOfReading, 0.5);
    EXPECT_DOUBLE_EQ(m.ammeter.offset, 0.003);
    EXPECT_DOUBLE_EQ(m.ammeter.resolution, 0.001);
    EXPECT_DOUBLE_EQ(*m.windingTemperatureUncertaintyC, 1.5);
    ASSERT_TRUE(parsed.setup->specification);
    const Specification &s = *parsed.setup->specification;
    EXPECT_DOUBLE_EQ(*s.regulationMaxPercent, 12.0);
    EXPECT_DOUBLE_EQ(*s.fullLoadVoltageV->min, 23.5);
    EXPECT_DOUBLE_EQ(*s.fullLoadVoltageV->max, 24.5);
    EXPECT_FALSE(s.noLoadVoltageV->min);
    EXPECT_DOUBLE_EQ(*s.noLoadVoltageV->max, 27.0);
    EXPECT_DOUBLE_EQ(*s.seriesResistanceMaxOhm, 1.3);
    EXPECT_EQ(s.source, "customer drawing (scenario of our own)");
    EXPECT_TRUE(s.hasLimits());

    // Written back and read again: the same setup.
    const SetupParse again = parseSetupJson(setupToJson(*parsed.setup));
    ASSERT_TRUE(again.setup) << listed(again);
    EXPECT_EQ(setupToJson(*again.setup), setupToJson(*parsed.setup));
}

TEST(SetupMeters, SectionsAreOptional)
{
    json d = setupWithSections();
    d.erase("meters");
    d.erase("specification");
    const SetupParse parsed = parseSetupJson(d.dump());
    ASSERT_TRUE(parsed.setup) << listed(parsed);
    EXPECT_FALSE(parsed.setup->meters);
    EXPECT_FALSE(parsed.setup->specification);
    EXPECT_EQ(setupToJson(*parsed.setup).find("meters"), std::string::npos); // older readers still read it
}

TEST(SetupMeters, BadFieldsAreNamedWithTheirRule)
{
    json d = setupWithSections();
    d["meters"]["voltmeter"]["gain_percent_of_reading"] = -1;
    d["meters"]["voltmeter"]["offset_v"] = "20 mA";
    d["meters"]["ammeter"].erase("resolution_a");
    d["meters"]["ammeter"]["range"] = 10;
    d["meters"]["winding_temperature_u_c"] = 0;
    d["specification"]["full_load_voltage_v"] = {{"min", 25}, {"max", 24}};
    d["specification"]["no_load_voltage_v"] = json::object();
    d["specification"]["regulation_max_percent"] = 0;
    d["specification"]["source"] = 12;
    const SetupParse parsed = parseSetupJson(d.dump());
    EXPECT_FALSE(parsed.setup);
    EXPECT_TRUE(names(parsed, "meters.voltmeter.gain_percent_of_reading", "at least 0")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.voltmeter.offset_v", "a voltage")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.ammeter.resolution_a", "is required")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.ammeter.range", "not a setup field")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.winding_temperature_u_c", "above 0")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "specification.full_load_voltage_v.min", "below max")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "specification.no_load_voltage_v", "min, max or both")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "specification.regulation_max_percent", "above 0")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "specification.source", "must be a string")) << listed(parsed);

    json missing = setupWithSections();
    missing["meters"].erase("ammeter");
    EXPECT_TRUE(names(parseSetupJson(missing.dump()), "meters.ammeter", "is required"));
    json stray = setupWithSections();
    stray["limits"] = json::object();
    EXPECT_TRUE(names(parseSetupJson(stray.dump()), "limits", "meters and specification"));
}

TEST(SetupMeters, ReadsThePrimaryMetersAndWritesThemBack)
{
    json document = setupWithSections();
    document["meters"]["primary_voltmeter"] = {{"gain_percent_of_reading", "0.5 %"}, {"offset_v", "0.1 V"},
                                               {"resolution_v", "10 mV"}};
    document["meters"]["primary_ammeter"] = {{"gain_percent_of_reading", 1}, {"offset_a", "0.3 mA"},
                                             {"resolution_a", "0.1 mA"}};
    document["meters"]["power_meter"] = {{"gain_percent_of_reading", 0.5}, {"offset_w", "30 mW"},
                                         {"resolution_w", "0.01 W"}};
    const SetupParse parsed = parseSetupJson(document.dump());
    ASSERT_TRUE(parsed.setup && parsed.setup->meters) << listed(parsed);
    const MeterSpecs &m = *parsed.setup->meters;
    ASSERT_TRUE(m.primaryVoltmeter && m.primaryAmmeter && m.powerMeter);
    EXPECT_DOUBLE_EQ(m.primaryVoltmeter->gainPercentOfReading, 0.5);
    EXPECT_DOUBLE_EQ(m.primaryVoltmeter->offset, 0.1);
    EXPECT_DOUBLE_EQ(m.primaryVoltmeter->resolution, 0.01);
    EXPECT_DOUBLE_EQ(m.primaryAmmeter->offset, 0.0003);
    EXPECT_DOUBLE_EQ(m.primaryAmmeter->resolution, 0.0001);
    EXPECT_DOUBLE_EQ(m.powerMeter->gainPercentOfReading, 0.5);
    EXPECT_DOUBLE_EQ(m.powerMeter->offset, 0.03);
    EXPECT_DOUBLE_EQ(m.powerMeter->resolution, 0.01);

    const std::string written = setupToJson(*parsed.setup);
    EXPECT_NE(written.find("\"offset_w\""), std::string::npos);
    const SetupParse again = parseSetupJson(written);
    ASSERT_TRUE(again.setup && again.setup->meters) << listed(again);
    EXPECT_EQ(setupToJson(*again.setup), written);
    ASSERT_TRUE(again.setup->meters->powerMeter);
    EXPECT_DOUBLE_EQ(again.setup->meters->powerMeter->offset, 0.03);
}

TEST(SetupMeters, PrimaryMetersAreOptionalAndNotWrittenWhenAbsent)
{
    const SetupParse parsed = parseSetupJson(setupWithSections().dump());
    ASSERT_TRUE(parsed.setup && parsed.setup->meters) << listed(parsed);
    EXPECT_FALSE(parsed.setup->meters->primaryVoltmeter);
    EXPECT_FALSE(parsed.setup->meters->primaryAmmeter);
    EXPECT_FALSE(parsed.setup->meters->powerMeter);
    EXPECT_EQ(setupToJson(*parsed.setup).find("primary_voltmeter"), std::string::npos);
}

TEST(SetupMeters, NamesABadPrimaryMeterField)
{
    json document = setupWithSections();
    document["meters"]["power_meter"] = {{"gain_percent_of_reading", 20}, {"offset_w", "3 V"}, {"resolution_w", -1}};
    document["meters"]["primary_voltmeter"] = {{"gain_percent_of_reading", 0.5}, {"offset_v", 0.1}};
    document["meters"]["primary_ammeter"] = "1 %";
    const SetupParse parsed = parseSetupJson(document.dump());
    EXPECT_FALSE(parsed.setup);
    EXPECT_TRUE(names(parsed, "meters.power_meter.gain_percent_of_reading", "at most")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.power_meter.offset_w", "W")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.power_meter.resolution_w", "")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.primary_voltmeter.resolution_v", "required")) << listed(parsed);
    EXPECT_TRUE(names(parsed, "meters.primary_ammeter", "object")) << listed(parsed);
}
