// The columns the CLI's fit of a CSV keeps instead of Readings must give the very same fit:
// every number, flag and message, for each method, with excluded, flagged and unstated rows.
#include "CsvReadings.h"
#include "FitSummary.h"

#include <gtest/gtest.h>

#include <limits>
#include <random>

using namespace sagline;

namespace {

void expectSameFit(const FitSummary &a, const FitSummary &b)
{
    ASSERT_EQ(a.status, b.status);
    EXPECT_EQ(a.message, b.message);
    EXPECT_EQ(a.n, b.n);
    EXPECT_EQ(a.slope, b.slope);
    EXPECT_EQ(a.intercept, b.intercept);
    EXPECT_EQ(a.slopeSe, b.slopeSe);
    EXPECT_EQ(a.interceptSe, b.interceptSe);
    EXPECT_EQ(a.covariance, b.covariance);
    EXPECT_EQ(a.mswd, b.mswd);
    EXPECT_EQ(a.rSquared, b.rSquared);
    EXPECT_EQ(a.residualSdV, b.residualSdV);
    EXPECT_EQ(a.curvatureP, b.curvatureP);
    EXPECT_EQ(a.curvatureCoefficient, b.curvatureCoefficient);
    EXPECT_EQ(a.outlierRows, b.outlierRows);
    EXPECT_EQ(a.outlierScreening.criticalValue, b.outlierScreening.criticalValue);
    ASSERT_EQ(a.points.size(), b.points.size());
    for (std::size_t i = 0; i < a.points.size(); ++i) {
        EXPECT_EQ(a.points[i].used, b.points[i].used) << i;
        EXPECT_EQ(a.points[i].residualV, b.points[i].residualV) << i;
        EXPECT_EQ(a.points[i].studentized, b.points[i].studentized) << i;
        EXPECT_EQ(a.points[i].screeningStatistic, b.points[i].screeningStatistic) << i;
        EXPECT_EQ(a.points[i].outlier, b.points[i].outlier) << i;
    }
}

// Made-up readings: a line with scatter, a gross misread, excluded and flagged rows; every
// other row states its uncertainties when `stated`.
std::vector<Reading> madeUpReadings(bool stated)
{
    std::mt19937_64 random(5);
    std::normal_distribution<double> noise(0.0, 0.01);
    std::vector<Reading> readings;
    for (int i = 0; i < 400; ++i) {
        Reading r;
        r.currentA = 0.005 * i;
        r.voltageV = 24.0 - 1.2 * r.currentA + noise(random) + (i == 200 ? 0.5 : 0.0);
        if (stated) {
            r.uCurrentA = 0.001;
            r.uVoltageV = 0.01;
        }
        r.excluded = i % 97 == 3;
        r.flags = i % 89 == 5 ? flagOverload : (i % 83 == 7 ? flagNotANumber : flagNone);
        readings.push_back(r);
    }
    return readings;
}

ReadingColumns columnsOf(const std::vector<Reading> &readings)
{
    ReadingColumns columns;
    for (const Reading &r : readings)
        columns.append(r);
    return columns;
}

} // namespace

TEST(ReadingColumns, FitEqualsTheFitOfTheReadingsForEveryMethod)
{
    for (bool stated : {false, true}) {
        const std::vector<Reading> readings = madeUpReadings(stated);
        const ReadingColumns columns = columnsOf(readings);
        for (FitMethod method : {FitMethod::Ols, FitMethod::Wls, FitMethod::York}) {
            SCOPED_TRACE(toString(method) + (stated ? ", stated u" : ", no u"));
            expectSameFit(fitReadings(readings, method), fitReadings(columns, method));
        }
    }
}

// Every row used as it stands (the common CSV): OLS reads the columns in place instead of
// copying them; the fit must still be the fit of the same readings, and a value that is not a
// finite number must still be refused with the row named.
TEST(ReadingColumns, ColumnsReadInPlaceGiveTheSameFitAndTheSameRefusal)
{
    std::vector<Reading> readings = madeUpReadings(false);
    for (Reading &r : readings) {
        r.excluded = false;
        r.flags = flagNone;
    }
    {
        SCOPED_TRACE("every row used");
        const FitSummary inPlace = fitReadings(columnsOf(readings), FitMethod::Ols);
        ASSERT_TRUE(inPlace.ok());
        EXPECT_EQ(inPlace.n, readings.size());
        EXPECT_EQ(inPlace.outlierRows.front(), 200u) << "the gross misread is flagged";
        expectSameFit(fitReadings(readings, FitMethod::Ols), inPlace);
    }
    struct Bad {
        const char *what;
        std::size_t row;
        double Reading::*field;
        double value;
    };
    for (const Bad bad : {Bad{"one voltage infinite", 123, &Reading::voltageV, std::numeric_limits<double>::infinity()},
                          Bad{"one current not a number", 7, &Reading::currentA, std::numeric_limits<double>::quiet_NaN()}}) {
        SCOPED_TRACE(bad.what);
        std::vector<Reading> broken = readings;
        broken[bad.row].*bad.field = bad.value;
        const FitSummary refused = fitReadings(columnsOf(broken), FitMethod::Ols);
        EXPECT_EQ(refused.status, FitStatus::NonFiniteValue);
        EXPECT_NE(refused.message.find("row " + std::to_string(bad.row)), std::string::npos) << refused.message;
        expectSameFit(fitReadings(broken, FitMethod::Ols), refused);
    }
}

TEST(ReadingColumns, CsvColumnsAreTheReadingsOfTheSameFile)
{
    const std::string text = "current_a,voltage_v,u_current_a,u_voltage_v,excluded,flags\n"
                             "0.1,24.0,0.001,0.01,false,\n"
                             "0.5,23.5,,0.01,true,\n"
                             "\n"
                             "0.9,23.0,0.001,,false,overload\n"
                             "1.3,22.4,0.001,0.01,false,unstable\n";
    const ReadingsCsvParse readings = parseReadingsCsv(text);
    const ReadingColumnsCsvParse columns = parseReadingColumnsCsv(text);
    ASSERT_TRUE(readings.ok());
    ASSERT_TRUE(columns.ok());
    EXPECT_EQ(columns.lineNumbers, readings.lineNumbers);
    EXPECT_EQ(columns.lineNumbers, (std::vector<int>{2, 3, 5, 6}));
    ReadingColumns expected;
    for (const Reading &r : readings.readings)
        expected.append(r);
    EXPECT_EQ(columns.columns.currentA, expected.currentA);
    EXPECT_EQ(columns.columns.voltageV, expected.voltageV);
    EXPECT_EQ(columns.columns.uCurrentA, expected.uCurrentA);
    EXPECT_EQ(columns.columns.uVoltageV, expected.uVoltageV);
    EXPECT_EQ(columns.columns.state, expected.state);
    EXPECT_EQ(columns.columns.state[1] & ReadingColumns::fitted, 0); // excluded
    EXPECT_EQ(columns.columns.state[2] & ReadingColumns::fitted, 0); // overload
    EXPECT_NE(columns.columns.state[3] & ReadingColumns::fitted, 0); // unstable is fitted

    const ReadingColumnsCsvParse bad = parseReadingColumnsCsv("current_a,voltage_v\n1,x\n");
    EXPECT_FALSE(bad.ok());
    EXPECT_EQ(bad.columns.size(), 0u);
    EXPECT_EQ(bad.errors.front().message(), parseReadingsCsv("current_a,voltage_v\n1,x\n").errors.front().message());
}
