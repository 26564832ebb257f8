// The readings CSV's decimal mark: a number such as 1,250 (a thousands separator or a decimal
// comma?) is refused with its line unless the file states its mark or its numbers show it;
// decimal-comma files (cells separated by ';') are read when the mark is stated or shown.
#include "CsvReadings.h"

#include <gtest/gtest.h>

#include <string>

using namespace sagline;

namespace {

std::string allErrors(const ReadingsCsvParse &r)
{
    std::string text;
    for (const auto &e : r.errors)
        text += e.message() + "\n";
    return text;
}

} // namespace

TEST(CsvDecimalMark, TellsWhatOneCellSaysAboutTheMark)
{
    EXPECT_EQ(markEvidence("26"), MarkEvidence::None);
    EXPECT_EQ(markEvidence("1e-3"), MarkEvidence::None);
    EXPECT_EQ(markEvidence("24.15"), MarkEvidence::Point);
    EXPECT_EQ(markEvidence("24,15"), MarkEvidence::Comma);
    EXPECT_EQ(markEvidence("0,250"), MarkEvidence::Comma); // a thousands group never starts with 0
    EXPECT_EQ(markEvidence("0.250"), MarkEvidence::Point);
    EXPECT_EQ(markEvidence("1,2500"), MarkEvidence::Comma);
    EXPECT_EQ(markEvidence("1.250e-3"), MarkEvidence::Point);
    EXPECT_EQ(markEvidence("1,250"), MarkEvidence::Ambiguous);
    EXPECT_EQ(markEvidence("-26.400"), MarkEvidence::Ambiguous);
    EXPECT_EQ(markEvidence("1.250,5"), MarkEvidence::Grouped);
    EXPECT_EQ(markEvidence("1,250,000"), MarkEvidence::Grouped);
}

TEST(CsvDecimalMark, ReadsTheStatementComment)
{
    EXPECT_FALSE(parseDecimalMarkComment("# made on the bench").isStatement);
    EXPECT_FALSE(parseDecimalMarkComment("current_a,voltage_v").isStatement);
    EXPECT_EQ(parseDecimalMarkComment("# decimal_mark: ,").mark, DecimalMark::Comma);
    EXPECT_EQ(parseDecimalMarkComment("  #decimal_mark = .").mark, DecimalMark::Point);
    EXPECT_EQ(parseDecimalMarkComment("# decimal_mark: \",\";;;").mark, DecimalMark::Comma); // padded by a spreadsheet
    const DecimalMarkStatement bad = parseDecimalMarkComment("# decimal_mark: ;");
    EXPECT_TRUE(bad.isStatement);
    EXPECT_FALSE(bad.mark.has_value());
    EXPECT_NE(bad.problem.find("',' or '.'"), std::string::npos);
}

TEST(CsvDecimalMark, CommaSeparatedFileRefusesACommaNumberWithItsLine)
{
    // Unquoted, the comma splits the cell: the line is refused and the message says why it may be.
    const ReadingsCsvParse split = parseReadingsCsv("current_a,voltage_v\n0,26.4\n1,250,24.1\n");
    ASSERT_FALSE(split.ok());
    EXPECT_EQ(split.errors.front().field, "line 3");
    EXPECT_NE(split.errors.front().rule.find("1,250"), std::string::npos) << allErrors(split);
    EXPECT_TRUE(split.readings.empty());
    // Quoted, it stays one cell and is refused naming the line and the column.
    const ReadingsCsvParse quoted = parseReadingsCsv("current_a,voltage_v\n0,26.4\n\"1,250\",24.1\n");
    ASSERT_FALSE(quoted.ok());
    EXPECT_EQ(quoted.errors.front().field, "line 3, column current_a");
    EXPECT_NE(quoted.errors.front().rule.find("thousands separator or a decimal comma"), std::string::npos)
        << allErrors(quoted);
}

TEST(CsvDecimalMark, StatedDecimalCommaFileIsRead)
{
    const ReadingsCsvParse r = parseReadingsCsv("# decimal_mark: ,\n"
                                                "current_a;voltage_v;u_voltage_v\n"
                                                "0;26,4;0,02\n"
                                                "1,250;24,1;0,02\n");
    ASSERT_TRUE(r.ok()) << allErrors(r);
    ASSERT_EQ(r.readings.size(), 2u);
    EXPECT_DOUBLE_EQ(r.readings[1].currentA, 1.25);
    EXPECT_DOUBLE_EQ(r.readings[1].voltageV, 24.1);
    EXPECT_DOUBLE_EQ(*r.readings[0].uVoltageV, 0.02);
    EXPECT_EQ(r.lineNumbers[1], 4);
    EXPECT_EQ(r.decimalMark, DecimalMark::Comma);
    EXPECT_EQ(r.decimalMarkBasis, "stated on line 1");
}

TEST(CsvDecimalMark, StatedPointInASemicolonFileReadsPointsAndRefusesCommas)
{
    const ReadingsCsvParse good = parseReadingsCsv("# decimal_mark: .\ncurrent_a;voltage_v\n0;26.4\n1.250;24.1\n");
    ASSERT_TRUE(good.ok()) << allErrors(good);
    EXPECT_DOUBLE_EQ(good.readings[1].currentA, 1.25);
    const ReadingsCsvParse bad = parseReadingsCsv("# decimal_mark: .\ncurrent_a;voltage_v\n0;26.4\n1,250;24.1\n");
    ASSERT_FALSE(bad.ok());
    EXPECT_EQ(bad.errors.front().field, "line 4, column current_a");
}

TEST(CsvDecimalMark, UnstatedSemicolonFileTakesTheMarkItsNumbersShow)
{
    // "13,85" can only be a decimal comma, so "1,250" in the same file is one and a quarter.
    const ReadingsCsvParse r = parseReadingsCsv("current_a;voltage_v\n0;26,4\n1,250;13,85\n");
    ASSERT_TRUE(r.ok()) << allErrors(r);
    EXPECT_DOUBLE_EQ(r.readings[1].currentA, 1.25);
    EXPECT_EQ(r.decimalMark, DecimalMark::Comma);
    EXPECT_NE(r.decimalMarkBasis.find("line 2"), std::string::npos) << r.decimalMarkBasis;
}

TEST(CsvDecimalMark, UnstatedAmbiguousNumberIsRefusedWithItsLine)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a;voltage_v\n0;26\n1,250;24\n");
    ASSERT_FALSE(r.ok());
    ASSERT_EQ(r.errors.size(), 1u) << allErrors(r);
    EXPECT_EQ(r.errors.front().field, "line 3, column current_a");
    EXPECT_NE(r.errors.front().rule.find("# decimal_mark: ,"), std::string::npos) << allErrors(r);
    EXPECT_TRUE(r.readings.empty());
}

TEST(CsvDecimalMark, FileMixingBothMarksIsRefusedNamingBothLines)
{
    const ReadingsCsvParse r = parseReadingsCsv("current_a;voltage_v\n0;26,4\n0,5;25.31\n");
    ASSERT_FALSE(r.ok());
    EXPECT_EQ(r.errors.front().field, "file");
    EXPECT_NE(r.errors.front().rule.find("line 2"), std::string::npos) << allErrors(r);
    EXPECT_NE(r.errors.front().rule.find("line 3"), std::string::npos) << allErrors(r);
}

TEST(CsvDecimalMark, ThousandsSeparatorsAreNeverAccepted)
{
    for (const char *text : {"# decimal_mark: ,\ncurrent_a;voltage_v\n0;26,4\n1.250,5;24,1\n",
                             "# decimal_mark: .\ncurrent_a;voltage_v\n0;26.4\n1,250.5;24.1\n",
                             "# by hand\ncurrent_a,voltage_v\n0,26.4\n\"1,250.5\",24.1\n"}) {
        const ReadingsCsvParse r = parseReadingsCsv(text);
        ASSERT_FALSE(r.ok()) << text;
        EXPECT_EQ(r.errors.front().field, "line 4, column current_a") << text;
        EXPECT_NE(r.errors.front().rule.find("thousands separators are not accepted"), std::string::npos)
            << allErrors(r);
    }
}

TEST(CsvDecimalMark, StatementProblemsNameTheirLine)
{
    const ReadingsCsvParse comma = parseReadingsCsv("# decimal_mark: ,\ncurrent_a,voltage_v\n0,26.4\n");
    ASSERT_FALSE(comma.ok());
    EXPECT_EQ(comma.errors.front().field, "line 1");
    EXPECT_NE(comma.errors.front().rule.find("';'"), std::string::npos) << allErrors(comma);

    const ReadingsCsvParse twice = parseReadingsCsv("# decimal_mark: ,\n# decimal_mark: .\ncurrent_a;voltage_v\n0;1\n");
    ASSERT_FALSE(twice.ok());
    EXPECT_EQ(twice.errors.front().field, "line 2");

    const ReadingsCsvParse late = parseReadingsCsv("current_a;voltage_v\n# decimal_mark: ,\n0;26,4\n");
    ASSERT_FALSE(late.ok());
    EXPECT_EQ(late.errors.front().field, "line 2");

    const ReadingsCsvParse unknown = parseReadingsCsv("# decimal_mark: ;\ncurrent_a;voltage_v\n0;1\n");
    ASSERT_FALSE(unknown.ok());
    EXPECT_EQ(unknown.errors.front().field, "line 1");
    EXPECT_EQ(unknown.errors.size(), 1u) << allErrors(unknown);
}

TEST(CsvDecimalMark, CommentsAndTabsAndTheCommaContractStillWork)
{
    const ReadingsCsvParse comments =
        parseReadingsCsv("# bench 3, unit 17\ncurrent_a,voltage_v\n# warm-up done\n0,26.4\n1.25,24.1\n");
    ASSERT_TRUE(comments.ok()) << allErrors(comments);
    EXPECT_EQ(comments.readings.size(), 2u);
    EXPECT_EQ(comments.decimalMark, DecimalMark::Point);
    // A plain "26.400" in a comma-separated file is 26.4: the contract fixes '.'.
    const ReadingsCsvParse contract = parseReadingsCsv("current_a,voltage_v\n0,26.400\n");
    ASSERT_TRUE(contract.ok()) << allErrors(contract);
    EXPECT_DOUBLE_EQ(contract.readings[0].voltageV, 26.4);
    const ReadingsCsvParse tabs = parseReadingsCsv("# decimal_mark: ,\ncurrent_a\tvoltage_v\n0\t26,4\n0,5\t25,3\n");
    ASSERT_TRUE(tabs.ok()) << allErrors(tabs);
    EXPECT_DOUBLE_EQ(tabs.readings[1].voltageV, 25.3);
}
