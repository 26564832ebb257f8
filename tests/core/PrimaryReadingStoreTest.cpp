// The primary side as data: CSV columns in and out, the session file's primary_reading rows
// (one reading at a time, in bulk, read back, covered by the seal), and the checks on each value.
#include "CsvReadings.h"
#include "SessionExport.h"
#include "SessionSeal.h"
#include "SessionStore.h"
#include "SessionSummary.h"

#include "SessionTestSupport.h"

#include <gtest/gtest.h>

#include <sqlite3.h>

using namespace sagline;
using namespace sagline::test;

namespace {

Reading withPrimary(int step, double current, double voltage)
{
    Reading r = sampleReading(step, current, voltage);
    r.primary.voltageV = 230.5 - 0.1 * step;
    r.primary.uVoltageV = 0.4;
    r.primary.currentA = 0.03 + 0.1 * current;
    r.primary.powerW = 1.5 + voltage * current * 1.08;
    r.primary.uPowerW = 0.05;
    r.primary.powerFactor = step == 0 ? 0.2 : 0.95;
    return r;
}

} // namespace

TEST(PrimaryReadingCsv, ReadsThePrimaryColumnsEachOptional)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a,voltage_v,primary_voltage_v,primary_current_a,primary_power_w,"
                                                "primary_power_factor,u_primary_power_w\n"
                                                "0,26.4,230.1,0.031,1.52,0.21,0.01\n"
                                                "1.04,24.1,229.8,0.14,27.3,,\n");
    ASSERT_TRUE(r.ok()) << r.errors.front().message();
    ASSERT_EQ(r.readings.size(), 2u);
    EXPECT_DOUBLE_EQ(*r.readings[0].primary.voltageV, 230.1);
    EXPECT_DOUBLE_EQ(*r.readings[0].primary.powerFactor, 0.21);
    EXPECT_DOUBLE_EQ(*r.readings[0].primary.uPowerW, 0.01);
    EXPECT_DOUBLE_EQ(*r.readings[1].primary.powerW, 27.3);
    EXPECT_FALSE(r.readings[1].primary.powerFactor) << "a blank cell is 'not read'";
    EXPECT_FALSE(r.readings[1].primary.reactivePowerVar);
}

TEST(PrimaryReadingCsv, BadPrimaryCellsNameLineColumnAndRule)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a,voltage_v,primary_power_factor,primary_power_w,u_primary_voltage_v\n"
                                                "0,26.4,1.2,1,\n"
                                                "1,24.1,0.9,-3,\n"
                                                "1,24.1,0.9,3,0\n");
    ASSERT_EQ(r.errors.size(), 3u);
    EXPECT_EQ(r.errors[0].field, "line 2, column primary_power_factor");
    EXPECT_NE(r.errors[0].rule.find("between 0 and 1"), std::string::npos);
    EXPECT_EQ(r.errors[1].field, "line 3, column primary_power_w");
    EXPECT_EQ(r.errors[2].field, "line 4, column u_primary_voltage_v");
}

TEST(PrimaryReadingCsv, ExportReadsBackTheSameNumbers)
{
    std::vector<Reading> readings{withPrimary(0, 0.0, 26.4), withPrimary(1, 1.04, 24.1)};
    readings[1].primary.reactivePowerVar = 7.25;
    const std::string csv = readingsToCsv(readings);
    EXPECT_NE(csv.find("primary_voltage_v"), std::string::npos);
    const ReadingsCsvParse back = parseReadingsCsv(csv);
    ASSERT_TRUE(back.ok()) << back.errors.front().message();
    ASSERT_EQ(back.readings.size(), 2u);
    for (std::size_t i = 0; i < 2; ++i) {
        EXPECT_EQ(back.readings[i].primary.voltageV, readings[i].primary.voltageV);
        EXPECT_EQ(back.readings[i].primary.currentA, readings[i].primary.currentA);
        EXPECT_EQ(back.readings[i].primary.powerW, readings[i].primary.powerW);
        EXPECT_EQ(back.readings[i].primary.powerFactor, readings[i].primary.powerFactor);
        EXPECT_EQ(back.readings[i].primary.reactivePowerVar, readings[i].primary.reactivePowerVar);
        EXPECT_EQ(back.readings[i].primary.uPowerW, readings[i].primary.uPowerW);
    }
    // Without a primary side the plain columns stay as they were.
    EXPECT_EQ(readingsToCsv({sampleReading(0, 0.0, 26.4)}).find("primary"), std::string::npos);
}

TEST(PrimaryReadingStore, OneAtATimeAndInBulkReadBack)
{
    TempFolder folder;
    const std::string path = folder.file("primary.sagline");
    {
        auto store = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(store.ok()) << store.message;
        ASSERT_TRUE(store.value->appendReading(withPrimary(0, 0.0, 26.4)).ok());
        ASSERT_TRUE(store.value->appendReading(sampleReading(1, 0.5, 25.8)).ok()); // no primary side
        const auto bulk = store.value->appendReadings({withPrimary(2, 1.0, 25.2), sampleReading(3, 1.5, 24.6)});
        ASSERT_TRUE(bulk.ok()) << bulk.message;
        Reading bad = withPrimary(4, 2.0, 24.0);
        bad.primary.powerFactor = 1.5;
        const auto refused = store.value->appendReading(bad);
        EXPECT_FALSE(refused.ok());
        EXPECT_NE(refused.message.find("power factor"), std::string::npos) << refused.message;
    }
    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok()) << review.message;
    const auto readings = review.value->readings();
    ASSERT_TRUE(readings.ok()) << readings.message;
    ASSERT_EQ(readings.value.size(), 4u);
    EXPECT_DOUBLE_EQ(*readings.value[0].primary.voltageV, 230.5);
    EXPECT_DOUBLE_EQ(*readings.value[0].primary.powerFactor, 0.2);
    EXPECT_FALSE(readings.value[1].primary.hasAny());
    EXPECT_DOUBLE_EQ(*readings.value[2].primary.powerW, 1.5 + 25.2 * 1.08);
    EXPECT_FALSE(readings.value[3].primary.hasAny());
}

// The seal covers the primary side: a power value changed after sign-off is found.
TEST(PrimaryReadingStore, SealCoversThePrimarySide)
{
    TempFolder folder;
    const std::string path = folder.file("sealed.sagline");
    {
        auto store = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(store.ok());
        ASSERT_TRUE(store.value->appendReading(withPrimary(0, 0.0, 26.4)).ok());
        ASSERT_TRUE(store.value->addSignOff("Lab Lead", ReviewDecision::Accepted, "checked").ok());
    }
    {
        auto review = SessionStore::openForReview(path);
        const auto seal = checkSeal(*review.value);
        ASSERT_TRUE(seal.ok());
        EXPECT_EQ(seal.value.state, SealState::Signed);
    }
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, "UPDATE primary_reading SET power_w = 0.5", nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok()) << review.message;
    const auto seal = checkSeal(*review.value);
    ASSERT_TRUE(seal.ok());
    EXPECT_EQ(seal.value.state, SealState::Altered);
}

// A crafted file: a primary row that belongs to no reading, or text in a number column.
TEST(PrimaryReadingStore, CraftedPrimaryRowsAreCorrupt)
{
    TempFolder folder;
    const std::string path = folder.file("crafted.sagline");
    {
        auto store = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(store.value->appendReading(withPrimary(0, 0.0, 26.4)).ok());
    }
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, "UPDATE primary_reading SET power_w = '12 W'", nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok());
    const auto readings = review.value->readings();
    EXPECT_EQ(readings.code, StoreCode::Corrupt);
    EXPECT_NE(readings.message.find("primary_reading row 1"), std::string::npos) << readings.message;
}
