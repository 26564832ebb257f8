// sagline-cli fit: exit codes, messages naming the line and column, and the JSON keys of DESIGN.md.
#include "RunProgram.h"

#include "SessionStore.h"

#include <gtest/gtest.h>
#include <nlohmann/json.hpp>

#include <filesystem>
#include <fstream>

using sagline::testing::runProgram;

namespace {

const std::string cli = SAGLINE_CLI_PATH;
const std::string demoReadings = std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-readings.csv";
const std::string demoSetup = std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json";

std::string writeTemp(const std::string &name, const std::string &text)
{
    const auto path = std::filesystem::temp_directory_path() / ("sagline-fit-test-" + name);
    std::ofstream(path) << text;
    return path.string();
}

const char *const designKeys[] = {"n", "method", "slope", "intercept", "series_resistance_ohm",
                                  "series_resistance_se_ohm", "no_load_voltage_v", "no_load_voltage_se_v",
                                  "r_squared", "residual_sd_v", "series_resistance_ci95_ohm", "outliers",
                                  "curvature_p"};

} // namespace

TEST(FitCommand, JsonHasEveryDesignKeyForEachMethod)
{
    for (const char *method : {"ols", "wls", "york"}) {
        const auto r = runProgram(cli, {"fit", demoReadings, "--method", method, "--json"});
        ASSERT_EQ(r.exitCode, 0) << method << ": " << r.err;
        const auto j = nlohmann::json::parse(r.out);
        for (const char *key : designKeys)
            EXPECT_TRUE(j.contains(key)) << method << ": " << key;
        EXPECT_EQ(j["method"], method);
        EXPECT_EQ(j["n"], 9);
        EXPECT_DOUBLE_EQ(j["series_resistance_ohm"].get<double>(), -j["slope"].get<double>());
        EXPECT_DOUBLE_EQ(j["no_load_voltage_v"].get<double>(), j["intercept"].get<double>());
        ASSERT_TRUE(j["series_resistance_ci95_ohm"].is_array());
        EXPECT_EQ(j["series_resistance_ci95_ohm"].size(), 2u);
        EXPECT_TRUE(j["outliers"].is_array());
        EXPECT_TRUE(j["curvature_p"].is_number());
        if (std::string(method) == "york") {
            for (const char *key : {"series_resistance_se_scaled_ohm", "no_load_voltage_se_scaled_v", "mswd"})
                EXPECT_TRUE(j[key].is_number()) << key;
        }
    }
}

TEST(FitCommand, HumanSummaryShowsUnitsUncertaintyAndVerdict)
{
    const auto r = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    EXPECT_NE(r.out.find("Series resistance R"), std::string::npos);
    EXPECT_NE(r.out.find("mΩ ± "), std::string::npos);
    EXPECT_NE(r.out.find("U (k = "), std::string::npos) << r.out;
    EXPECT_NE(r.out.find(", 95 %)"), std::string::npos) << r.out;
    EXPECT_EQ(r.out.find("(k = 2)"), std::string::npos) << "one coverage everywhere: no fixed k = 2";
    EXPECT_EQ(r.out.find("Student t"), std::string::npos) << "no second interval with its own coverage";
    EXPECT_NE(r.out.find("Regulation"), std::string::npos);
    EXPECT_NE(r.out.find("ILAC-G8:09/2019"), std::string::npos);
    EXPECT_NE(r.out.find("demo specification sheet DS-60"), std::string::npos) << r.out;
    EXPECT_NE(r.out.find("meters' specifications"), std::string::npos) << r.out;
    const auto j = nlohmann::json::parse(runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--json"}).out);
    EXPECT_TRUE(j["analysis"]["regulation_percent"]["expanded_uncertainty"].is_number());
    EXPECT_TRUE(j["verdict"]["outcome"].is_string());
}

TEST(FitCommand, JsonCarriesResultsWithBudgetsVerdictAndScreen)
{
    const auto r = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--json", "--points"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    for (const char *result : {"series_resistance_ohm", "no_load_voltage_v", "regulation_percent", "full_load_voltage_v",
                               "copper_loss_w"}) {
        const auto &v = j["results"][result];
        for (const char *key : {"value", "standard_uncertainty", "effective_dof", "coverage_factor",
                                "expanded_uncertainty", "budget"})
            EXPECT_TRUE(v.contains(key)) << result << "." << key;
        ASSERT_TRUE(v["budget"].is_array()) << result;
        ASSERT_FALSE(v["budget"].empty()) << result;
        for (const auto &row : v["budget"])
            for (const char *key : {"source", "type", "distribution", "standard_uncertainty", "sensitivity", "contribution"})
                EXPECT_TRUE(row.contains(key)) << result << " budget " << key;
        EXPECT_NEAR(v["expanded_uncertainty"].get<double>(),
                    v["coverage_factor"].get<double>() * v["standard_uncertainty"].get<double>(), 1e-12);
    }
    // The 95 % interval of R is R ± U of its budget: one coverage everywhere.
    const double rValue = j["results"]["series_resistance_ohm"]["value"].get<double>();
    const double rU = j["results"]["series_resistance_ohm"]["expanded_uncertainty"].get<double>();
    EXPECT_NEAR(j["series_resistance_ci95_ohm"][0].get<double>(), rValue - rU, 1e-12);
    EXPECT_NEAR(j["series_resistance_ci95_ohm"][1].get<double>(), rValue + rU, 1e-12);
    const std::string outcome = j["verdict"]["outcome"];
    EXPECT_TRUE(outcome == "pass" || outcome == "fail" || outcome == "conditional-pass" || outcome == "conditional-fail"
                || outcome == "not-judged") << outcome;
    EXPECT_TRUE(j["verdict"]["conformance_probability"].is_number());
    EXPECT_EQ(j["verdict"]["limits"].size(), 4u); // the demo specification's four limits
    EXPECT_TRUE(j["outlier_screening"]["screened"].get<bool>());
    EXPECT_TRUE(j["outlier_screening"]["critical_value"].is_number());
    EXPECT_FALSE(j["outlier_screening"]["rule"].get<std::string>().empty());
    ASSERT_EQ(j["points"].size(), 9u);
    for (const auto &point : j["points"])
        EXPECT_TRUE(point["outlier"].is_boolean());
}

TEST(FitCommand, JsonHoldsThePerReadingArrayOnlyWithPoints)
{
    // A reading whose voltage is 0.3 V off the line: the screen flags it (row 4, line 6).
    const auto path = writeTemp("one-off.csv", "current_a,voltage_v\n0,19.60\n0.4,19.41\n0.8,19.21\n1.2,19.02\n"
                                                "1.6,19.13\n2.0,18.64\n2.4,18.45\n2.8,18.26\n3.2,18.07\n");
    const auto brief = runProgram(cli, {"fit", path, "--json"});
    const auto full = runProgram(cli, {"fit", path, "--json", "--points"});
    ASSERT_EQ(brief.exitCode, 0) << brief.err;
    ASSERT_EQ(full.exitCode, 0) << full.err;
    nlohmann::json b = nlohmann::json::parse(brief.out);
    nlohmann::json f = nlohmann::json::parse(full.out);
    EXPECT_FALSE(b.contains("points"));
    ASSERT_EQ(f["points"].size(), 9u);
    // The outliers are there either way, as row indices; they are the points flagged.
    ASSERT_EQ(b["outliers"], nlohmann::json::array({4}));
    EXPECT_TRUE(f["points"][4]["outlier"].get<bool>());
    EXPECT_EQ(f["points"][4]["line"], 6);
    // Everything else is the same object.
    f.erase("points");
    EXPECT_EQ(b, f);
    const auto alone = runProgram(cli, {"fit", path, "--points"});
    EXPECT_EQ(alone.exitCode, 2);
    EXPECT_NE(alone.err.find("--points needs --json"), std::string::npos) << alone.err;
}

TEST(FitCommand, RulesLimitsAndTheBudgetTable)
{
    const auto budget = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--budget"});
    ASSERT_EQ(budget.exitCode, 0) << budget.err;
    for (const char *text : {"Uncertainty budgets", "voltmeter gain", "ammeter offset", "contribution", "Welch"})
        EXPECT_NE(budget.out.find(text), std::string::npos) << text << "\n" << budget.out;
    // The nameplate's regulation as the limit only when asked, and then labelled so.
    const auto nameplate = nlohmann::json::parse(
        runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--json", "--regulation-limit", "nameplate"}).out);
    EXPECT_NE(nameplate["verdict"]["limits_source"].get<std::string>().find("nameplate's own regulation"),
              std::string::npos);
    for (const char *rule : {"simple", "guarded", "non-binary"}) {
        const auto j = nlohmann::json::parse(
            runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--json", "--rule", rule}).out);
        EXPECT_EQ(j["verdict"]["rule"], rule);
    }
    const auto bad = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--rule", "strict"});
    EXPECT_EQ(bad.exitCode, 2);
    EXPECT_NE(bad.err.find("simple, guarded or non-binary"), std::string::npos) << bad.err;
    const auto badLimit = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--regulation-limit", "plate"});
    EXPECT_EQ(badLimit.exitCode, 2);
    EXPECT_NE(badLimit.err.find("nameplate"), std::string::npos) << badLimit.err;
    // No setup: no limit to judge against, and the options that need one are refused.
    EXPECT_EQ(runProgram(cli, {"fit", demoReadings, "--rule", "simple"}).exitCode, 2);
    const auto alone = nlohmann::json::parse(runProgram(cli, {"fit", demoReadings, "--json"}).out);
    EXPECT_FALSE(alone.contains("verdict"));
    EXPECT_NE(alone["uncertainty_basis"].get<std::string>().find("not recorded"), std::string::npos);
}

TEST(FitCommand, CsvErrorsNameLineAndColumnAndExitTwo)
{
    const auto path = writeTemp("bad.csv", "current_a,voltage_v\n0,19.6\n1,abc\n");
    const auto r = runProgram(cli, {"fit", path});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("line 3, column voltage_v"), std::string::npos) << r.err;
    EXPECT_TRUE(r.out.empty());
}

TEST(FitCommand, WeightedMethodsSayWhichColumnIsMissing)
{
    const auto path = writeTemp("plain.csv", "current_a,voltage_v\n0,19.6\n1,19.1\n2,18.7\n");
    const auto wls = runProgram(cli, {"fit", path, "--method", "wls"});
    EXPECT_EQ(wls.exitCode, 2);
    EXPECT_NE(wls.err.find("u_voltage_v"), std::string::npos) << wls.err;
    const auto york = runProgram(cli, {"fit", path, "--method", "york"});
    EXPECT_EQ(york.exitCode, 2);
    EXPECT_NE(york.err.find("u_current_a"), std::string::npos) << york.err;
}

TEST(FitCommand, UsageAndDegenerateDataExitTwo)
{
    EXPECT_EQ(runProgram(cli, {"fit"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"fit", demoReadings, "--method", "odr"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"fit", demoReadings, "--frobnicate"}).exitCode, 2);
    EXPECT_EQ(runProgram(cli, {"fit", "/nonexistent/data.csv"}).exitCode, 2);
    const auto same = writeTemp("same.csv", "current_a,voltage_v\n1,19.6\n1,19.1\n1,18.7\n");
    const auto r = runProgram(cli, {"fit", same});
    EXPECT_EQ(r.exitCode, 2);
    EXPECT_NE(r.err.find("degenerate-current"), std::string::npos) << r.err;
    const auto zeroU = writeTemp("zero-u.csv", "current_a,voltage_v,u_voltage_v\n0,19.6,0.01\n1,19.1,0\n");
    EXPECT_EQ(runProgram(cli, {"fit", zeroU, "--method", "wls"}).exitCode, 2);
}

TEST(FitCommand, TwoPointsGiveNullUncertaintiesNotNaN)
{
    const auto path = writeTemp("two.csv", "current_a,voltage_v\n0,19.6\n2,18.6\n");
    const auto r = runProgram(cli, {"fit", path, "--json"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    EXPECT_DOUBLE_EQ(j["series_resistance_ohm"].get<double>(), 0.5);
    EXPECT_TRUE(j["series_resistance_se_ohm"].is_null());
    EXPECT_TRUE(j["curvature_p"].is_null());
    EXPECT_EQ(r.out.find("nan"), std::string::npos);
}

TEST(FitCommand, FitsASessionHonouringExclusionsAndItsNameplate)
{
    const auto dir = std::filesystem::temp_directory_path() / "sagline-fit-test-session";
    std::filesystem::remove_all(dir);
    std::filesystem::create_directories(dir);
    const std::string session = (dir / "unit.sagline").string();
    const auto imported = runProgram(cli, {"import", demoReadings, "--setup", demoSetup, "-o", session});
    ASSERT_EQ(imported.exitCode, 0) << imported.err;
    {
        auto store = sagline::SessionStore::openForWriting(session);
        ASSERT_TRUE(store.ok()) << store.message;
        auto readings = store.value->readings();
        ASSERT_TRUE(readings.ok());
        ASSERT_EQ(readings.value.size(), 9u);
        ASSERT_TRUE(store.value->excludeReading(readings.value[4].id, "lead slipped", "test").ok());
    }
    const auto r = runProgram(cli, {"fit", session, "--json", "--points"});
    ASSERT_EQ(r.exitCode, 0) << r.err;
    const auto j = nlohmann::json::parse(r.out);
    for (const char *key : designKeys)
        EXPECT_TRUE(j.contains(key)) << key;
    EXPECT_EQ(j["n"], 8);
    EXPECT_FALSE(j["points"][4]["used"].get<bool>());
    EXPECT_TRUE(j["analysis"]["regulation_percent"]["value"].is_number()); // from the session's nameplate
    std::filesystem::remove_all(dir);
}

TEST(FitCommand, RunPrintsWhatFitPrintsForItsSession)
{
    // The summary at the end of a sweep is the one `fit SESSION` gives for the file it wrote:
    // the meters' specifications recorded from the instruments are in both budgets, and the
    // verdict against the setup's specification is there too.
    const auto session = std::filesystem::temp_directory_path() / "sagline-fit-test-run-same.sagline";
    std::filesystem::remove(session);
    const auto run = runProgram(cli, {"run", demoSetup, "--sim", "--seed", "7", "-o", session.string()});
    ASSERT_EQ(run.exitCode, 0) << run.err;
    const auto fit = runProgram(cli, {"fit", session.string()});
    ASSERT_EQ(fit.exitCode, 0) << fit.err;
    const auto line = [](const std::string &text, const std::string &label) {
        const auto at = text.find(label);
        return at == std::string::npos ? std::string("(missing: " + label + ")") : text.substr(at, text.find('\n', at) - at);
    };
    for (const char *label : {"Uncertainties:", "Series resistance R", "No-load voltage V0", "Regulation", "Verdict"})
        EXPECT_EQ(line(run.out, label), line(fit.out, label)) << label;
    EXPECT_EQ(run.out.find("were not recorded"), std::string::npos) << run.out;
    std::filesystem::remove(session);
}

TEST(FitCommand, ACommaNumberIsRefusedWithItsLineUnlessTheMarkIsStated)
{
    // "1,250": a thousands separator or a decimal comma? Refused (exit 2) naming the line.
    const std::string ambiguous = writeTemp("ambiguous.csv", "current_a;voltage_v\n0;26\n1,250;24\n2;23\n");
    const auto refused = runProgram(cli, {"fit", ambiguous});
    EXPECT_EQ(refused.exitCode, 2) << refused.out;
    EXPECT_NE(refused.err.find("line 3, column current_a"), std::string::npos) << refused.err;
    EXPECT_NE(refused.err.find("# decimal_mark: ,"), std::string::npos) << refused.err;
    // Stated, the same file is read with decimal commas: 1,250 A is 1.25 A.
    const std::string stated =
        writeTemp("stated.csv", "# decimal_mark: ,\ncurrent_a;voltage_v\n0;26\n1,250;24,75\n2,5;23,5\n");
    const auto read = runProgram(cli, {"fit", stated, "--json"});
    ASSERT_EQ(read.exitCode, 0) << read.err;
    const auto j = nlohmann::json::parse(read.out);
    EXPECT_NEAR(j.at("series_resistance_ohm").get<double>(), 1.0, 1e-9);
    EXPECT_NEAR(j.at("no_load_voltage_v").get<double>(), 26.0, 1e-9);
}

TEST(FitCommand, RunNamesThePrimaryAnalysersGainsOnlyWhenOneTookPart)
{
    // `run --sim` prints the simulator's own values to check a fit against; the primary
    // analyser's gain errors belong there only when the sweep read one (--sim-primary-meter).
    const auto session = std::filesystem::temp_directory_path() / "sagline-fit-test-run-analyser.sagline";
    for (const bool analyser : {false, true}) {
        std::filesystem::remove(session);
        std::vector<std::string> args{"run", demoSetup, "--sim", "--seed", "3", "-o", session.string()};
        if (analyser)
            args.push_back("--sim-primary-meter");
        const auto run = runProgram(cli, args);
        ASSERT_EQ(run.exitCode, 0) << run.err;
        EXPECT_NE(run.out.find("simulated primary side:"), std::string::npos) << run.out;
        EXPECT_EQ(run.out.find("primary analyser gain errors") != std::string::npos, analyser) << run.out;
    }
    std::filesystem::remove(session);
}

TEST(FitCommand, LimitsReadInTheValuesUnitsAndNotJudgedSaysNoTemperature)
{
    // The demo specification's 0.6 Ω resistance limit prints in the prefix of the value beside it.
    const auto judged = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup});
    ASSERT_EQ(judged.exitCode, 0) << judged.err;
    EXPECT_NE(judged.out.find("within the upper limit 600.0 mΩ"), std::string::npos) << judged.out;
    EXPECT_EQ(judged.out.find("0.6000 Ω"), std::string::npos) << judged.out;
    EXPECT_NE(judged.out.find("(judged as measured)"), std::string::npos) << judged.out;

    // A setup with no specification: NOT JUDGED, and nothing about where it was judged.
    std::ifstream in(demoSetup);
    auto setup = nlohmann::json::parse(in);
    setup.erase("specification");
    const auto bare = writeTemp("no-specification.json", setup.dump());
    const auto notJudged = runProgram(cli, {"fit", demoReadings, "--setup", bare});
    ASSERT_EQ(notJudged.exitCode, 0) << notJudged.err;
    EXPECT_NE(notJudged.out.find("NOT JUDGED"), std::string::npos) << notJudged.out;
    EXPECT_EQ(notJudged.out.find("NOT JUDGED ("), std::string::npos) << notJudged.out;
    EXPECT_EQ(notJudged.out.find("judged as measured"), std::string::npos) << notJudged.out;

    // Limits outside (0, 100] % are refused naming the option and the rule.
    for (const char *limit : {"-3", "0", "nan", "150", "abc"}) {
        const auto r = runProgram(cli, {"fit", demoReadings, "--setup", demoSetup, "--regulation-limit", limit});
        EXPECT_EQ(r.exitCode, 2) << limit;
        EXPECT_NE(r.err.find("--regulation-limit"), std::string::npos) << r.err;
        EXPECT_NE(r.err.find("above 0 and at most 100"), std::string::npos) << r.err;
    }
}
