// Demo sessions for the review tests: an invented 50 VA, 230 V to 24 V unit (not a real
// product) with readings along V = V0 - R·I plus a small, seeded, deterministic scatter.
#pragma once

#include "PlanJson.h"
#include "Planner.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "SessionTestSupport.h"

#include <gtest/gtest.h>
#include <sqlite3.h>

#include <cmath>
#include <string>
#include <vector>

namespace sagline::test {

// The demo setup; another rating (VA) or a design name makes another design of the same family.
inline std::string demoSetupJson(double ratedPowerVa = 50.0, const std::string &design = {})
{
    return std::string("{") + (design.empty() ? std::string() : "\"design\":\"" + design + "\",")
           + R"("nameplate":{"rated_power_va":)" + std::to_string(ratedPowerVa)
           + R"(,"primary_voltage_v":230,"frequency_hz":50,"secondary_voltage_v":24,)"
             R"("secondary_no_load_voltage_v":26.4,"construction":"toroidal","winding_material":"copper"},)"
             R"("bench":{"steps":10,"top_fraction":1.0,"fuse":{"rating_a":0.5,"type":"time-lag"}}})";
}

struct DemoUnit {
    std::string serial = "DEMO-0001";
    std::string operatorName = "A. Tester";
    double resistanceOhm = 1.152;   // R, Ω
    double noLoadVoltageV = 26.4;   // V0, V
    int points = 11;                // currents 0 .. 2.0833 A in equal steps
    double scatterV = 0.004;        // amplitude of the deterministic scatter, V
    double windingC = 20.0;         // recorded winding temperature, °C
    double ratedPowerVa = 50.0;     // the nameplate's rating: another value is another design
    std::string design;             // the setup's design name, "" for none
    bool withPlan = false;          // record the setup's plan (steps 0-10), so fewer points make an incomplete session
};

// Readings of a demo unit: I_k = k/(n-1) · VA/24 A, V_k = V0 - R I_k + scatter·sin(1.7 k + R).
inline std::vector<Reading> demoReadings(const DemoUnit &unit)
{
    std::vector<Reading> readings;
    const double rated = unit.ratedPowerVa / 24.0;
    for (int k = 0; k < unit.points; ++k) {
        Reading reading;
        reading.step = k;
        reading.currentA = unit.points > 1 ? rated * k / (unit.points - 1) : 0.0;
        reading.voltageV = unit.noLoadVoltageV - unit.resistanceOhm * reading.currentA
                           + unit.scatterV * std::sin(1.7 * k + unit.resistanceOhm);
        reading.timeUtc = "2026-12-01T09:00:" + std::string(k < 10 ? "0" : "") + std::to_string(k) + ".000Z";
        reading.rawText = "demo";
        readings.push_back(reading);
    }
    return readings;
}

inline std::string makeDemoSession(const std::string &path, const DemoUnit &unit)
{
    NewSession session;
    session.setupJson = demoSetupJson(unit.ratedPowerVa, unit.design);
    session.operatorName = unit.operatorName;
    session.unitSerial = unit.serial;
    session.windingTemperatureC = unit.windingC;
    session.softwareVersion = "test";
    if (unit.withPlan) {
        const SetupParse setup = parseSetupJson(session.setupJson);
        EXPECT_TRUE(setup.setup.has_value());
        if (setup.setup) {
            const PlanResult plan = makePlan(*setup.setup);
            EXPECT_TRUE(plan.plan.has_value());
            if (plan.plan)
                session.planJson = planToJson(*plan.plan);
        }
    }
    auto created = SessionStore::create(path, session);
    EXPECT_TRUE(created.ok()) << created.message;
    if (!created.ok())
        return path;
    created.value->recordInstrument("voltmeter", "DemoMaker,DV-100,SN123,1.0", "±(0.05 % + 2 counts)");
    created.value->recordInstrument("ammeter", "DemoMaker,DA-20,SN456,1.2", "±(0.2 % + 3 counts)");
    for (const Reading &reading : demoReadings(unit))
        EXPECT_TRUE(created.value->appendReading(reading).ok());
    return path;
}

// Runs SQL on a file directly, as someone with the sqlite3 shell would.
inline void runSql(const std::string &path, const char *sql)
{
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    char *error = nullptr;
    EXPECT_EQ(sqlite3_exec(db, sql, nullptr, nullptr, &error), SQLITE_OK) << (error ? error : "");
    sqlite3_free(error);
    ASSERT_EQ(sqlite3_close(db), SQLITE_OK);
}

} // namespace sagline::test
