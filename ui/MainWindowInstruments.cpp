// MainWindow and the instruments: Connect and test before a sweep (MeterCheck), and the
// no-load reading of a sweep's open-circuit step checked against the nameplate.
#include "MainWindow.h"

#include "InstrumentsPanel.h"
#include "MeterCheck.h"
#include "NoLoadCheck.h"
#include "SweepWorkspace.h"

#include <QTimer>

namespace sagline {

void MainWindow::testMeters()
{
    if (m_meterCheck && m_meterCheck->isRunning())
        return;
    delete m_meterCheck;
    m_meterCheck = nullptr;
    QString error;
    const Setup *setup = m_workspace->setup() ? &*m_workspace->setup() : nullptr;
    const Plan *plan = m_workspace->plan() ? &*m_workspace->plan() : nullptr;
    m_meterCheck = MeterCheck::forSource(m_instruments->choice(), setup, plan, &error, this);
    if (!m_meterCheck) {
        m_instruments->setTestResult(QStringLiteral("✖ ") + withFieldLabels(error), false);
        return;
    }
    m_instruments->setTesting(true);
    m_instruments->setTestResult(tr("Connecting…"), true);
    connect(m_meterCheck, &MeterCheck::finished, this, [this](bool ok, const QString &report) {
        m_instruments->setTesting(false);
        m_instruments->setTestResult(report, ok);
        m_instruments->setStatus(ok ? tr("tested: every meter answered (not connected now; the sweep connects)")
                                    : tr("test failed: see above"));
        showMessage(ok ? tr("Meters tested: each answered and gave a reading") : tr("Meter test failed"), !ok);
    });
    m_meterCheck->start();
}

void MainWindow::checkNoLoadReading(const Reading &reading)
{
    const auto &plan = m_workspace->plan();
    if (reading.step != 0 || m_workspace->isTypedIn() || !plan || plan->steps.empty() || plan->steps.front().index != 0)
        return; // typed readings get their own second look (TypedReadingCheck)
    const auto question = noLoadQuestion(plan->steps.front().predictedVoltageV, reading.voltageV);
    if (!question)
        return;
    // Hold the sweep before anything else is read, then ask outside the recording signal.
    if (!m_workspace->isPaused())
        m_workspace->pauseOrResume();
    const QString text = QString::fromStdString(*question);
    QTimer::singleShot(0, this, [this, text] {
        if (!m_workspace->isRunning())
            return;
        const bool keep = m_confirmPrompt(
            tr("Check the no-load reading"),
            tr("%1.\n\nGo on with the sweep? Choose No to stop it and check the wiring; the reading stays in the session.")
                .arg(text.left(1).toUpper() + text.mid(1)));
        if (keep) {
            m_workspace->addNote(tr("step 0: %1; confirmed, the sweep went on").arg(text));
            if (m_workspace->isPaused())
                m_workspace->pauseOrResume();
            showMessage(tr("No-load reading confirmed: %1").arg(text));
        } else {
            m_workspace->addNote(tr("step 0: %1; the sweep was stopped to check").arg(text));
            m_workspace->stop();
            showMessage(tr("Sweep stopped: %1").arg(text), true);
        }
    });
}

} // namespace sagline
