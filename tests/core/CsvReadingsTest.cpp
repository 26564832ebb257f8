// CsvReadings: the readings CSV of DESIGN.md, tolerant of harmless variations, strict on values.
#include "CsvReadings.h"

#include <gtest/gtest.h>

#include <cmath>
#include <random>

using namespace sagline;

TEST(CsvReadings, ParsesTheTwoRequiredColumns)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a,voltage_v\n0,26.4\n1.04,24.1\n");
    ASSERT_TRUE(r.ok()) << r.errors.front().message();
    ASSERT_EQ(r.readings.size(), 2u);
    EXPECT_DOUBLE_EQ(r.readings[1].currentA, 1.04);
    EXPECT_DOUBLE_EQ(r.readings[1].voltageV, 24.1);
    EXPECT_EQ(r.lineNumbers[1], 3);
    EXPECT_FALSE(r.hasVoltageUncertainty);
    EXPECT_FALSE(r.readings[0].uVoltageV.has_value());
}

TEST(CsvReadings, ToleratesBomCrlfBlankLinesAndSpaces)
{
    const ReadingsCsvParse r =
        parseReadingsCsv("\xEF\xBB\xBF voltage_v , current_a \r\n\r\n 26.4 , 0 \r\n\"24.1\",1.04\r\n\r\n\n");
    ASSERT_TRUE(r.ok()) << r.errors.front().message();
    ASSERT_EQ(r.readings.size(), 2u);
    EXPECT_DOUBLE_EQ(r.readings[0].voltageV, 26.4);
    EXPECT_DOUBLE_EQ(r.readings[1].currentA, 1.04);
    EXPECT_EQ(r.lineNumbers[0], 3);
}

TEST(CsvReadings, ReadsUncertaintiesAndExportColumns)
{
    const ReadingsCsvParse r = parseReadingsCsv(
        "step,current_a,voltage_v,u_current_a,u_voltage_v,time_utc,flags,excluded\n"
        "0,0,26.4,0.001,0.02,2026-12-02T10:00:00Z,,false\n"
        "1,0.5,25.3,,0.02,2026-12-02T10:00:10Z,unstable|manual,true\n");
    ASSERT_TRUE(r.ok()) << r.errors.front().message();
    EXPECT_TRUE(r.hasCurrentUncertainty);
    EXPECT_TRUE(r.hasVoltageUncertainty);
    EXPECT_DOUBLE_EQ(*r.readings[0].uCurrentA, 0.001);
    EXPECT_FALSE(r.readings[1].uCurrentA.has_value());
    EXPECT_EQ(r.readings[1].step, 1);
    EXPECT_EQ(r.readings[1].flags, flagUnstable | flagManual);
    EXPECT_TRUE(r.readings[1].excluded);
    EXPECT_EQ(r.readings[0].timeUtc, "2026-12-02T10:00:00Z");
}

TEST(CsvReadings, ErrorsNameTheLineAndTheColumn)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a,voltage_v\n0,26.4\n0.5,2x.1\n1,-3\n1.5,nan\n");
    ASSERT_EQ(r.errors.size(), 3u);
    EXPECT_EQ(r.errors[0].field, "line 3, column voltage_v");
    EXPECT_NE(r.errors[0].rule.find("2x.1"), std::string::npos);
    EXPECT_EQ(r.errors[1].field, "line 4, column voltage_v");
    EXPECT_NE(r.errors[1].rule.find("zero or above"), std::string::npos);
    EXPECT_EQ(r.errors[2].field, "line 5, column voltage_v");
    EXPECT_TRUE(r.readings.empty());
}

TEST(CsvReadings, RejectsBadHeadersAndCellCounts)
{
    EXPECT_EQ(parseReadingsCsv("").errors.at(0).field, "file");
    EXPECT_EQ(parseReadingsCsv("current_a,voltage_v\n").errors.at(0).rule, "has a header but no readings");
    const ReadingsCsvParse missing = parseReadingsCsv("current_a\n1\n");
    EXPECT_EQ(missing.errors.at(0).field, "line 1, column voltage_v");
    const ReadingsCsvParse unknown = parseReadingsCsv("current_a,voltage_v,curent_a\n1,2,3\n");
    EXPECT_EQ(unknown.errors.at(0).field, "line 1, column curent_a");
    const ReadingsCsvParse count = parseReadingsCsv("current_a,voltage_v\n1,2,3\n");
    EXPECT_EQ(count.errors.at(0).field, "line 2");
    const ReadingsCsvParse zeroU = parseReadingsCsv("current_a,voltage_v,u_voltage_v\n1,2,0\n");
    EXPECT_EQ(zeroU.errors.at(0).field, "line 2, column u_voltage_v");
    const ReadingsCsvParse blank = parseReadingsCsv("current_a,voltage_v\n,2\n");
    EXPECT_NE(blank.errors.at(0).rule.find("empty"), std::string::npos);
    const ReadingsCsvParse quote = parseReadingsCsv("current_a,voltage_v\n\"1,2\n");
    EXPECT_EQ(quote.errors.at(0).field, "line 2");
}

TEST(CsvReadings, UnreadableFileIsAnErrorNotAThrow)
{
    const ReadingsCsvParse r = loadReadingsCsv("/nonexistent/readings.csv");
    ASSERT_EQ(r.errors.size(), 1u);
    EXPECT_EQ(r.errors[0].field, "file");
}

TEST(CsvReadings, GarbledInputNeverCrashesAndAlwaysExplains)
{
    // Seeded mutations of a valid file (bytes replaced, inserted, deleted): the parser either
    // accepts it or says which line or the file is wrong; it never throws or crashes (run under
    // ASan/UBSan by the asan-ubsan preset).
    const std::string valid = "current_a,voltage_v,u_current_a,u_voltage_v,flags,excluded\n"
                              "0,19.6,0.001,0.01,,false\n0.5,19.4,0.002,0.01,manual,true\n1.0,19.1,,0.01,,\n";
    const std::string alphabet = "0123456789.,-+eE\"\r\n |abcxyz\xEF\xBB\xBF\xC2\xB1";
    std::mt19937 random(3);
    for (int trial = 0; trial < 3000; ++trial) {
        std::string text = valid;
        const int edits = 1 + static_cast<int>(random() % 6);
        for (int e = 0; e < edits && !text.empty(); ++e) {
            const std::size_t at = random() % text.size();
            const char c = alphabet[random() % alphabet.size()];
            switch (random() % 3) {
            case 0: text[at] = c; break;
            case 1: text.insert(text.begin() + static_cast<std::ptrdiff_t>(at), c); break;
            default: text.erase(at, 1); break;
            }
        }
        const ReadingsCsvParse r = parseReadingsCsv(text);
        if (r.ok()) {
            EXPECT_EQ(r.readings.size(), r.lineNumbers.size());
            for (const Reading &reading : r.readings)
                EXPECT_TRUE(std::isfinite(reading.currentA) && std::isfinite(reading.voltageV));
        } else {
            EXPECT_TRUE(r.readings.empty());
            for (const FieldError &e : r.errors)
                EXPECT_TRUE(e.field == "file" || e.field.rfind("line ", 0) == 0) << e.field;
        }
    }
}
