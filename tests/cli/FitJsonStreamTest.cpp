// fit --json --points streams its per-point array instead of building a tree of it. These checks hold the
// stream to what the tree wrote: the demo's output from before the change (tests/data/
// fit-json-before-streaming/, written by the tree-building sagline-cli) has every key and
// number unchanged, and a 100 000-reading output is the text nlohmann::json's dump(2) makes of it
// (the tree's layout, line for line), its points equal to core's fit of the same file. A point's
// number may be written with fewer digits than dump()'s Grisu2 gives, for the same double.
#include "CliTestSupport.h"

#include "CsvReadings.h"
#include "FitSummary.h"

#include <nlohmann/json.hpp>

#include <charconv>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <string_view>
#include <vector>

using namespace sagline;
using namespace sagline::testing;

namespace {

const std::string beforeDir = std::string(SAGLINE_TEST_DATA_DIR) + "/fit-json-before-streaming/";

class FitJsonStream : public ScratchFolderTest {
protected:
    FitJsonStream() : ScratchFolderTest("sagline-fit-json-") {}
};

// The curvature check's two numbers: since it solves refined normal equations instead of a QR
// over the rows (issue 17), they agree with the golden files to ~1e-12, not to the last bit.
bool isCurvatureNumber(const std::string &at)
{
    const auto endsWith = [&at](const std::string &tail) {
        return at.size() >= tail.size() && at.compare(at.size() - tail.size(), tail.size(), tail) == 0;
    };
    return endsWith("/curvature_coefficient_v_per_a2") || endsWith("/curvature_p");
}

// Every key of `before` is in `after` with an equal value (numbers compared exactly, the
// curvature's to 1e-10 relative); keys added since (other issues extend the output) are allowed.
void expectContains(const nlohmann::json &before, const nlohmann::json &after, const std::string &at)
{
    if (before.is_object()) {
        ASSERT_TRUE(after.is_object()) << at;
        for (const auto &[key, value] : before.items()) {
            ASSERT_TRUE(after.contains(key)) << at << "/" << key << " is gone";
            expectContains(value, after[key], at + "/" + key);
        }
    } else if (before.is_array()) {
        ASSERT_TRUE(after.is_array()) << at;
        ASSERT_EQ(before.size(), after.size()) << at;
        for (std::size_t i = 0; i < before.size(); ++i)
            expectContains(before[i], after[i], at + "/" + std::to_string(i));
    } else if (isCurvatureNumber(at) && before.is_number() && after.is_number()) {
        const double b = before.get<double>();
        EXPECT_NEAR(after.get<double>(), b, 1e-10 * std::fabs(b)) << at;
    } else {
        EXPECT_EQ(before, after) << at;
    }
}

// A made-up sweep of n readings in shuffled order with a deterministic scatter (a linear
// congruential generator, so the file is the same on every machine).
std::string sweepCsv(std::size_t n)
{
    std::string text = "current_a,voltage_v,u_current_a,u_voltage_v\n";
    std::uint64_t state = 20261202;
    const auto next = [&state] {
        state = state * 6364136223846793005ULL + 1442695040888963407ULL;
        return static_cast<double>(state >> 11) / 9007199254740992.0; // [0, 1)
    };
    char line[96];
    for (std::size_t i = 0; i < n; ++i) {
        const double current = 3.33 * next();
        const double voltage = 19.6 - 0.48 * current + 0.02 * (next() - 0.5);
        std::snprintf(line, sizeof line, "%.6f,%.6f,0.002,0.01\n", current, voltage);
        text += line;
    }
    return text;
}

std::vector<std::string_view> linesOf(std::string_view text)
{
    std::vector<std::string_view> lines;
    for (std::size_t end = text.find('\n'); end != std::string_view::npos; end = text.find('\n')) {
        lines.push_back(text.substr(0, end));
        text.remove_prefix(end + 1);
    }
    lines.push_back(text);
    return lines;
}

// A line of the stream that is not the tree's: the same key, a number that reads back to the same
// double, written with no more characters. Returns what is wrong, or "" when so.
std::string differenceOf(std::string_view streamed, std::string_view tree)
{
    const std::size_t colon = tree.rfind(": ");
    if (colon == std::string_view::npos || streamed.substr(0, colon + 2) != tree.substr(0, colon + 2))
        return "not the same key";
    const auto tail = [colon](std::string_view line) {
        line.remove_prefix(colon + 2);
        if (!line.empty() && line.back() == ',')
            line.remove_suffix(1);
        return line;
    };
    const std::string_view a = tail(streamed), b = tail(tree);
    double x = 0.0, y = 0.0;
    const auto ra = std::from_chars(a.data(), a.data() + a.size(), x);
    const auto rb = std::from_chars(b.data(), b.data() + b.size(), y);
    if (ra.ec != std::errc() || ra.ptr != a.data() + a.size() || rb.ec != std::errc() || rb.ptr != b.data() + b.size())
        return "not a number";
    if (x != y)
        return "another double";
    if (a.size() > b.size() || (streamed.back() == ',') != (tree.back() == ','))
        return "longer, or not the same line";
    return "";
}

} // namespace

TEST_F(FitJsonStream, DemoOutputKeepsEveryKeyAndNumberOfTheTreeWriter)
{
    const struct {
        const char *golden;
        std::vector<std::string> args;
    } cases[] = {{"demo-with-setup.json", {"fit", demoReadings, "--setup", demoSetup, "--json", "--points"}},
                 {"demo-york.json", {"fit", demoReadings, "--method", "york", "--json", "--points"}}};
    for (const auto &c : cases) {
        const auto r = runProgram(cli, c.args);
        ASSERT_EQ(r.exitCode, 0) << c.golden << ": " << r.err;
        nlohmann::json before = nlohmann::json::parse(readWholeFile(beforeDir + c.golden));
        nlohmann::json after = nlohmann::json::parse(r.out);
        EXPECT_EQ(after["source"], demoReadings);
        before.erase("source"); // the path as given on the command line
        expectContains(before, after, c.golden);
    }
}

TEST_F(FitJsonStream, LargeOutputIsTheTreesTextAndCoresNumbers)
{
    const std::string csv = write("sweep.csv", sweepCsv(100000));
    const auto r = runProgram(cli, {"fit", csv, "--json", "--points"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const nlohmann::json j = nlohmann::json::parse(r.out);
    // dump(2) of the parsed document is the tree writer's text: same keys in the same order,
    // same indentation, line for line; a number may be shorter for the same double.
    const std::string tree = j.dump(2) + "\n";
    const std::vector<std::string_view> streamedLines = linesOf(r.out), treeLines = linesOf(tree);
    ASSERT_EQ(streamedLines.size(), treeLines.size());
    std::size_t shorter = 0;
    for (std::size_t i = 0; i < treeLines.size(); ++i) {
        if (streamedLines[i] == treeLines[i])
            continue;
        ASSERT_EQ(differenceOf(streamedLines[i], treeLines[i]), "") << "line " << i + 1 << ": " << streamedLines[i]
                                                                    << " where the tree has " << treeLines[i];
        ++shorter;
    }
    EXPECT_LT(shorter, treeLines.size() / 100) << "lines whose number has other digits than the tree's";

    const ReadingsCsvParse parsed = parseReadingsCsv(sweepCsv(100000));
    ASSERT_TRUE(parsed.ok());
    const FitSummary fit = fitReadings(parsed.readings, FitMethod::Ols);
    ASSERT_TRUE(fit.ok());
    const nlohmann::json &points = j["points"];
    ASSERT_EQ(points.size(), fit.points.size());
    for (std::size_t i = 0; i < points.size(); ++i) {
        const PointFit &p = fit.points[i];
        const nlohmann::json &q = points[i];
        ASSERT_EQ(q["row"].get<std::size_t>(), p.row);
        ASSERT_EQ(q["line"].get<int>(), parsed.lineNumbers[i]);
        ASSERT_EQ(q["used"].get<bool>(), p.used);
        ASSERT_EQ(q["outlier"].get<bool>(), p.outlier);
        ASSERT_EQ(q["residual_v"].get<double>(), p.residualV) << i;
        ASSERT_EQ(q["studentized"].is_null(), !p.studentized) << i;
        if (p.studentized) {
            ASSERT_EQ(q["studentized"].get<double>(), *p.studentized) << i;
        }
        ASSERT_EQ(q["screening_statistic"].is_null(), !p.screeningStatistic) << i;
        if (p.screeningStatistic) {
            ASSERT_EQ(q["screening_statistic"].get<double>(), *p.screeningStatistic) << i;
        }
    }
    EXPECT_EQ(j["slope"].get<double>(), fit.slope);
    EXPECT_EQ(j["intercept"].get<double>(), fit.intercept);
}
