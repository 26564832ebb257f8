// The readings CSV writes the shortest decimal text that reads back to the same double (the
// round-trip guarantee of std::to_chars, C++17 [charconv.to.chars]/2): "19.6", never
// "19.600000000000001", and every value read back bit for bit by the CSV reader.
#include "CsvReadings.h"
#include "SessionExport.h"

#include <gtest/gtest.h>

#include <cmath>
#include <cstdio>
#include <random>

using namespace sagline;

namespace {

Reading readingOf(double currentA, double voltageV)
{
    Reading reading;
    reading.currentA = currentA;
    reading.voltageV = voltageV;
    reading.step = 1;
    reading.timeUtc = "2026-12-02T10:15:03.250Z";
    return reading;
}

std::string secondLine(const std::string &csv)
{
    const std::size_t start = csv.find("\r\n") + 2;
    return csv.substr(start, csv.find("\r\n", start) - start);
}

} // namespace

TEST(ReadingsExportDigits, WritesTheShortestRoundTripText)
{
    // Decimal values as a meter shows them: the shortest text is the text the meter showed.
    EXPECT_EQ(secondLine(readingsToCsv({readingOf(0.145, 19.6)})).substr(0, 10), "0.145,19.6");
    // 0.1 + 0.2 is not 0.3: the shortest text that reads back to it needs 17 digits
    // (IEEE 754 binary64; the classic example, common practice).
    EXPECT_EQ(secondLine(readingsToCsv({readingOf(0.1 + 0.2, 1e-5)})).substr(0, 25), "0.30000000000000004,1e-05");
}

TEST(ReadingsExportDigits, EveryValueReadsBackExactlyAndNeverLonger)
{
    std::mt19937_64 random(20261202);
    std::uniform_real_distribution<double> current(0.0, 12.0);
    std::uniform_real_distribution<double> voltage(0.0, 1000.0);
    std::vector<Reading> readings;
    for (int i = 0; i < 2000; ++i)
        readings.push_back(readingOf(current(random), voltage(random)));
    readings.push_back(readingOf(std::nextafter(1.0, 2.0), 5e-324)); // the next double after 1; the smallest denormal
    const std::string csv = readingsToCsv(readings);
    const ReadingsCsvParse parsed = parseReadingsCsv(csv);
    ASSERT_TRUE(parsed.ok()) << parsed.errors.front().message();
    ASSERT_EQ(parsed.readings.size(), readings.size());
    for (std::size_t i = 0; i < readings.size(); ++i) {
        EXPECT_EQ(parsed.readings[i].currentA, readings[i].currentA) << i;
        EXPECT_EQ(parsed.readings[i].voltageV, readings[i].voltageV) << i;
    }
    // Never longer than "%.17g", which always round-trips.
    std::size_t longest = 0;
    for (const Reading &reading : readings) {
        char text[80];
        std::snprintf(text, sizeof text, "%.17g,%.17g", reading.currentA, reading.voltageV);
        longest += std::string(text).size();
    }
    std::size_t written = 0;
    for (std::size_t start = csv.find("\r\n") + 2; start < csv.size();) {
        const std::string line = csv.substr(start, csv.find("\r\n", start) - start);
        const std::size_t second = line.find(',', line.find(',') + 1);
        written += second;
        start += line.size() + 2;
    }
    EXPECT_LT(written, longest);
}
