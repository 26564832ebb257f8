// MainWindow and the open session: the one place a session reaches the views (showSession),
// its state band, the person making changes, and the actions on a recorded session (reopen,
// resume, retake, and the gates before a sweep).
#include "MainWindow.h"

#include "CautionStrip.h"
#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ReadingsTableModel.h"
#include "ResidualChart.h"
#include "ResultsPanel.h"
#include "SessionBand.h"
#include "SessionStore.h"
#include "SetupForm.h"
#include "SetupJson.h"
#include "SweepRun.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"

#include <QAction>
#include <QComboBox>
#include <QFileDialog>
#include <QFileInfo>
#include <QInputDialog>
#include <QLabel>
#include <QMessageBox>
#include <QPushButton>
#include <QSignalBlocker>
#include <QStatusBar>
#include <QTableView>

namespace sagline {

namespace {

// Where the session's readings came from, as its file tells: the virtual bench, typed in, or
// the meters it recorded (their link as the sink wrote it: "ADDRESS; accuracy...").
SourceChoice sourceChoiceFrom(const SessionRecords &records, const std::vector<Reading> &readings, const SourceChoice &fallback)
{
    SourceChoice choice = fallback;
    for (const Reading &reading : readings) {
        if (reading.flags & flagSimulated)
            return {ReadingSource::VirtualBench, {}, {}};
        if (reading.flags & flagManual)
            return {ReadingSource::TypedIn, {}, {}};
    }
    for (const InstrumentRecord &instrument : records.instruments) {
        const QString identity = QString::fromStdString(instrument.identity);
        if (identity.contains(QLatin1String("Virtual Bench")))
            return {ReadingSource::VirtualBench, {}, {}};
        const QString address = QString::fromStdString(instrument.accuracy).section(QLatin1Char(';'), 0, 0).trimmed();
        if (address.startsWith(QLatin1String("tcp:"))) {
            choice = {ReadingSource::Lan, {}, address.mid(4)};
            return choice;
        }
        if (address.startsWith(QLatin1Char('/'))) {
            choice = {ReadingSource::SerialPort, address.section(QLatin1Char(' '), 0, 0).section(QLatin1Char(','), 0, 0), {}};
            return choice;
        }
    }
    return readings.empty() ? fallback : SourceChoice{ReadingSource::VirtualBench, {}, {}};
}

QString instrumentsText(const SessionRecords &records)
{
    QStringList lines;
    for (const InstrumentRecord &instrument : records.instruments)
        lines << QString::fromStdString(instrument.role) + QStringLiteral(": ") + QString::fromStdString(instrument.identity);
    return lines.isEmpty() ? QObject::tr("no instruments recorded") : QObject::tr("recorded with\n%1").arg(lines.join('\n'));
}

QString who(const Actor &actor)
{
    const QString person = actor.person.empty() ? QObject::tr("(name not recorded)") : QString::fromStdString(actor.person);
    return actor.osAccount.empty() ? person : QObject::tr("%1 (account %2)").arg(person, QString::fromStdString(actor.osAccount));
}

QString dateTime(const std::string &utc)
{
    // "2026-12-02T10:15:03.250Z" -> "2026-12-02 10:15 UTC"
    const QString text = QString::fromStdString(utc);
    return text.size() >= 16 ? text.left(10) + QLatin1Char(' ') + text.mid(11, 5) + QStringLiteral(" UTC") : text;
}

} // namespace

void MainWindow::setDefaultSetup(const Setup &setup) { m_defaultSetup = setup; }

void MainWindow::setPerson(const QString &person) { m_workspace->setPerson(person); }

QString MainWindow::pointsStatusText() const { return m_statusPoints->text(); }

std::optional<QString> MainWindow::askReason(const QString &title, const QString &label)
{
    return m_textPrompt(title, label);
}

bool MainWindow::ensurePerson()
{
    if (!m_workspace->person().isEmpty())
        return true;
    // Asked once per session; the operator field is not taken for it (the person at the
    // keyboard now may be someone else).
    while (true) {
        const auto name = m_textPrompt(tr("Who is making changes?"),
                                       tr("Your name, recorded with every change you make to this session (with the "
                                          "computer account %1):")
                                           .arg(QString::fromStdString(m_workspace->store() ? m_workspace->store()->actor().osAccount
                                                                                             : std::string())));
        if (!name)
            return false;
        if (!name->trimmed().isEmpty()) {
            m_workspace->setPerson(*name);
            return true;
        }
        showMessage(tr("by: the name of the person making the change is required"), true);
    }
}

void MainWindow::showSession()
{
    SweepWorkspace *workspace = m_workspace;
    const bool open = workspace->store() != nullptr;
    const SessionRecords &records = workspace->records();
    m_settingsTimer.stop(); // edits meant for the session closed above are not written into this one
    resetViews();
    m_instrumentState.clear();

    if (!open) {
        // New, or a session closed: the program's defaults, nothing of the last session.
        if (m_defaultSetup)
            m_setupForm->loadSetup(*m_defaultSetup);
        else
            m_setupForm->clearSetup();
        m_setupForm->setSessionDetails({});
        m_setupForm->setVerdictSettings({});
        m_instruments->setChoice(m_defaultChoice);
        m_instruments->setStatus(tr("not connected"));
        m_setupForm->setLocked(false);
        m_instruments->setLocked(false);
        m_planPanel->setAccepted(false);
        m_nextStep->setInstruction(tr("Complete the setup, then accept the plan"),
                                   tr("The plan tab shows each load step, the recommended fuse and the limits."));
        handleSetupChanged();
    } else if (records.fromFile) {
        // Everything from the file alone.
        {
            const QSignalBlocker block(m_setupForm); // the session's plan stands; the form only shows it
            if (workspace->setup())
                m_setupForm->loadSetup(*workspace->setup());
            else
                m_setupForm->clearSetup(); // an unreadable stored setup shows as empty, never as the last one
        }
        m_setupForm->setSessionDetails(sessionDetailsFrom(records));
        m_setupForm->setVerdictSettings(workspace->recordedAnalysisSettings()
                                            ? verdictSettingsFrom(*workspace->recordedAnalysisSettings())
                                            : VerdictSettings{});
        m_instruments->setChoice(sourceChoiceFrom(records, workspace->readings(), m_defaultChoice));
        m_instruments->setStatus(instrumentsText(records));
        m_setupForm->setLocked(true);
        m_instruments->setLocked(true);
        handlePlanChanged();
        m_planPanel->setAccepted(false);
        m_planPanel->acceptButton()->setEnabled(false);
        showRecordedReadings(0, static_cast<int>(workspace->readings().size()));
        for (const SafetyStopRecord &stop : records.safetyStops)
            m_caution->showAlarm(tr("Safety stop at step %1: %2").arg(stop.step).arg(QString::fromStdString(stop.message)));
    }
    if (open)
        setWindowTitle(tr("%1 – Sagline").arg(QFileInfo(workspace->sessionPath()).fileName()));
    else
        setWindowTitle(tr("Sagline: transformer load test"));
    showSourceStatus();
    showSessionState();
    refreshFitViews();
    if (open && records.fromFile)
        flushCharts(); // the first frame painted after opening shows the session's points
}

void MainWindow::showReadingMarks(int first, int end)
{
    const auto &readings = m_workspace->readings();
    for (int row = first; row < end; ++row) {
        const Reading &reading = readings[static_cast<std::size_t>(row)];
        if (reading.superseded)
            m_readingsModel->setSuperseded(row, m_workspace->supersededReason(reading.id));
        else if (reading.excluded)
            m_readingsModel->setExcluded(row, true, m_workspace->exclusionReason(reading.id));
    }
}

void MainWindow::showSessionState()
{
    SweepWorkspace *workspace = m_workspace;
    const bool changeable = workspace->isChangeable();
    const QString why = !workspace->store()             ? tr("No session is open.")
                        : workspace->store()->isSealed() ? tr("The session is signed off: reopen it, with a reason, to change it.")
                                                         : tr("The session is open read-only.");
    for (QAction *action : m_changeActions) {
        action->setEnabled(changeable);
        action->setStatusTip(changeable ? QString() : why);
    }
    m_setupForm->setRecordLocked(workspace->store() && !changeable);
    m_setupForm->setDetailsLocked(workspace->store() != nullptr);
    if (!workspace->store()) {
        m_band->setState(SessionBand::Kind::Hidden, {}, false);
        m_statusPoints->clear();
        return;
    }
    const SessionRecords &records = workspace->records();
    const SealReport &seal = records.seal;
    const SessionProgress progress = workspace->progress();
    const bool readOnly = workspace->store()->isReadOnly();
    const QString points = tr("%n point(s) recorded", nullptr, static_cast<int>(workspace->readings().size()));
    m_statusPoints->setText(points);
    QString resume;
    if (!workspace->isRunning() && !progress.isComplete() && progress.nextStep && workspace->isChangeable())
        resume = tr("Resume at step %1").arg(*progress.nextStep);
    switch (seal.state) {
    case SealState::Signed:
        m_band->setState(SessionBand::Kind::Signed,
                         tr("✔ Signed off by %1 on %2 (%3). Read-only: reopen it, with a reason, to change it.")
                             .arg(QString::fromStdString(seal.signOff->reviewer), dateTime(seal.signOff->timeUtc),
                                  QString::fromStdString(toString(seal.signOff->decision))),
                         !readOnly);
        break;
    case SealState::ChangedAfterSignOff:
        m_band->setState(SessionBand::Kind::ChangedAfterSignOff,
                         tr("▲ Changed after sign-off: the sign-off by %1 on %2 is superseded; reopened by %3 on %4: %5")
                             .arg(QString::fromStdString(seal.signOff->reviewer), dateTime(seal.signOff->timeUtc),
                                  who(seal.reopen->actor), dateTime(seal.reopen->timeUtc),
                                  QString::fromStdString(seal.reopen->reason)),
                         false, resume);
        break;
    case SealState::Altered:
        m_band->setState(SessionBand::Kind::Altered, tr("✖ %1").arg(QString::fromStdString(seal.summary())), false);
        break;
    case SealState::NotSigned:
        if (!progress.isComplete() && progress.state != Completeness::InProgress)
            m_band->setState(SessionBand::Kind::Incomplete,
                             tr("◌ %1").arg(QString::fromStdString(progress.label()).replace(0, 1, QStringLiteral("I"))),
                             false, resume);
        else
            m_band->setState(SessionBand::Kind::Hidden, {}, false);
        break;
    }
    if (!workspace->isRunning()) {
        const QString header = progress.isComplete() ? tr("Sweep complete: %1").arg(points)
                                                     : tr("Sweep ended: %1").arg(QString::fromStdString(progress.label()));
        const QString detail = !workspace->isChangeable()
                                   ? tr("Every reading is in the session file. The session is %1: nothing can be changed "
                                        "here until it is reopened.")
                                         .arg(readOnly ? tr("open read-only") : tr("signed off"))
                                   : tr("Every reading is in the session file; exclude, restore, retake or annotate points in "
                                        "the readings table%1, or start a new session (Ctrl+N).")
                                         .arg(resume.isEmpty() ? QString() : tr(", resume the sweep"));
        m_nextStep->setInstruction(header, detail);
    }
}

void MainWindow::reopenSession()
{
    if (!ensurePerson())
        return;
    const auto reason = askReason(tr("Reopen the signed-off session"),
                                  tr("Why must the signed session change? (recorded with your name; the sign-off is then "
                                     "superseded)"));
    if (!reason)
        return;
    const QString error = m_workspace->reopen(*reason);
    showMessage(error.isEmpty() ? tr("Reopened: the sign-off is superseded.") : error, !error.isEmpty());
}

void MainWindow::resumeSession()
{
    if (!ensurePerson())
        return;
    const QString error = m_workspace->resumeSweep(m_instruments->choice());
    if (!error.isEmpty()) {
        showMessage(error, true);
        return;
    }
    m_caution->clearAlarm();
    if (m_workspace->isTypedIn())
        m_nextStep->clearEntry();
    showSessionState();
    showMessage(tr("Sweep resumed: check the load before the next reading.")); // the last message may be the stop
}

void MainWindow::retakeSelected()
{
    const auto rows = m_readingsView->selectionModel()->selectedRows();
    if (rows.isEmpty()) {
        showMessage(tr("Select a reading in the table first."), true);
        return;
    }
    if (!ensurePerson())
        return;
    const int row = rows.front().row();
    const auto reason = askReason(tr("Retake this step"),
                                  tr("Why is step %1 taken again? (the new reading supersedes reading %2, which stays in "
                                     "the session)")
                                      .arg(m_workspace->readings()[static_cast<std::size_t>(row)].step)
                                      .arg(row + 1));
    if (!reason)
        return;
    const QString error = m_workspace->retake(row, *reason, m_instruments->choice());
    if (!error.isEmpty()) {
        showMessage(error, true);
        return;
    }
    m_caution->clearAlarm();
    if (m_workspace->isTypedIn())
        m_nextStep->clearEntry();
    showSessionState();
    showMessage(tr("Retaking step %1: the new reading supersedes reading %2.")
                    .arg(m_workspace->readings()[static_cast<std::size_t>(row)].step)
                    .arg(row + 1));
}

void MainWindow::useSafeSteps()
{
    m_workspace->setLimitChoice({LimitChoice::Truncate, {}});
    showMessage(tr("Only the safe steps will be run; the removed steps are recorded in the session."));
    handlePlanChanged();
}

void MainWindow::overrideLimits()
{
    if (!ensurePerson())
        return;
    const auto reason = askReason(tr("Override the limits"),
                                  tr("Why may the bench take these steps? Your name and this reason are recorded in the "
                                     "session; the hard stops still apply."));
    if (!reason || reason->trimmed().isEmpty())
        return;
    m_workspace->setLimitChoice({LimitChoice::Override, *reason});
    showMessage(tr("Limits overridden by %1: %2").arg(m_workspace->person(), reason->trimmed()), true);
    handlePlanChanged();
}

} // namespace sagline
