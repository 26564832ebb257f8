// The PDF report: written for A4 and Letter, every section present, the session's values in
// it, pages numbered "X of Y", and not a single coloured pixel (it must print in black and
// white). The pages are rendered with pdftoppm / read with pdftotext (Debian's poppler-utils).
// SAGLINE_REPORT_DEMO_DIR, when set, keeps the demo session, PDF and PNG pages there.
#include "BudgetTable.h"
#include "ReportWriter.h"
#include "SessionStore.h"
#include "SessionSummary.h"

#include <gtest/gtest.h>

#include <QImage>
#include <QProcess>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <random>

using namespace sagline;
namespace fs = std::filesystem;

namespace {

// An invented demo session (a 60 VA, 230 V / 18 V unit; not a real product): eight steps,
// one reading excluded with a reason, one later restored, a note, a safety stop, a sign-off.
std::string makeDemoSession(const fs::path &folder)
{
    const fs::path path = folder / "demo-report.sagline";
    fs::remove(path);
    NewSession session;
    session.setupJson = R"({"nameplate":{"rated_power_va":60,"primary_voltage_v":230,"frequency_hz":50,)"
                        R"("secondary_voltage_v":18,"secondary_no_load_voltage_v":19.6,"regulation_percent":null,)"
                        R"("construction":"laminated","winding_material":"copper"},)"
                        R"("bench":{"steps":8,"top_fraction":1.0,"overload_factor":1.1,"allow_overload":false,)"
                        R"("rheostat":{"total_resistance_ohm":50,"power_rating_w":600},)"
                        R"("fuse":{"rating_a":0.5,"type":"time-lag"},"dwell_s":5},)"
                        R"("meters":{"voltmeter":{"gain_percent_of_reading":0.05,"offset_v":"0.3 mV","resolution_v":"0.1 mV"},)"
                        R"("ammeter":{"gain_percent_of_reading":0.2,"offset_a":"0.5 mA","resolution_a":"0.1 mA"}},)"
                        R"("specification":{"regulation_max_percent":10,"source":"customer drawing D-17, a scenario of our own"}})";
    session.planJson = R"({"rated_secondary_current_a":3.3333,"series_resistance_ohm":0.48,"turns_ratio":11.73,)"
                       R"("recommended_fuse":{"rating_a":0.5,"type":"time-lag","factor":1.6},"warnings":[],"steps":[)"
                       R"({"index":0,"current_a":0,"predicted_voltage_v":19.6,"load_resistance_ohm":null,"output_va":0,"fuse_outlook":"holds"},)"
                       R"({"index":4,"current_a":1.6667,"predicted_voltage_v":18.8,"load_resistance_ohm":11.28,"output_va":31.3,"fuse_outlook":"holds"},)"
                       R"({"index":8,"current_a":3.3333,"predicted_voltage_v":18.0,"load_resistance_ohm":5.4,"output_va":60,"fuse_outlook":"holds"}]})";
    session.operatorName = "R. Okafor";
    session.unitSerial = "T60-0421";
    session.ambientTemperatureC = 22.5;
    session.windingTemperatureC = 23.0;
    session.softwareVersion = "sagline test";
    auto created = SessionStore::create(path.string(), session);
    EXPECT_TRUE(created.ok()) << created.message;
    SessionStore &store = *created.value;
    store.recordInstrument("voltmeter", "DEMO INSTRUMENTS,DM-6,SN10231,1.04", "±(0.05 % of reading + 3 counts), resolution 0.1 mV");
    store.recordInstrument("ammeter", "DEMO INSTRUMENTS,DM-6,SN10232,1.04", "±(0.2 % of reading + 5 counts), resolution 0.1 mA");
    const double noise[] = {0.004, -0.006, 0.003, 0.0, -0.004, 0.005, -0.002, 0.006, -0.003};
    std::vector<std::int64_t> ids;
    for (int k = 0; k <= 8; ++k) {
        Reading reading;
        reading.step = k;
        reading.currentA = k * 3.3333 / 8.0;
        reading.voltageV = 19.58 - 0.479 * reading.currentA + noise[k] + (k == 5 ? 0.09 : 0.0);
        reading.uCurrentA = 0.0004 + 0.0012 * reading.currentA;
        reading.uVoltageV = 0.006;
        reading.timeUtc = "2026-12-02T09:1" + std::to_string(k) + ":05.000Z";
        reading.rawText = "+1.9E+01;+1.6E+00";
        if (k == 5)
            reading.flags = flagUnstable;
        ids.push_back(store.appendReading(reading).value);
    }
    store.excludeReading(ids[5], "voltage still drifting after the dwell (load resistor warming)", "R. Okafor");
    store.excludeReading(ids[2], "probe slipped", "R. Okafor");
    store.restoreReading(ids[2], "photo shows the probe was seated; reading is good", "M. Lindqvist");
    store.addNote("R. Okafor", "Unit warm to the touch after step 8; no smell, no noise.");
    SafetyStopRecord stop;
    stop.step = 9;
    stop.rule = "rated-va";
    stop.message = "extra step above rated load refused: 66.2 VA over the 66 VA limit";
    stop.measured = 66.2;
    stop.limitValue = 66.0;
    store.recordSafetyStop(stop);
    store.addSignOff("M. Lindqvist", ReviewDecision::Accepted, "checked against the plan; exclusion of step 5 agreed");
    return path.string();
}

int countPdfPages(const QString &pdf)
{
    QProcess info;
    info.start(QStringLiteral("pdfinfo"), {pdf});
    info.waitForFinished(30000);
    const QString text = QString::fromUtf8(info.readAllStandardOutput());
    for (const QString &line : text.split('\n'))
        if (line.startsWith(QStringLiteral("Pages:")))
            return line.mid(6).trimmed().toInt();
    return -1;
}

QString pdfText(const QString &pdf)
{
    QProcess text;
    text.start(QStringLiteral("pdftotext"), {QStringLiteral("-layout"), pdf, QStringLiteral("-")});
    text.waitForFinished(30000);
    return QString::fromUtf8(text.readAllStandardOutput());
}

class ReportWriter : public ::testing::Test {
protected:
    void SetUp() override
    {
        if (const char *keep = std::getenv("SAGLINE_REPORT_DEMO_DIR")) {
            m_folder = keep;
            m_keep = true;
        } else {
            std::random_device seed;
            m_folder = fs::temp_directory_path() / ("sagline-report-" + std::to_string(seed()));
        }
        fs::create_directories(m_folder);
    }
    void TearDown() override
    {
        if (!m_keep)
            fs::remove_all(m_folder);
    }
    fs::path m_folder;
    bool m_keep = false;
};

} // namespace

TEST_F(ReportWriter, WritesEverySectionWithTheSessionsValues)
{
    const auto summary = loadSessionSummary(makeDemoSession(m_folder));
    ASSERT_TRUE(summary.ok()) << summary.message;
    ASSERT_TRUE(summary.value.fit.ok()) << summary.value.fit.message;
    ASSERT_TRUE(summary.value.verdict.has_value());
    const QString pdf = QString::fromStdString((m_folder / "demo-report-a4.pdf").string());
    ReportOptions options;
    options.producedBy = QStringLiteral("sagline test");
    options.generatedUtc = QStringLiteral("2026-12-02T12:00:00.000Z");
    ASSERT_EQ(writeSessionReport(summary.value, pdf, options), QString());

    const int pages = countPdfPages(pdf);
    ASSERT_GE(pages, 2);
    const QString text = pdfText(pdf);
    for (const char *expected : {"Transformer load test report", "T60-0421", "R. Okafor", "DEMO INSTRUMENTS,DM-6,SN10231",
                                 "Series resistance", "No-load voltage", "Regulation", "Copper loss", "R at 75 °C",
                                 "Verdict", "Decision rule:", "Nameplate and bench", "Readings",
                                 "excluded: voltage still drifting", "Exclusion history", "restored", "Safety stops",
                                 "66 VA limit", "Cautions", "mains voltage", "Tested by", "Reviewed by", "M. Lindqvist",
                                 "Uncertainty budget", "voltmeter gain", "ammeter gain", "Welch", "k = ",
                                 "Probability of conformity", "customer drawing D-17", "outlier screen"})
        EXPECT_TRUE(text.contains(QString::fromUtf8(expected))) << expected;
    EXPECT_TRUE(text.contains(QStringLiteral("page 1 of %1").arg(pages))) << "footer numbering";
    EXPECT_TRUE(text.contains(QStringLiteral("page %1 of %1").arg(pages)));
    // The fitted R appears as core formats it.
    const double r = summary.value.analysis->seriesResistanceOhm.value;
    EXPECT_TRUE(text.contains(QString::number(r * 1000.0, 'f', 0).left(2))) << r;
}

TEST_F(ReportWriter, PagesAreBlackAndWhiteOnly)
{
    const auto summary = loadSessionSummary(makeDemoSession(m_folder));
    ASSERT_TRUE(summary.ok()) << summary.message;
    const QString pdf = QString::fromStdString((m_folder / "demo-report-bw.pdf").string());
    ReportOptions options;
    options.generatedUtc = QStringLiteral("2026-12-02T12:00:00.000Z");
    ASSERT_EQ(writeSessionReport(summary.value, pdf, options), QString());
    const QString prefix = QString::fromStdString((m_folder / "demo-report-page").string());
    ASSERT_EQ(QProcess::execute(QStringLiteral("pdftoppm"), {QStringLiteral("-png"), QStringLiteral("-r"), QStringLiteral("80"), pdf, prefix}), 0);
    int pagesChecked = 0;
    for (const auto &entry : fs::directory_iterator(m_folder)) {
        const std::string name = entry.path().filename().string();
        if (name.rfind("demo-report-page", 0) != 0 || entry.path().extension() != ".png")
            continue;
        const QImage image(QString::fromStdString(entry.path().string()));
        ASSERT_FALSE(image.isNull()) << name;
        int dark = 0, coloured = 0;
        for (int y = 0; y < image.height(); ++y)
            for (int x = 0; x < image.width(); ++x) {
                const QRgb pixel = image.pixel(x, y);
                if (std::abs(qRed(pixel) - qGreen(pixel)) > 8 || std::abs(qGreen(pixel) - qBlue(pixel)) > 8)
                    ++coloured;
                if (qGray(pixel) < 128)
                    ++dark;
            }
        EXPECT_EQ(coloured, 0) << name << " has coloured pixels";
        EXPECT_GT(dark, 500) << name << " looks blank";
        ++pagesChecked;
    }
    EXPECT_GE(pagesChecked, 2);
}

TEST_F(ReportWriter, LetterPagesAreLetterSized)
{
    const auto summary = loadSessionSummary(makeDemoSession(m_folder));
    ASSERT_TRUE(summary.ok()) << summary.message;
    const QString pdf = QString::fromStdString((m_folder / "demo-report-letter.pdf").string());
    ReportOptions options;
    options.pageSize = QPageSize::Letter;
    ASSERT_EQ(writeSessionReport(summary.value, pdf, options), QString());
    QProcess info;
    info.start(QStringLiteral("pdfinfo"), {pdf});
    info.waitForFinished(30000);
    EXPECT_TRUE(QString::fromUtf8(info.readAllStandardOutput()).contains(QStringLiteral("612 x 792 pts")));
}

TEST_F(ReportWriter, UnwritableFolderIsAClearError)
{
    const auto summary = loadSessionSummary(makeDemoSession(m_folder));
    ASSERT_TRUE(summary.ok());
    const QString problem = writeSessionReport(summary.value, QStringLiteral("/nonexistent-folder/report.pdf"), {});
    EXPECT_TRUE(problem.contains(QStringLiteral("cannot write"))) << problem.toStdString();
}

TEST_F(ReportWriter, EachBudgetTableStaysOnOnePage)
{
    // The table's header row repeats after a page break, so a split table shows its header twice:
    // "Contribution" (a budget-only column heading) is printed once per result and no more.
    const auto summary = loadSessionSummary(makeDemoSession(m_folder));
    ASSERT_TRUE(summary.ok()) << summary.message;
    ASSERT_TRUE(summary.value.analysis.has_value());
    const auto tables = budgetTables(*summary.value.analysis);
    ASSERT_GE(tables.size(), 4u);
    for (const auto page : {QPageSize::A4, QPageSize::Letter}) {
        const QString pdf = QString::fromStdString((m_folder / ("budget-" + std::to_string(page) + ".pdf")).string());
        ReportOptions options;
        options.pageSize = page;
        ASSERT_EQ(writeSessionReport(summary.value, pdf, options), QString());
        const QString text = pdfText(pdf);
        EXPECT_EQ(text.count(QStringLiteral("Contribution")), static_cast<int>(tables.size())) << page;
        // Each result's title is on the page its table starts on: the title's page holds the header after it.
        for (const QString &pageText : text.split(QLatin1Char('\f'))) {
            const int titles = static_cast<int>(std::count_if(tables.begin(), tables.end(), [&](const BudgetTable &t) {
                return pageText.contains(QString::fromStdString(t.title) + QStringLiteral(":"));
            }));
            EXPECT_EQ(pageText.count(QStringLiteral("Contribution")), titles) << page;
        }
    }
}
