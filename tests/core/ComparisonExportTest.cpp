// The comparison as CSV and JSON: every column present, quoting per RFC 4180, no NaN.
#include "ComparisonExport.h"
#include "ReviewTestSupport.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <sstream>

using namespace sagline;
using namespace sagline::test;

TEST(ComparisonExport, CsvHasOneLinePerSessionAndNoNan)
{
    TempFolder folder;
    DemoUnit unit;
    unit.serial = "DEMO, \"quoted\"";
    const std::string good = makeDemoSession(folder.file("good.sagline"), unit);
    DemoUnit tiny;
    tiny.points = 1; // one point: no fit, still a row
    const std::string small = makeDemoSession(folder.file("small.sagline"), tiny);
    writeBytes(folder.file("bad.sagline"), "junk");
    const auto rows = loadSessionRows({good, small, folder.file("bad.sagline")}, {});
    const auto stats = summarizeBatch(rows);
    const std::string csv = comparisonCsv(rows, stats);
    EXPECT_EQ(csv.find("nan"), std::string::npos);
    EXPECT_EQ(csv.find("inf"), std::string::npos);

    std::istringstream lines(csv);
    std::string header, first, second, third, extra;
    std::getline(lines, header);
    std::getline(lines, first);
    std::getline(lines, second);
    std::getline(lines, third);
    EXPECT_FALSE(std::getline(lines, extra));
    EXPECT_EQ(header.rfind("file,design,unit_serial,started_utc,operator,instruments,readings,points_used,series_resistance_ohm,", 0), 0u);
    EXPECT_NE(first.find("\"DEMO, \"\"quoted\"\"\""), std::string::npos) << first;
    EXPECT_NE(second.find("at least 2"), std::string::npos) << second; // the fit's reason, not a number
    EXPECT_NE(third.find("not a session"), std::string::npos) << third;

    const auto json = nlohmann::json::parse(comparisonJson(rows, stats, {}));
    ASSERT_EQ(json.at("sessions").size(), 3u);
    EXPECT_TRUE(json.at("sessions")[1].at("series_resistance_ohm").is_null());
    EXPECT_FALSE(json.at("sessions")[2].at("opened").get<bool>());
    EXPECT_EQ(json.at("batch").at("unreadable"), 1);
    EXPECT_NEAR(json.at("sessions")[0].at("series_resistance_ohm").get<double>(), rows[0].figures.resistanceOhm, 1e-9);
}

TEST(ComparisonExport, CsvFieldQuoting)
{
    EXPECT_EQ(csvField("plain"), "plain");
    EXPECT_EQ(csvField("a,b"), "\"a,b\"");
    EXPECT_EQ(csvField("say \"hi\""), "\"say \"\"hi\"\"\"");
    EXPECT_EQ(csvField("two\nlines"), "\"two\nlines\"");
}
