#include "DemoSweep.h"

#include "MainWindow.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "InstrumentsPanel.h"
#include "QuantityField.h"
#include "SetupForm.h"
#include "SweepWorkspace.h"

#include <QApplication>
#include <QDir>
#include <QTabWidget>
#include <QElapsedTimer>
#include <QEventLoop>
#include <QTimer>
#include <QLineEdit>
#include <QPushButton>
#include <QStyleFactory>

#include <cmath>

namespace sagline {

namespace {

// Demo transformer: sags a little more than the nameplate suggests, with ±15 mV of
// deterministic "noise" (a fixed pattern, so screenshots are reproducible).
constexpr double demoNoiseV[] = {0.012, -0.008, 0.004, -0.015, 0.009, -0.002, 0.014, -0.011, 0.006, -0.004, 0.010};

} // namespace

QPalette darkPalette()
{
    QPalette p;
    const QColor window(0x2b, 0x2d, 0x30);
    const QColor base(0x20, 0x22, 0x25);
    const QColor text(0xe8, 0xe8, 0xe8);
    p.setColor(QPalette::Window, window);
    p.setColor(QPalette::WindowText, text);
    p.setColor(QPalette::Base, base);
    p.setColor(QPalette::AlternateBase, QColor(0x33, 0x36, 0x3a));
    p.setColor(QPalette::Text, text);
    p.setColor(QPalette::Button, window);
    p.setColor(QPalette::ButtonText, text);
    p.setColor(QPalette::ToolTipBase, base);
    p.setColor(QPalette::ToolTipText, text);
    p.setColor(QPalette::Highlight, QColor(0x56, 0xb4, 0xe9));
    p.setColor(QPalette::HighlightedText, QColor(0x10, 0x10, 0x10));
    p.setColor(QPalette::PlaceholderText, QColor(0x99, 0x99, 0x99));
    p.setColor(QPalette::Disabled, QPalette::Text, QColor(0x80, 0x80, 0x80));
    p.setColor(QPalette::Disabled, QPalette::WindowText, QColor(0x80, 0x80, 0x80));
    p.setColor(QPalette::Disabled, QPalette::ButtonText, QColor(0x80, 0x80, 0x80));
    return p;
}

DemoResult runTypedDemoSweep(MainWindow &window, int leaveOut, const QString &operatorName, const QString &unitSerial)
{
    DemoResult result;
    SessionDetails details = window.setupForm()->sessionDetails();
    details.operatorName = operatorName;
    details.unitSerial = unitSerial;
    if (details.ambientTemperature.isEmpty())
        details.ambientTemperature = QStringLiteral("23 °C");
    window.setupForm()->setSessionDetails(details);
    if (auto *reference = window.setupForm()->quantityField(QStringLiteral("verdict.reference_temperature_c"));
        reference->isBlank())
        reference->setText(QStringLiteral("75 °C"));
    SweepWorkspace *workspace = window.workspace();
    const auto &plan = workspace->plan();
    if (!plan) {
        result.message = QStringLiteral("the demo setup has no plan: ")
                         + QString::fromStdString(workspace->errors().empty() ? std::string() : workspace->errors().front().message());
        return result;
    }
    const auto steps = plan->steps; // copy: the plan may be replaced while the sweep runs
    const double v0 = plan->noLoadVoltageV * 1.004;
    const double r = plan->seriesResistanceOhm * 1.08;
    window.instrumentsPanel()->setChoice({ReadingSource::TypedIn, {}, {}});
    window.setPerson(QStringLiteral("Demo person")); // who makes the changes: named by the demo, not asked
    // Through the window, as a person would: accept, then type each reading and record.
    window.planPanel()->acceptButton()->click();
    if (!workspace->isRunning()) {
        result.message = window.lastMessage();
        return result;
    }
    std::size_t k = 0;
    for (const auto &step : steps) {
        if (static_cast<int>(k) + leaveOut >= static_cast<int>(steps.size()))
            break;
        const double voltage = v0 - r * step.currentA + demoNoiseV[k % std::size(demoNoiseV)];
        window.nextStep()->currentField()->setText(QString::number(step.currentA, 'f', 4) + QStringLiteral(" A"));
        window.nextStep()->voltageField()->setText(QString::number(voltage, 'f', 3) + QStringLiteral(" V"));
        window.nextStep()->recordButton()->click();
        if (workspace->readings().size() != k + 1) {
            result.message = window.lastMessage();
            return result;
        }
        ++k;
        QApplication::processEvents();
    }
    window.flushCharts();
    result.ok = true;
    result.points = static_cast<int>(workspace->readings().size());
    result.message = workspace->sessionPath();
    return result;
}

DemoResult runVirtualBenchDemo(MainWindow &window, int pauseAfter)
{
    DemoResult result;
    SessionDetails details = window.setupForm()->sessionDetails();
    details.operatorName = QStringLiteral("Demo operator");
    details.unitSerial = QStringLiteral("VIRTUAL-0001");
    if (details.ambientTemperature.isEmpty())
        details.ambientTemperature = QStringLiteral("20 °C");
    window.setupForm()->setSessionDetails(details);
    if (auto *reference = window.setupForm()->quantityField(QStringLiteral("verdict.reference_temperature_c"));
        reference->isBlank())
        reference->setText(QStringLiteral("75 °C"));
    SweepWorkspace *workspace = window.workspace();
    workspace->setSimulatedTime(true);
    window.instrumentsPanel()->setChoice({ReadingSource::VirtualBench, {}, {}});
    window.setPerson(QStringLiteral("Demo person")); // who makes the changes: named by the demo, not asked
    window.planPanel()->acceptButton()->click();
    if (!workspace->isRunning()) {
        result.message = window.lastMessage();
        return result;
    }
    QElapsedTimer elapsed;
    elapsed.start();
    const auto target = static_cast<std::size_t>(pauseAfter);
    while (workspace->isRunning() && (pauseAfter <= 0 || workspace->readings().size() < target)) {
        if (elapsed.elapsed() > 30000) {
            result.message = QStringLiteral("the virtual bench sweep did not finish within 30 s");
            return result;
        }
        // An event loop that may block, so the simulated clock advances (see VirtualClock).
        QEventLoop loop;
        QTimer::singleShot(2, &loop, &QEventLoop::quit);
        loop.exec();
    }
    if (workspace->isRunning())
        window.nextStep()->pauseButton()->click();
    window.flushCharts();
    result.ok = true;
    result.points = static_cast<int>(workspace->readings().size());
    result.message = workspace->sessionPath();
    return result;
}

QStringList saveScreenshots(MainWindow &window, const QString &folder, bool dark)
{
    QDir().mkpath(folder);
    QStringList saved;
    const auto shoot = [&](const QString &name) {
        window.flushCharts();
        QApplication::processEvents();
        const QString path = QDir(folder).filePath(name);
        if (window.grab().save(path))
            saved << path;
    };
    shoot(QStringLiteral("sagline-light.png"));
    // The plan and the instruments tabs too, so a look at the images covers every panel.
    if (auto *tabs = window.findChild<QTabWidget *>()) {
        const int shown = tabs->currentIndex();
        tabs->setCurrentIndex(1);
        shoot(QStringLiteral("sagline-plan.png"));
        tabs->setCurrentIndex(2);
        shoot(QStringLiteral("sagline-instruments.png"));
        tabs->setCurrentIndex(shown);
    }
    if (dark) {
        const QPalette original = QApplication::palette();
        QApplication::setPalette(darkPalette());
        window.applyColourScheme();
        shoot(QStringLiteral("sagline-dark.png"));
        QApplication::setPalette(original);
        window.applyColourScheme();
    }
    return saved;
}

} // namespace sagline
