// A sweep through the window against sagline-sim running as its own process (SimProcess): the
// simulator started quiet (fixed seed, low noise, no copper heating), a window on the demo setup
// with a short plan (5 load steps, 50 ms dwell) connected through the instruments panel as a
// person does, and the operator's part of a step: set the simulator's load over its own link,
// click Record. Shared by the window's tests over real links.
#pragma once

#include "UiTestSupport.h"

#include "SimProcess.h"

#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "SessionStore.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QComboBox>
#include <QPushButton>
#include <QRandomGenerator>

namespace sagline::test {

// Fixed seed, low noise, no heating. `serialSuffix` ends the instruments' serial numbers: the
// same one makes a restarted simulator the same meters again; every other simulator (another
// test's, on a reused pty number or port) answers with identities of its own.
inline QStringList quietSimArguments(const QString &serialSuffix)
{
    return {QStringLiteral("--seed"),    QStringLiteral("7"),      QStringLiteral("--rated-rise"), QStringLiteral("0"),
            QStringLiteral("--noise-v"), QStringLiteral("0.0005"), QStringLiteral("--noise-a"),    QStringLiteral("0.0002"),
            QStringLiteral("--serial-suffix"), serialSuffix};
}

struct LinkSweep {
    QTemporaryDir folder;
    QTemporaryDir links;
    SimProcess sim;
    std::unique_ptr<MainWindow> window;
    // This sweep's meters: the same serial numbers whenever its simulator is (re)started.
    const QString serialSuffix = QString::number(QRandomGenerator::global()->generate(), 16).toUpper();
    QStringList simArguments() const { return quietSimArguments(serialSuffix); }

    // Starts the simulator and a window on the demo setup with a short plan, then connects
    // through the panel as a person does: the source picked, the address typed, Enter pressed.
    // `twoMeters`: the simulator's voltmeter at that source and its ammeter on the LAN, typed
    // into the separate-ammeter field; otherwise its two-channel power meter reads both.
    ::testing::AssertionResult connect(ReadingSource source, bool twoMeters = false)
    {
        QString error;
        if (!sim.start(links.path(), simArguments(), &error))
            return ::testing::AssertionFailure() << error.toStdString();
        const auto meter = sim.endpoint(twoMeters ? QStringLiteral("voltmeter") : QStringLiteral("power-meter"));
        const auto ammeter = sim.endpoint(QStringLiteral("ammeter"));
        if (!meter || !ammeter)
            return ::testing::AssertionFailure() << "no meter lines in: " << sim.output().toStdString();
        identities.clear();
        if (twoMeters)
            identities = {{QStringLiteral("voltmeter"), meter->identity}, {QStringLiteral("ammeter"), ammeter->identity}};
        else
            identities = {{QStringLiteral("meter"), meter->identity}};

        window = demoWindow(folder.path());
        window->setupForm()->setSessionDetails({QStringLiteral("Link tester"), QStringLiteral("LK-1"), QStringLiteral("20 °C"), {}});
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.steps")), QStringLiteral("5"));
        typeInto(window->setupForm()->quantityField(QStringLiteral("bench.dwell_s")), QStringLiteral("50 ms"));
        InstrumentsPanel *panel = window->instrumentsPanel();
        QComboBox *box = panel->sourceBox();
        if (panel->ammeterEdit()->isVisibleTo(panel))
            return ::testing::AssertionFailure() << "a separate-ammeter field shown for the virtual bench";
        box->setCurrentIndex(box->findData(int(source)));
        if (source == ReadingSource::SerialPort) {
            typeInto(panel->portBox()->lineEdit(), meter->ptyLink);
            QTest::keyClick(panel->portBox()->lineEdit(), Qt::Key_Return);
        } else {
            typeInto(panel->addressEdit(), QStringLiteral("127.0.0.1:%1").arg(meter->tcpPort));
            QTest::keyClick(panel->addressEdit(), Qt::Key_Return);
        }
        if (twoMeters) {
            if (!panel->ammeterEdit()->isVisibleTo(panel))
                return ::testing::AssertionFailure() << "no separate-ammeter field for this source";
            typeInto(panel->ammeterEdit(), QStringLiteral("127.0.0.1:%1").arg(ammeter->tcpPort));
        }
        QTest::mouseClick(window->planPanel()->acceptButton(), Qt::LeftButton);
        SweepWorkspace *workspace = window->workspace();
        if (!workspace->isRunning())
            return ::testing::AssertionFailure() << "not started: " << window->lastMessage().toStdString();
        if (!waitUntil([&] { return !workspace->run() || !workspace->run()->isConnecting(); }, 8000))
            return ::testing::AssertionFailure() << "still connecting: " << panel->statusText().toStdString();
        if (!workspace->isRunning())
            return ::testing::AssertionFailure() << "not connected: " << panel->statusText().toStdString();
        return ::testing::AssertionSuccess();
    }

    const Plan &plan() const { return *window->workspace()->plan(); }
    SweepController *controller() const { return window->workspace()->run()->controller(); }

    // Step `i` of the plan: wait for the window to ask, set the load, click the button, wait
    // until the reading is in the table.
    ::testing::AssertionResult recordStep(std::size_t i, bool waitForReading = true)
    {
        SweepWorkspace *workspace = window->workspace();
        const PlanStep &step = plan().steps[i];
        if (!waitUntil([&] { return controller()->state() == SweepState::WaitingForLoad && controller()->currentStep() == step.index; },
                       8000))
            return ::testing::AssertionFailure() << "step " << step.index << " never asked for; state "
                                                 << toString(controller()->state()).toStdString() << ", "
                                                 << window->lastMessage().toStdString();
        QString error;
        if (!sim.setLoad(step.loadResistanceOhm, &error))
            return ::testing::AssertionFailure() << error.toStdString();
        QPushButton *record = window->nextStep()->recordButton();
        if (!record->isEnabled())
            return ::testing::AssertionFailure() << "the Record button is disabled at step " << step.index;
        QTest::mouseClick(record, Qt::LeftButton);
        if (waitForReading && !waitUntil([&] { return workspace->readings().size() == i + 1; }, 8000))
            return ::testing::AssertionFailure() << "step " << step.index << " not recorded; state "
                                                 << toString(controller()->state()).toStdString() << ", "
                                                 << window->lastMessage().toStdString();
        return ::testing::AssertionSuccess();
    }

    // The step waits for its load to be checked (`wording`, e.g. "resumed: check the load is
    // still at about", then "for step N, then confirm"), with Record enabled, and reads nothing
    // for more than two read intervals of a real meter.
    ::testing::AssertionResult asksAgainAndHolds(const QString &wording, const PlanStep &step)
    {
        const std::size_t before = window->workspace()->readings().size();
        if (controller()->state() != SweepState::WaitingForLoad || controller()->currentStep() != step.index)
            return ::testing::AssertionFailure() << toString(controller()->state()).toStdString() << " at step "
                                                 << controller()->currentStep();
        const QString asked = window->nextStep()->instructionText();
        if (!asked.contains(wording) || !asked.contains(QStringLiteral("for step %1, then confirm").arg(step.index)))
            return ::testing::AssertionFailure() << "asked: " << asked.toStdString();
        if (!window->nextStep()->recordButton()->isEnabled())
            return ::testing::AssertionFailure() << "the Record button is disabled";
        waitUntil([] { return false; }, 1200);
        if (controller()->state() != SweepState::WaitingForLoad || window->workspace()->readings().size() != before)
            return ::testing::AssertionFailure() << "read without a confirmation: " << toString(controller()->state()).toStdString()
                                                 << ", " << window->workspace()->readings().size() << " readings";
        return ::testing::AssertionSuccess();
    }

    // Records steps `from` to the last, waits until the sweep has finished, and checks the
    // session file holds one reading per plan step, in plan order.
    ::testing::AssertionResult recordTheRestAndFinish(std::size_t from)
    {
        for (std::size_t i = from; i < plan().steps.size(); ++i) {
            if (auto recorded = recordStep(i); !recorded)
                return recorded;
        }
        SweepWorkspace *workspace = window->workspace();
        if (!waitUntil([&] { return !workspace->isRunning(); }, 5000) || controller()->state() != SweepState::Finished)
            return ::testing::AssertionFailure() << "not finished: " << toString(controller()->state()).toStdString();
        auto stored = SessionStore::openForReview(workspace->sessionPath().toStdString());
        if (!stored.ok())
            return ::testing::AssertionFailure() << stored.message;
        const auto readings = stored.value->readings();
        if (!readings.ok() || readings.value.size() != plan().steps.size())
            return ::testing::AssertionFailure() << readings.value.size() << " readings stored for " << plan().steps.size() << " steps";
        for (std::size_t i = 0; i < readings.value.size(); ++i) {
            if (readings.value[i].step != plan().steps[i].index)
                return ::testing::AssertionFailure() << "stored reading " << i << " is of step " << readings.value[i].step;
        }
        return ::testing::AssertionSuccess();
    }

    QList<QPair<QString, QString>> identities; // instrument name, its *IDN? answer
};

} // namespace sagline::test
