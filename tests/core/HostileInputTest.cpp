// Hostile input never crashes, hangs or misleads (the reproducers of an attack on the readers):
// one JSON reader with a depth limit and no duplicate keys, physical bounds naming the field,
// inputs that must be regular files within a size cap, text made printable and valid UTF-8 on
// its way out, CSV cells that a spreadsheet would execute quoted, stored values that are not
// numbers refused, a line that rises refused for a verdict, and reading a WAL-mode session
// without leaving side files.
#include "CsvField.h"
#include "CsvReadings.h"
#include "FitSummary.h"
#include "JsonReader.h"
#include "LineFit.h"
#include "OutputText.h"
#include "ResultAnalysis.h"
#include "SetupJson.h"
#include "TextFile.h"

#include "SessionTestSupport.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <sqlite3.h>

#include <filesystem>

using namespace sagline;
using sagline::test::sampleReading;
using sagline::test::sampleSession;
using sagline::test::TempFolder;
using sagline::test::writeBytes;

namespace {

std::string nested(std::size_t depth, const std::string &inner = "1")
{
    return std::string(depth, '[') + inner + std::string(depth, ']');
}

const char *demoSetup = R"({"nameplate": {"rated_power_va": 60, "primary_voltage_v": 230, "secondary_voltage_v": 18,
                           "secondary_no_load_voltage_v": 19.6}, "bench": {"steps": 4}})";

bool hasErrorOn(const SetupParse &parse, const std::string &field, const std::string &ruleWords)
{
    for (const FieldError &e : parse.errors) {
        if (e.field == field && e.rule.find(ruleWords) != std::string::npos)
            return true;
    }
    return false;
}

std::string messages(const FieldErrors &errors)
{
    std::string text;
    for (const FieldError &e : errors)
        text += e.message() + "\n";
    return text;
}

} // namespace

TEST(JsonReader, ADeeplyNestedDocumentIsRefusedNotACrash)
{
    // Reproducer: a setup value nested 50 000 arrays deep crashed plan, run, import and
    // sagline-sim with a stack overflow while the error message was built.
    const JsonRead read = readJson(nested(50000));
    ASSERT_FALSE(read.ok());
    EXPECT_NE(read.error.find("nested more than 32 levels deep"), std::string::npos) << read.error;
    const SetupParse setup = parseSetupJson(R"({"nameplate": {"rated_power_va": )" + nested(50000) + "}}");
    ASSERT_FALSE(setup.setup);
    EXPECT_NE(messages(setup.errors).find("nested more than 32 levels deep at \"nameplate.rated_power_va"),
              std::string::npos)
        << messages(setup.errors);
    EXPECT_TRUE(readJson(nested(31)).ok()); // within the limit
}

TEST(JsonReader, ADuplicateKeyIsRefusedNamingIt)
{
    // Reproducer: a duplicated key silently won (the second rated power, 6000 VA, was planned).
    const std::string text = R"({"nameplate": {"rated_power_va": 60, "primary_voltage_v": 230, "rated_power_va": 6000}})";
    const JsonRead read = readJson(text);
    ASSERT_FALSE(read.ok());
    EXPECT_EQ(read.error, "the key \"rated_power_va\" appears twice in \"nameplate\"; give each key once (the last one "
                          "would silently win)");
    const SetupParse setup = parseSetupJson(text);
    EXPECT_FALSE(setup.setup);
    // The same key in different objects is fine.
    EXPECT_TRUE(readJson(R"({"a": {"x": 1}, "b": {"x": 2}})").ok());
}

TEST(JsonReader, SyntaxNumbersAndEncodingAreRefusedWithAPlace)
{
    const JsonRead syntax = readJson("{\n  \"a\": 1,\n  \"b\": }");
    EXPECT_NE(syntax.error.find("is not valid JSON at line 3"), std::string::npos) << syntax.error;
    const JsonRead huge = readJson(R"({"a": 1e999})");
    EXPECT_NE(huge.error.find("too large"), std::string::npos) << huge.error;
    const JsonRead bytes = readJson("{\"a\": \"\xff\xfe\"}");
    EXPECT_FALSE(bytes.ok());
    EXPECT_FALSE(readJson("").ok());
}

TEST(JsonReader, ValuesQuotedInMessagesAreShortAndPrintable)
{
    const nlohmann::json value = std::string(10 * 1024 * 1024, 'x') + "\x1b[2J";
    const std::string shown = shortJson(value);
    EXPECT_LE(shown.size(), 70u);
    EXPECT_EQ(shown.find('\x1b'), std::string::npos);
}

TEST(SetupJson, NumbersOutsidePhysicalBoundsAreNamed)
{
    // Reproducers: plan accepted no-load voltages of 1e308 V, ratings of 1e-308 VA and a rheostat of 1 mΩ.
    auto with = [](const std::string &field, const std::string &value) {
        nlohmann::json document = nlohmann::json::parse(demoSetup);
        document["bench"]["rheostat"] = {{"total_resistance_ohm", 50}, {"power_rating_w", 100}};
        nlohmann::json *target = &document;
        std::size_t start = 0;
        for (std::size_t dot = field.find('.'); dot != std::string::npos; start = dot + 1, dot = field.find('.', start))
            target = &(*target)[field.substr(start, dot - start)];
        (*target)[field.substr(start)] = nlohmann::json::parse(value);
        return parseSetupJson(document.dump());
    };
    EXPECT_TRUE(hasErrorOn(with("nameplate.secondary_no_load_voltage_v", "1e308"), "nameplate.secondary_no_load_voltage_v",
                           "at most 1000 V"));
    EXPECT_TRUE(hasErrorOn(with("nameplate.rated_power_va", "1e-308"), "nameplate.rated_power_va", "at least 0.1 VA"));
    EXPECT_TRUE(hasErrorOn(with("bench.rheostat.total_resistance_ohm", "0.001"), "bench.rheostat.total_resistance_ohm",
                           "at least 0.1 Ω"));
    EXPECT_TRUE(with("bench.rheostat.total_resistance_ohm", "0.1").setup.has_value());
}

TEST(TextFile, OnlyARegularFileWithinTheCapIsRead)
{
    TempFolder folder;
    // Reproducers: a folder "is not valid JSON at line 1"; plan /dev/zero grew memory at 100 MB/s.
    const TextFileRead directory = readTextFile(folder.file(""), maxSetupFileBytes);
    EXPECT_EQ(directory.error, "is a folder, not a file");
    const TextFileRead device = readTextFile("/dev/zero", maxSetupFileBytes);
    EXPECT_FALSE(device.text);
    EXPECT_NE(device.error.find("not a regular file"), std::string::npos);
    writeBytes(folder.file("big.json"), std::string(maxSetupFileBytes + 1, ' '));
    EXPECT_EQ(readTextFile(folder.file("big.json"), maxSetupFileBytes).error, "is larger than the 1 MB such a file may be");
    writeBytes(folder.file("ok.json"), "\xEF\xBB\xBF{}");
    const TextFileRead withMark = readTextFile(folder.file("ok.json"), maxSetupFileBytes);
    ASSERT_TRUE(withMark.text);
    EXPECT_EQ(withMark.text->view(), "{}"); // the byte-order mark left out
    writeBytes(folder.file("empty.json"), "");
    const TextFileRead empty = readTextFile(folder.file("empty.json"), maxSetupFileBytes);
    ASSERT_TRUE(empty.text);
    EXPECT_EQ(empty.text->view(), "");
    const SetupParse setup = loadSetupFile(folder.file(""));
    EXPECT_EQ(messages(setup.errors), folder.file("") + ": is a folder, not a file\n");
}

TEST(OutputText, TextReachesTerminalsAndJsonValidAndPrintable)
{
    EXPECT_EQ(validUtf8("R. Okafor"), "R. Okafor");
    EXPECT_EQ(validUtf8("Ω ±"), "Ω ±");
    EXPECT_EQ(validUtf8("a\xff" "b"), "a\xEF\xBF\xBD" "b");
    EXPECT_EQ(validUtf8("\xC0\xAF"), "\xEF\xBF\xBD\xEF\xBF\xBD"); // overlong '/'
    EXPECT_EQ(validUtf8("\xED\xA0\x80"), "\xEF\xBF\xBD\xEF\xBF\xBD\xEF\xBF\xBD"); // a surrogate
    // Reproducer: ANSI escapes in setup strings reached the terminal raw.
    EXPECT_EQ(printableText("\x1b[31mred\x1b[0m"), "\\x1B[31mred\\x1B[0m");
    EXPECT_EQ(printableText("tab\there\nnext\x7f\xC2\x9B"), "tab\\there\\nnext\\x7F\\x9B");
    // Cut on a character boundary, never inside "Ω" (two bytes).
    EXPECT_EQ(printableText("ΩΩΩ", 3), "ΩΩ…");
    // Reproducer: a non-UTF-8 operator name aborted compare --json and fit --json.
    const nlohmann::json document = {{"operator", "caf\xe9"}, {"note", "bell\a"}};
    EXPECT_EQ(jsonText(document), "{\"note\":\"bell\\u0007\",\"operator\":\"caf\xEF\xBF\xBD\"}");
    EXPECT_EQ(jsonQuoted("a\"b\x1b"), "\"a\\\"b\\u001b\"");
    const FieldError error{"nameplate.construction", "'\x1b[2Jwiped' is not one of: laminated"};
    EXPECT_EQ(error.message().find('\x1b'), std::string::npos);
}

TEST(CsvField, CellsASpreadsheetWouldRunAreQuotedAsText)
{
    // OWASP, "CSV Injection": =, +, -, @, tab and carriage return at the start of a cell.
    EXPECT_EQ(csvField("=HYPERLINK(\"http://x\")"), "\"'=HYPERLINK(\"\"http://x\"\")\"");
    EXPECT_EQ(csvField("+1+2"), "\"'+1+2\"");
    EXPECT_EQ(csvField("-2+3"), "\"'-2+3\"");
    EXPECT_EQ(csvField("@SUM(A1)"), "\"'@SUM(A1)\"");
    EXPECT_EQ(csvField("\tcmd"), "\"'\tcmd\"");
    EXPECT_EQ(csvField("\rcmd"), "\"'\rcmd\"");
    // Numbers and ordinary text are unchanged.
    EXPECT_EQ(csvField("-0.5"), "-0.5");
    EXPECT_EQ(csvField("1e-06"), "1e-06");
    EXPECT_EQ(csvField("R. Okafor"), "R. Okafor");
    EXPECT_EQ(csvField("a,b"), "\"a,b\"");
}

TEST(CsvReadings, AHugeCellIsNotEchoedAndUnphysicalValuesAreRefused)
{
    // Reproducer: a 10 MB CSV cell was echoed whole in the error.
    const ReadingsCsvParse huge = parseReadingsCsv("current_a,voltage_v\n" + std::string(10 * 1024 * 1024, 'x') + ",1\n");
    ASSERT_FALSE(huge.ok());
    EXPECT_LT(messages(huge.errors).size(), 400u);
    // Reproducer: distinct currents of 1e300 were said to be "all equal".
    const ReadingsCsvParse large = parseReadingsCsv("current_a,voltage_v\n1e300,1\n2e300,1\n");
    ASSERT_FALSE(large.ok());
    EXPECT_NE(messages(large.errors).find("beyond any bench reading"), std::string::npos) << messages(large.errors);
    LineFit fit;
    fit.add(1e300, 1.0);
    fit.add(2e300, 2.0);
    const LineFitResult result = fit.result();
    EXPECT_EQ(result.status, FitStatus::NonFiniteValue);
    EXPECT_EQ(result.message.find("equal"), std::string::npos) << result.message;
}

TEST(ResultAnalysis, ALineThatRisesIsRefusedForAVerdict)
{
    // Reproducer: readings whose voltage rises with current fitted R = -500 mΩ and copper loss
    // -5.6 W, and were judged PASS.
    std::vector<Reading> readings;
    for (int k = 0; k <= 5; ++k)
        readings.push_back(sampleReading(k, 0.5 * k, 18.0 + 0.25 * k));
    const FitSummary fit = fitReadings(readings, FitMethod::Ols);
    ASSERT_TRUE(fit.ok());
    EXPECT_LT(fit.seriesResistanceOhm(), 0.0);
    AnalysisInput input;
    input.ratedCurrentA = 3.33;
    const AnalysisResult analysis = analyseFit(fit, input);
    EXPECT_FALSE(analysis.ok());
    EXPECT_NE(messages(analysis.errors).find("the voltage does not fall with the current"), std::string::npos)
        << messages(analysis.errors);
}

TEST(SessionStoreUntrusted, TextInAStoredNumberIsRefusedNotReadAsZero)
{
    // Reproducer: text in a stored current was read as 0 A.
    TempFolder folder;
    const std::string path = folder.file("text.sagline");
    {
        auto store = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(store.ok());
        ASSERT_TRUE(store.value->appendReading(sampleReading(0, 0.5, 26.0)).ok());
    }
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, "UPDATE reading SET current_a = 'twelve amps'", nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
    auto review = SessionStore::openForReview(path);
    ASSERT_TRUE(review.ok()) << review.message;
    const auto readings = review.value->readings();
    EXPECT_EQ(readings.code, StoreCode::Corrupt);
    EXPECT_NE(readings.message.find("current_a holds text or bytes, not a number"), std::string::npos) << readings.message;
}

TEST(SessionStoreUntrusted, ReadingAWalModeSessionLeavesNoSideFiles)
{
    // Reproducer: reading a session in WAL mode left -wal and -shm files beside it.
    TempFolder folder;
    const std::string path = folder.file("wal.sagline");
    {
        auto store = SessionStore::create(path, sampleSession());
        ASSERT_TRUE(store.ok());
        ASSERT_TRUE(store.value->appendReading(sampleReading(0, 0.5, 26.0)).ok());
    }
    sqlite3 *db = nullptr;
    ASSERT_EQ(sqlite3_open(path.c_str(), &db), SQLITE_OK);
    ASSERT_EQ(sqlite3_exec(db, "PRAGMA journal_mode = WAL", nullptr, nullptr, nullptr), SQLITE_OK);
    sqlite3_close(db);
    ASSERT_FALSE(std::filesystem::exists(path + "-wal"));
    const std::string before = sagline::test::fileBytes(path);
    {
        auto review = SessionStore::openForReview(path);
        ASSERT_TRUE(review.ok()) << review.message;
        EXPECT_EQ(review.value->readings().value.size(), 1u);
        EXPECT_NE(review.value->notice().find("write-ahead-log"), std::string::npos) << review.value->notice();
    }
    EXPECT_FALSE(std::filesystem::exists(path + "-wal"));
    EXPECT_FALSE(std::filesystem::exists(path + "-shm"));
    EXPECT_EQ(sagline::test::fileBytes(path), before);
}
