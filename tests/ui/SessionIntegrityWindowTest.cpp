// Session integrity through the window with real session files: sessions opened in turn show
// their own file alone (item 1), a signed session is read-only until reopened with a reason
// (item 3), a typed value far from the expectation asks first and a step can be retaken
// (item 5), the verdict is provisional until every step (item 6), and an interrupted session
// resumes at its next step (item 7). With SAGLINE_SHOTS_DIR set, the key moments are saved as
// PNG in SAGLINE_SHOTS_DIR/integrity/ at 1366×768 and 1600×1000.
#include "EventLoopWait.h"
#include "SessionFiles.h"
#include "ShotsAtWorkingSizes.h"
#include "UiTestSupport.h"

#include "CautionStrip.h"
#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ReadingsTableModel.h"
#include "ResidualChart.h"
#include "ResultsPanel.h"
#include "SessionBand.h"
#include "SessionSeal.h"
#include "SessionStore.h"
#include "SetupJson.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "TemperatureDialog.h"
#include "VoltageCurrentChart.h"

#include <gtest/gtest.h>

#include <cmath>

#include <QAction>
#include <QApplication>
#include <QComboBox>
#include <QDir>
#include <QFile>
#include <QFileInfo>
#include <QLineEdit>
#include <QMessageBox>
#include <QPainter>
#include <QPushButton>
#include <QTableView>

using namespace sagline;
using namespace sagline::test;

namespace {

// With SAGLINE_SHOTS_DIR set, saves the window (and a dialog drawn over it, if given) into
// SAGLINE_SHOTS_DIR/integrity/ at the two working sizes; with a dialog the picture is composed,
// as a modal box cannot be grabbed with the window on the offscreen platform.
void shoot(MainWindow &window, const QString &name, QWidget *dialog = nullptr)
{
    const QString folder = shotsFolder(QStringLiteral("integrity"));
    if (folder.isEmpty())
        return;
    if (!dialog) {
        EXPECT_TRUE(saveAtWorkingSizes(window, folder, {{&window, name}}, [&] {
            window.flushCharts();
            for (int pass = 0; pass < 5; ++pass) // word-wrapped labels settle over a few layout passes
                QTest::qWait(20);
        }));
        return;
    }
    const QSize original = window.size();
    for (const QSize size : {QSize(1366, 768), QSize(1600, 1000)}) {
        window.resize(size);
        window.flushCharts();
        for (int pass = 0; pass < 5; ++pass)
            QTest::qWait(20);
        QPixmap picture = window.grab();
        const QPixmap box = dialog->grab();
        QPainter painter(&picture);
        painter.drawPixmap((picture.width() - box.width()) / 2, (picture.height() - box.height()) / 3, box);
        painter.end();
        EXPECT_TRUE(picture.save(QDir(folder).filePath(QStringLiteral("%1-%2x%3.png").arg(name).arg(size.width()).arg(size.height()))));
    }
    window.resize(original);
}

double fieldValue(MainWindow &window, const char *field, Unit unit)
{
    const auto parsed = parseQuantity(window.setupForm()->quantityField(QLatin1String(field))->text().toStdString(), unit);
    return parsed.ok ? parsed.value : std::numeric_limits<double>::quiet_NaN();
}

// The fuse the form shows: "none", or its rating in A and its type ("time-lag", "quick-acting").
std::string fuseShown(MainWindow &window)
{
    const QuantityField *rating = window.setupForm()->quantityField(QStringLiteral("bench.fuse.rating_a"));
    if (rating->isBlank())
        return "none";
    QString type;
    for (const QComboBox *combo : window.setupForm()->findChildren<QComboBox *>())
        if (combo->accessibleName() == QLatin1String("bench.fuse.type"))
            type = combo->currentData().toString();
    return QString::number(fieldValue(window, "bench.fuse.rating_a", Unit::Ampere)).toStdString() + " A " + type.toStdString();
}

std::string fuseOf(const Setup &setup)
{
    return setup.bench.fuse ? QString::number(setup.bench.fuse->ratingA).toStdString() + " A " + toString(setup.bench.fuse->type)
                            : "none";
}

// Every field and label the window shows for a session, checked against what its file holds.
void expectShowsOnly(MainWindow &window, const SessionFile &file, QStringList *checked)
{
    SCOPED_TRACE(file.path.toStdString());
    const Nameplate &plate = file.setup.nameplate;
    EXPECT_DOUBLE_EQ(fieldValue(window, "nameplate.rated_power_va", Unit::VoltAmpere), plate.ratedPowerVa);
    EXPECT_DOUBLE_EQ(fieldValue(window, "nameplate.primary_voltage_v", Unit::Volt), plate.primaryVoltageV);
    EXPECT_DOUBLE_EQ(fieldValue(window, "nameplate.frequency_hz", Unit::Hertz), plate.frequencyHz);
    EXPECT_DOUBLE_EQ(fieldValue(window, "nameplate.secondary_voltage_v", Unit::Volt), plate.secondaryVoltageV);
    EXPECT_DOUBLE_EQ(fieldValue(window, "nameplate.secondary_no_load_voltage_v", Unit::Volt), *plate.secondaryNoLoadVoltageV);
    EXPECT_DOUBLE_EQ(fieldValue(window, "bench.steps", Unit::None), file.setup.bench.steps);
    EXPECT_DOUBLE_EQ(fieldValue(window, "bench.overload_factor", Unit::None), file.setup.bench.overloadFactor);
    EXPECT_EQ(fuseShown(window), fuseOf(file.setup));
    const SessionDetails details = window.setupForm()->sessionDetails();
    EXPECT_EQ(details.operatorName.toStdString(), file.operatorName);
    EXPECT_EQ(details.unitSerial.toStdString(), file.serial);
    EXPECT_DOUBLE_EQ(fieldValue(window, "session.ambient_temperature_c", Unit::Celsius), file.ambientC);
    EXPECT_DOUBLE_EQ(fieldValue(window, "session.winding_temperature_c", Unit::Celsius), file.windingC);
    ASSERT_TRUE(window.workspace()->plan());
    EXPECT_EQ(static_cast<int>(window.workspace()->plan()->steps.size()), file.planned);
    EXPECT_EQ(window.planPanel()->table()->model()->rowCount(), file.planned);
    EXPECT_FALSE(window.planPanel()->acceptButton()->isEnabled());
    for (const QAction *action : window.changeActions()) // exclude, restore, note, retake
        EXPECT_EQ(action->isEnabled(), !file.signedOff) << action->text().toStdString();
    EXPECT_EQ(window.readingsModel()->rowCount(), file.readings);
    int excludedRows = 0;
    for (int row = 0; row < window.readingsModel()->rowCount(); ++row)
        excludedRows += window.readingsModel()->reading(row).excluded ? 1 : 0;
    EXPECT_EQ(excludedRows, file.excluded);
    EXPECT_EQ(window.pointsStatusText(), QStringLiteral("%1 point(s) recorded").arg(file.readings));
    EXPECT_EQ(window.caution()->isAlarmShown(), file.stopped) << window.caution()->alarmText().toStdString();
    const bool typedIn = file.serial == "X-60";
    EXPECT_EQ(window.instrumentsPanel()->choice().source, typedIn ? ReadingSource::TypedIn : ReadingSource::VirtualBench);
    EXPECT_TRUE(window.instrumentsPanel()->statusText().contains(typedIn ? "no instruments recorded" : "Sagline Virtual Bench"))
        << window.instrumentsPanel()->statusText().toStdString();
    EXPECT_FALSE(window.sourceStatusText().contains("link")) << window.sourceStatusText().toStdString();
    EXPECT_TRUE(window.windowTitle().contains(QFileInfo(file.path).fileName())) << window.windowTitle().toStdString();
    const QString verdict = window.results()->verdictText();
    const QString band = window.sessionBand()->text();
    const QString header = window.nextStep()->instructionText();
    if (file.stopped) {
        EXPECT_TRUE(verdict.contains("Incomplete (5 of 11 steps; safety stop at step 5 (output-va)): no verdict"))
            << verdict.toStdString();
        EXPECT_TRUE(band.contains("Incomplete")) << band.toStdString();
        EXPECT_TRUE(header.contains("Sweep ended: incomplete")) << header.toStdString();
    } else if (typedIn) {
        EXPECT_TRUE(verdict.contains("Incomplete (4 of 9 steps; interrupted")) << verdict.toStdString();
        EXPECT_TRUE(band.contains("interrupted")) << band.toStdString();
        EXPECT_EQ(window.sessionBand()->resumeButton()->text(), QStringLiteral("Resume at step 4"));
    } else {
        EXPECT_FALSE(verdict.contains("ncomplete") || verdict.contains("rovisional")) << verdict.toStdString();
        EXPECT_TRUE(header.contains("Sweep complete")) << header.toStdString();
    }
    if (file.signedOff) {
        EXPECT_EQ(window.sessionBand()->kind(), SessionBand::Kind::Signed);
        EXPECT_TRUE(band.contains("Signed off by L. Lead on ")) << band.toStdString();
        EXPECT_TRUE(window.sessionBand()->reopenButton()->isVisibleTo(&window));
    } else if (!file.stopped && !typedIn) {
        EXPECT_EQ(window.sessionBand()->kind(), SessionBand::Kind::Hidden) << band.toStdString();
    }
    if (checked)
        *checked = {"rated power", "primary voltage", "frequency", "secondary full-load voltage", "secondary no-load voltage",
                    "steps", "hard-stop factor", "primary fuse and its type", "operator", "unit serial", "ambient temperature", "winding temperature", "plan steps",
                    "plan table rows", "Accept disabled", "exclude/restore/note/retake enabled only when not signed", "readings table rows", "excluded rows", "status bar points",
                    "safety-stop alarm", "instrument source", "instrument status", "status bar source (no stale link)",
                    "window title", "verdict", "session band", "next-step header", "Resume / Reopen offered"};
}

} // namespace

TEST(SessionIntegrityWindow, SessionsOpenedInTurnShowTheirOwnFileAlone)
{
    QTemporaryDir folder;
    const SessionFile files[] = {writeSession(folder.path(), SessionKind::Complete),
                                 writeSession(folder.path(), SessionKind::Crashed),
                                 writeSession(folder.path(), SessionKind::SafetyStopped),
                                 writeSession(folder.path(), SessionKind::Signed)};
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    // A live sweep first, so there is something stale to leave behind: the demo unit on the
    // virtual bench, ended by the operator.
    window->workspace()->setSimulatedTime(true);
    window->setupForm()->setSessionDetails({QStringLiteral("Live operator"), QStringLiteral("LIVE-1"), QStringLiteral("30 °C"), {}});
    window->instrumentsPanel()->setChoice({ReadingSource::VirtualBench, {}, {}});
    window->planPanel()->acceptButton()->click();
    ASSERT_TRUE(waitUntil([&] { return window->workspace()->readings().size() >= 3; }, 20000));
    window->workspace()->stop();
    ASSERT_TRUE(waitUntil([&] { return !window->workspace()->isRunning(); }));

    QStringList checked;
    int opened = 0;
    for (const SessionFile &file : files) {
        ASSERT_TRUE(window->openSessionFile(file.path)) << window->lastMessage().toStdString();
        expectShowsOnly(*window, file, &checked);
        static const char *const kinds[] = {"complete", "crashed", "safety-stopped", "signed"};
        shoot(*window, QStringLiteral("opened-%1-%2").arg(opened + 1).arg(QLatin1String(kinds[opened])));
        ++opened;
    }
    // And back to the first, after the others.
    ASSERT_TRUE(window->openSessionFile(files[0].path));
    expectShowsOnly(*window, files[0], nullptr);

    // New starts from the program's defaults, never from the last session.
    QTest::keyClick(window.get(), Qt::Key_N, Qt::ControlModifier);
    EXPECT_FALSE(window->workspace()->store());
    // The demo setup (resources/demo-setup.json) is this window's default.
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.rated_power_va", Unit::VoltAmpere), 60.0);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.primary_voltage_v", Unit::Volt), 230.0);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.frequency_hz", Unit::Hertz), 50.0);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.secondary_voltage_v", Unit::Volt), 18.0);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.secondary_no_load_voltage_v", Unit::Volt), 19.6);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "bench.steps", Unit::None), 8.0);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "bench.overload_factor", Unit::None), 1.1);
    EXPECT_EQ(fuseShown(*window), "0.5 A time-lag");
    const SessionDetails fresh = window->setupForm()->sessionDetails();
    EXPECT_TRUE(fresh.operatorName.isEmpty());
    EXPECT_TRUE(fresh.unitSerial.isEmpty());
    EXPECT_TRUE(fresh.ambientTemperature.isEmpty());
    EXPECT_TRUE(fresh.windingTemperature.isEmpty());
    ASSERT_TRUE(window->workspace()->plan());
    EXPECT_DOUBLE_EQ(window->workspace()->plan()->overloadLimitVa, 60.0 * 1.1); // planned for the demo unit
    EXPECT_EQ(window->planPanel()->table()->model()->rowCount(), static_cast<int>(window->workspace()->plan()->steps.size()));
    EXPECT_FALSE(window->windowTitle().contains(".sagline")) << window->windowTitle().toStdString();
    EXPECT_FALSE(window->sourceStatusText().contains("link")) << window->sourceStatusText().toStdString();
    EXPECT_TRUE(window->nextStep()->instructionText().contains("Complete the setup")) << window->nextStep()->instructionText().toStdString();
    for (const QAction *action : window->changeActions())
        EXPECT_FALSE(action->isEnabled()) << action->text().toStdString();
    EXPECT_EQ(window->readingsModel()->rowCount(), 0);
    EXPECT_TRUE(window->pointsStatusText().isEmpty());
    EXPECT_FALSE(window->caution()->isAlarmShown());
    EXPECT_EQ(window->sessionBand()->kind(), SessionBand::Kind::Hidden);
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());
    EXPECT_TRUE(window->results()->verdictText().isEmpty());
    for (const char *field : {"nameplate.rated_power_va", "session.winding_temperature_c"}) { // editable, and looks it
        const QLineEdit *edit = window->setupForm()->quantityField(QLatin1String(field))->lineEdit();
        EXPECT_FALSE(edit->isReadOnly()) << field;
        EXPECT_NE(edit->palette().color(QPalette::Base), edit->palette().color(QPalette::Window)) << field;
    }
    shoot(*window, QStringLiteral("after-new"));

    // Or from a chosen setup file: opened over a signed session, it starts a new session from
    // that file alone, nothing of the session shown before.
    ASSERT_TRUE(window->openSessionFile(files[3].path));
    const QString setupPath = QDir(folder.path()).filePath(QStringLiteral("complete-unit-setup.json"));
    {
        QFile setupFile(setupPath);
        ASSERT_TRUE(setupFile.open(QIODevice::WriteOnly));
        setupFile.write(QByteArray::fromStdString(setupToJson(files[0].setup)));
    }
    ASSERT_EQ(window->openSetupFile(setupPath), QString());
    EXPECT_FALSE(window->workspace()->store());
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.rated_power_va", Unit::VoltAmpere), files[0].setup.nameplate.ratedPowerVa);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "nameplate.secondary_voltage_v", Unit::Volt), files[0].setup.nameplate.secondaryVoltageV);
    EXPECT_DOUBLE_EQ(fieldValue(*window, "bench.steps", Unit::None), files[0].setup.bench.steps);
    EXPECT_EQ(fuseShown(*window), fuseOf(files[0].setup));
    EXPECT_TRUE(window->setupForm()->sessionDetails().operatorName.isEmpty());
    EXPECT_TRUE(window->setupForm()->sessionDetails().unitSerial.isEmpty());
    EXPECT_TRUE(window->setupForm()->sessionDetails().ambientTemperature.isEmpty());
    EXPECT_EQ(window->readingsModel()->rowCount(), 0);
    EXPECT_EQ(window->sessionBand()->kind(), SessionBand::Kind::Hidden);
    EXPECT_TRUE(window->pointsStatusText().isEmpty());
    EXPECT_FALSE(window->setupForm()->quantityField(QStringLiteral("session.ambient_temperature_c"))->lineEdit()->isReadOnly());
    EXPECT_TRUE(window->planPanel()->acceptButton()->isEnabled());
    std::cout << "[ fields ] checked for each session: " << checked.join(", ").toStdString() << '\n';
}

TEST(SessionIntegrityWindow, SignedSessionIsReadOnlyUntilReopenedWithAReason)
{
    QTemporaryDir folder;
    const SessionFile file = writeSession(folder.path(), SessionKind::Signed);
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_TRUE(window->openSessionFile(file.path));
    ASSERT_EQ(window->sessionBand()->kind(), SessionBand::Kind::Signed);

    // Every editing action is disabled, saying why; the keyboard shortcut for excluding the
    // full-load point does nothing, and nothing is asked or changed.
    ASSERT_EQ(window->changeActions().size(), 5); // exclude, restore, note, retake, record a temperature
    for (const QAction *action : window->changeActions()) {
        EXPECT_FALSE(action->isEnabled()) << action->text().toStdString();
        EXPECT_TRUE(action->statusTip().contains("signed off")) << action->statusTip().toStdString();
    }
    EXPECT_FALSE(window->planPanel()->acceptButton()->isEnabled());
    // The session's details and the verdict settings show the file and take no edits.
    for (const char *field : {"session.ambient_temperature_c", "session.winding_temperature_c", "verdict.regulation_limit_percent",
                              "nameplate.rated_power_va"}) {
        const QLineEdit *edit = window->setupForm()->quantityField(QLatin1String(field))->lineEdit();
        EXPECT_TRUE(edit->isReadOnly()) << field;
        // and looks it: no white box to type into (ui/ReadOnlyLook)
        EXPECT_EQ(edit->palette().color(QPalette::Base), edit->palette().color(QPalette::Window)) << field;
    }
    EXPECT_FALSE(window->sessionBand()->resumeButton()->isVisibleTo(window.get()));
    const int last = window->readingsModel()->rowCount() - 1;
    const QString before = window->results()->value("regulation");
    QStringList asked;
    answerPrompts(*window, {QStringLiteral("clip fell off")}, false, &asked);
    window->readingsView()->selectRow(last);
    QTest::keyClick(window->readingsView(), Qt::Key_Delete, Qt::ControlModifier);
    QTest::keyClick(window->readingsView(), Qt::Key_R, Qt::ControlModifier);
    EXPECT_TRUE(asked.isEmpty()) << asked.join('|').toStdString();
    EXPECT_FALSE(window->workspace()->readings()[static_cast<std::size_t>(last)].excluded);
    EXPECT_FALSE(window->workspace()->isRunning());
    EXPECT_EQ(window->results()->value("regulation"), before);

    // Reopen: asks why, records who and why, and the sign-off is superseded.
    answerPrompts(*window, {QStringLiteral("full-load point misread"), QStringLiteral("clip fell off")}, false, &asked);
    QTest::mouseClick(window->sessionBand()->reopenButton(), Qt::LeftButton);
    ASSERT_EQ(window->sessionBand()->kind(), SessionBand::Kind::ChangedAfterSignOff) << window->lastMessage().toStdString();
    ASSERT_FALSE(asked.isEmpty());
    EXPECT_TRUE(asked.front().startsWith("Who is making changes")) << asked.join('|').toStdString(); // not the operator
    for (const QAction *action : window->changeActions())
        EXPECT_TRUE(action->isEnabled()) << action->text().toStdString();
    EXPECT_FALSE(window->setupForm()->quantityField(QStringLiteral("verdict.regulation_limit_percent"))->lineEdit()->isReadOnly());
    // The session's details stay the file's: an edit here would change the results on screen
    // (the winding temperature refers R) without being recorded.
    for (const char *field : {"session.ambient_temperature_c", "session.winding_temperature_c"})
        EXPECT_TRUE(window->setupForm()->quantityField(QLatin1String(field))->lineEdit()->isReadOnly()) << field;
    const QString band = window->sessionBand()->text();
    EXPECT_TRUE(band.contains("Changed after sign-off")) << band.toStdString();
    EXPECT_TRUE(band.contains("reopened by " + testPerson)) << band.toStdString();
    EXPECT_TRUE(band.contains("full-load point misread")) << band.toStdString();
    shoot(*window, QStringLiteral("reopened-session"));
    window->readingsView()->selectRow(last);
    QTest::keyClick(window->readingsView(), Qt::Key_Delete, Qt::ControlModifier);
    EXPECT_TRUE(window->workspace()->readings()[static_cast<std::size_t>(last)].excluded) << window->lastMessage().toStdString();

    // In the file: who excluded it is the person who said so, not the operator; the digest check
    // says changed after sign-off, not altered.
    auto stored = SessionStore::openForReview(file.path.toStdString());
    ASSERT_TRUE(stored.ok());
    const auto exclusions = stored.value->exclusions().value;
    ASSERT_EQ(exclusions.size(), 1u);
    EXPECT_EQ(exclusions[0].author, testPerson.toStdString());
    EXPECT_NE(exclusions[0].author, file.operatorName);
    EXPECT_FALSE(exclusions[0].osAccount.empty());
    const SealReport seal = checkSeal(*stored.value).value;
    EXPECT_EQ(seal.state, SealState::ChangedAfterSignOff);
    EXPECT_EQ(seal.reopen->actor.person, testPerson.toStdString());
}

TEST(SessionIntegrityWindow, TypedValueFarFromTheStepAsksFirstAndAStepCanBeRetaken)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    window->setupForm()->setSessionDetails({QStringLiteral("Student"), QStringLiteral("T-417"), QStringLiteral("21 °C"), {}});
    window->instrumentsPanel()->setChoice({ReadingSource::TypedIn, {}, {}});
    window->planPanel()->acceptButton()->click();
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    EXPECT_TRUE(window->lastMessage().startsWith("Sweep started: recording into T-417")) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    const auto type = [&](const QString &current, const QString &voltage) {
        typeInto(strip->currentField(), current);
        typeInto(strip->voltageField(), voltage);
        QTest::mouseClick(strip->recordButton(), Qt::LeftButton);
    };
    type("0 A", "19.62 V");
    ASSERT_EQ(workspace->readings().size(), 1u);

    // Step 1 expects about 417 mA: "417" is taken as 417 A, so the window asks before anything
    // is recorded, showing the expected value; No keeps nothing and says why under the field.
    QStringList asked;
    QMessageBox *shown = nullptr;
    window->setConfirmPrompt([&](const QString &title, const QString &text) {
        asked << text;
        if (!shown) { // what a person sees, for the screenshot
            shown = new QMessageBox(QMessageBox::Question, title, text, QMessageBox::Yes | QMessageBox::No, window.get());
            shown->setWindowModality(Qt::NonModal); // shown for the picture only; the prompt answers
            shown->show();
            QApplication::processEvents();
            shoot(*window, QStringLiteral("confirm-typed-value"), shown);
            shown->hide();
            QApplication::setActiveWindow(window.get()); // the menu shortcuts act on the active window
        }
        return false;
    });
    type("417", "19.4 V");
    ASSERT_EQ(asked.size(), 1);
    EXPECT_TRUE(asked[0].contains("The current 417.0 A is 1000 times the 416.7 mA step 1 expects (typed A for mA?)"))
        << asked[0].toStdString();
    EXPECT_EQ(workspace->readings().size(), 1u);
    EXPECT_TRUE(strip->currentField()->error().contains("typed A for mA?"));
    type("0.417 A", "19.41 V");
    ASSERT_EQ(workspace->readings().size(), 2u);

    // "194" for 19.4 V, confirmed by mistake: recorded, flagged, with what was expected; at
    // 0.833 A that is 162 VA, so the hard stop ends the sweep on it (as one slip did before).
    window->setConfirmPrompt([&](const QString &, const QString &text) {
        asked << text;
        return true;
    });
    type("0.833 A", "194 V");
    ASSERT_EQ(workspace->readings().size(), 3u);
    EXPECT_TRUE(asked.back().contains("slipped decimal point")) << asked.back().toStdString();
    EXPECT_TRUE(workspace->readings()[2].flags & flagConfirmed);
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }));
    EXPECT_TRUE(window->caution()->isAlarmShown());
    window->flushCharts();

    // Retake step 2: the sweep goes on from it; the new reading supersedes the slip, which
    // stays in the file.
    answerPrompts(*window, {QStringLiteral("decimal point slipped when typing")});
    window->readingsView()->selectRow(2);
    QTest::keyClick(window->readingsView(), Qt::Key_R, Qt::ControlModifier);
    EXPECT_TRUE(strip->instructionText().contains("Step 2")) << strip->instructionText().toStdString();
    EXPECT_TRUE(strip->instructionText().contains("retake")) << strip->instructionText().toStdString();
    EXPECT_EQ(window->lastMessage(), QStringLiteral("Retaking step 2: the new reading supersedes reading 3."));
    type("0.833 A", "19.24 V");
    ASSERT_EQ(workspace->readings().size(), 4u);
    EXPECT_TRUE(workspace->readings()[2].superseded);
    EXPECT_TRUE(window->readingsModel()->data(window->readingsModel()->index(2, ReadingsTableModel::Excluded))
                    .toString()
                    .contains("superseded: decimal point slipped when typing"));
    // The remarks in words, not the file's flag list ("manual|confirmed").
    const QString remarks = window->readingsModel()->data(window->readingsModel()->index(2, ReadingsTableModel::Remarks)).toString();
    EXPECT_TRUE(remarks.startsWith("manual, confirmed · superseded")) << remarks.toStdString();
    EXPECT_TRUE(strip->instructionText().contains("Step 3")) << strip->instructionText().toStdString();
    // The superseded 194 V point sets neither chart's scale.
    window->flushCharts();
    EXPECT_LT(window->chart()->voltageAxisRange().second, 30.0);
    EXPECT_LT(window->residualChart()->residualAxisRange().second, 1000.0); // mV
    shoot(*window, QStringLiteral("retaken-step"));

    auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
    ASSERT_TRUE(stored.ok());
    const auto retakes = stored.value->supersessions().value;
    ASSERT_EQ(retakes.size(), 1u);
    EXPECT_EQ(retakes[0].reason, "decimal point slipped when typing");
    EXPECT_EQ(retakes[0].actor.person, testPerson.toStdString());
    bool confirmedEvent = false;
    for (const SweepEventRecord &event : stored.value->sweepEvents().value)
        confirmedEvent |= event.kind == SweepEventKind::ValueConfirmed && event.detail.find("194") != std::string::npos;
    EXPECT_TRUE(confirmedEvent);
    delete shown;
}

TEST(SessionIntegrityWindow, VerdictIsProvisionalUntilEveryStepAndIncompleteAfterAStop)
{
    QTemporaryDir folder;
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    window->setupForm()->setSessionDetails({QStringLiteral("Student"), QStringLiteral("P-9"), QStringLiteral("21 °C"), {}});
    window->instrumentsPanel()->setChoice({ReadingSource::TypedIn, {}, {}});
    window->planPanel()->acceptButton()->click();
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning());
    const auto steps = workspace->plan()->steps;
    const auto typeStep = [&](std::size_t k) {
        const double v = steps[k].predictedVoltageV + (k % 2 ? 0.004 : -0.003);
        typeInto(window->nextStep()->currentField(), QString::number(steps[k].currentA, 'f', 4) + " A");
        typeInto(window->nextStep()->voltageField(), QString::number(v, 'f', 3) + " V");
        QTest::mouseClick(window->nextStep()->recordButton(), Qt::LeftButton);
    };
    for (std::size_t k = 0; k < 4; ++k)
        typeStep(k);
    ASSERT_EQ(workspace->readings().size(), 4u);
    window->flushCharts();
    const QString provisional = window->results()->verdictText();
    EXPECT_TRUE(provisional.contains("Provisional (4 of 9 steps)")) << provisional.toStdString();
    EXPECT_FALSE(provisional.contains("PASS") || provisional.contains("FAIL")) << provisional.toStdString();
    shoot(*window, QStringLiteral("provisional-verdict"));
    for (std::size_t k = 4; k < steps.size(); ++k)
        typeStep(k);
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }));
    window->flushCharts();
    const QString complete = window->results()->verdictText();
    EXPECT_FALSE(complete.contains("rovisional") || complete.contains("ncomplete")) << complete.toStdString();
    EXPECT_TRUE(complete.contains("PASS") || complete.contains("FAIL") || complete.contains("CANNOT DECIDE"))
        << complete.toStdString();

    // A second unit stopped by the operator after 3 steps: incomplete, never a pass.
    QTest::keyClick(window.get(), Qt::Key_N, Qt::ControlModifier);
    window->setupForm()->setSessionDetails({QStringLiteral("Student"), QStringLiteral("P-10"), QStringLiteral("21 °C"), {}});
    window->instrumentsPanel()->setChoice({ReadingSource::TypedIn, {}, {}});
    window->planPanel()->acceptButton()->click();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    for (std::size_t k = 0; k < 3; ++k)
        typeStep(k);
    QTest::mouseClick(window->nextStep()->stopButton(), Qt::LeftButton);
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }));
    window->flushCharts();
    const QString stopped = window->results()->verdictText();
    EXPECT_TRUE(stopped.contains("Incomplete (3 of 9 steps; stopped by the operator at step 3): no verdict"))
        << stopped.toStdString();
    EXPECT_EQ(window->sessionBand()->resumeButton()->text(), QStringLiteral("Resume at step 3"));
}

TEST(SessionIntegrityWindow, InterruptedSessionResumesAtItsNextStepWithTheLoadCheckedAgain)
{
    QTemporaryDir folder;
    const SessionFile file = writeSession(folder.path(), SessionKind::Crashed);
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_TRUE(window->openSessionFile(file.path));
    ASSERT_EQ(window->sessionBand()->kind(), SessionBand::Kind::Incomplete);
    QPushButton *resume = window->sessionBand()->resumeButton();
    ASSERT_TRUE(resume->isVisibleTo(window.get()));
    QStringList asked;
    answerPrompts(*window, {}, false, &asked);
    QTest::mouseClick(resume, Qt::LeftButton);
    SweepWorkspace *workspace = window->workspace();
    ASSERT_TRUE(workspace->isRunning()) << window->lastMessage().toStdString();
    EXPECT_TRUE(asked.front().startsWith("Who is making changes")); // asked, not taken from "B. Crashed"
    const QString instruction = window->nextStep()->instructionText();
    EXPECT_TRUE(instruction.contains("Step 4")) << instruction.toStdString();
    EXPECT_TRUE(instruction.contains("resumed: check the load is still at about")) << instruction.toStdString();
    EXPECT_EQ(window->sessionBand()->kind(), SessionBand::Kind::Hidden); // running again
    EXPECT_TRUE(window->lastMessage().startsWith("Sweep resumed")) << window->lastMessage().toStdString();
    const QString provisional = window->results()->verdictText();
    EXPECT_TRUE(provisional.contains("Provisional (4 of 9 steps)")) << provisional.toStdString();
    shoot(*window, QStringLiteral("resumed-session"));

    const auto steps = workspace->plan()->steps;
    for (std::size_t k = 4; k < steps.size(); ++k) {
        typeInto(window->nextStep()->currentField(), QString::number(steps[k].currentA, 'f', 4) + " A");
        typeInto(window->nextStep()->voltageField(), QString::number(steps[k].predictedVoltageV, 'f', 3) + " V");
        QTest::mouseClick(window->nextStep()->recordButton(), Qt::LeftButton);
        ASSERT_EQ(workspace->readings().size(), k + 1) << window->lastMessage().toStdString();
    }
    ASSERT_TRUE(waitUntil([&] { return !workspace->isRunning(); }));
    EXPECT_TRUE(workspace->progress().isComplete());
    EXPECT_TRUE(window->nextStep()->instructionText().contains("Sweep complete")) << window->nextStep()->instructionText().toStdString();

    auto stored = SessionStore::openForReview(file.path.toStdString());
    ASSERT_TRUE(stored.ok());
    const auto events = stored.value->sweepEvents().value;
    bool resumed = false;
    for (const SweepEventRecord &event : events)
        resumed |= event.kind == SweepEventKind::Resumed && event.step == 4 && event.actor.person == testPerson.toStdString();
    EXPECT_TRUE(resumed);
    EXPECT_EQ(events.back().kind, SweepEventKind::Finished);
    bool confirmNote = false;
    for (const NoteRecord &note : stored.value->notes().value)
        confirmNote |= note.text.find("sweep resumed at step 4") != std::string::npos;
    EXPECT_TRUE(confirmNote);
}

// A winding temperature read after the sweep: recorded with the person and how it was measured,
// shown in the form, and R at the reference temperature worked out again from it. The dialog
// refuses a slip of the decimal point (417 °C for 41.7) before anything is recorded.
TEST(SessionIntegrityWindow, AWindingTemperatureReadAfterTheSweepIsRecordedAndUsed)
{
    TemperatureDialog dialog;
    dialog.sourceEdit()->setText(QStringLiteral("thermocouple on the outer layer"));
    dialog.valueEdit()->setText(QStringLiteral("417"));
    EXPECT_FALSE(dialog.recordButton()->isEnabled());
    EXPECT_TRUE(dialog.problem().contains("from -60 to 400 °C")) << dialog.problem().toStdString();
    dialog.valueEdit()->setText(QStringLiteral("41.7 °C"));
    EXPECT_TRUE(dialog.recordButton()->isEnabled()) << dialog.problem().toStdString();
    dialog.kindBox()->setCurrentIndex(1); // ambient: 41.7 °C is possible
    EXPECT_TRUE(dialog.recordButton()->isEnabled());
    dialog.valueEdit()->setText(QStringLiteral("95"));
    EXPECT_FALSE(dialog.recordButton()->isEnabled()); // not an ambient temperature
    dialog.kindBox()->setCurrentIndex(0);
    dialog.sourceEdit()->clear();
    EXPECT_FALSE(dialog.recordButton()->isEnabled());
    EXPECT_TRUE(dialog.problem().startsWith("How it was measured")) << dialog.problem().toStdString();

    QTemporaryDir folder;
    const SessionFile file = writeSession(folder.path(), SessionKind::Complete);
    auto window = demoWindow(folder.path());
    window->show();
    ASSERT_TRUE(QTest::qWaitForWindowExposed(window.get()));
    ASSERT_TRUE(window->openSessionFile(file.path));
    answerPrompts(*window);
    typeInto(window->setupForm()->quantityField(QStringLiteral("verdict.reference_temperature_c")), QStringLiteral("75 °C"));
    const auto referenceR = [&] { return shownValue(window->results()->value("reference_resistance"), Unit::Ohm); };
    ASSERT_TRUE(runEventsUntil([&] { return referenceR() > 0.0; }, 10000))
        << window->results()->value("reference_resistance").toStdString();
    const double before = referenceR();
    window->setTemperaturePrompt([] {
        return std::optional<TemperatureEntry>(
            TemperatureEntry{TemperatureKind::Winding, 41.5, QStringLiteral("thermocouple, 2 min after the last step")});
    });
    {
        TemperatureDialog shown(window.get()); // what a person sees after typing 417 for 41.7
        shown.valueEdit()->setText(QStringLiteral("417"));
        shown.sourceEdit()->setText(QStringLiteral("thermocouple, 2 min after the last step"));
        shown.adjustSize();
        shoot(*window, QStringLiteral("temperature-slip-refused"), &shown);
    }
    QAction *record = window->changeActions().back();
    ASSERT_TRUE(record->text().contains("temperature")) << record->text().toStdString();
    ASSERT_TRUE(record->isEnabled());
    record->trigger();
    EXPECT_EQ(text(window->setupForm()->quantityField(QStringLiteral("session.winding_temperature_c"))),
              QStringLiteral("41.5 °C"));
    // Copper (IEEE C57.12.90, T_k = 234.5 °C): R(75) = R(θ)·309.5/(234.5 + θ), so from 23.5 °C to
    // 41.5 °C R at 75 °C scales by 258/276 (worked by hand).
    ASSERT_TRUE(runEventsUntil([&] { return std::fabs(referenceR() / before - 258.0 / 276.0) < 0.002; }, 10000))
        << window->results()->value("reference_resistance").toStdString() << " (before " << before << " Ω)";
    shoot(*window, QStringLiteral("temperature-recorded"));
    auto stored = SessionStore::openForReview(file.path.toStdString());
    ASSERT_TRUE(stored.ok());
    const auto temperatures = stored.value->temperatures().value;
    ASSERT_FALSE(temperatures.empty());
    EXPECT_EQ(temperatures.back().kind, TemperatureKind::Winding);
    EXPECT_DOUBLE_EQ(temperatures.back().celsius, 41.5);
    EXPECT_EQ(temperatures.back().source, "thermocouple, 2 min after the last step");
    EXPECT_EQ(temperatures.back().actor.person, testPerson.toStdString());
}
