// MainWindow: menus and actions, files (new, open, recent, drop, copy, CSV, PDF), readings
// table actions, and the settings kept between runs.
#include "MainWindow.h"

#include "HelpMenu.h"
#include "InstrumentsPanel.h"
#include "NearestFolder.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ReadingsTableModel.h"
#include "ReviewMenu.h"
#include "SessionStore.h"
#include "SetupForm.h"
#include "SweepWorkspace.h"

#include <QAction>
#include <QCloseEvent>
#include <QDir>
#include <QFileDialog>
#include <QFileInfo>
#include <QInputDialog>
#include <QLabel>
#include <QMenuBar>
#include <QMessageBox>
#include <QMimeData>
#include <QGuiApplication>
#include <QScreen>
#include <QSettings>
#include <QSplitter>
#include <QStandardPaths>
#include <QTableView>

#include <algorithm>

namespace sagline {

namespace {
constexpr int maxRecentFiles = 8;
const QString sessionFilter = QStringLiteral("Sagline sessions (*.sagline)");
} // namespace

void MainWindow::createActions()
{
    QMenu *file = menuBar()->addMenu(tr("&File"));
    file->addAction(tr("&New session"), QKeySequence::New, this, &MainWindow::newSession);
    file->addSeparator();
    file->addAction(tr("Open se&tup…"), QKeySequence(Qt::CTRL | Qt::ALT | Qt::Key_O), this, &MainWindow::openSetupDialog);
    m_recentSetupsMenu = file->addMenu(tr("Recent set&ups"));
    file->addAction(tr("Sa&ve setup as…"), QKeySequence(Qt::CTRL | Qt::ALT | Qt::Key_S), this, &MainWindow::saveSetupDialog);
    m_presetsMenu = file->addMenu(tr("Nameplate &presets"));
    connect(m_recentSetupsMenu, &QMenu::aboutToShow, this, &MainWindow::rebuildSetupMenus);
    connect(m_presetsMenu, &QMenu::aboutToShow, this, &MainWindow::rebuildSetupMenus);
    file->addSeparator();
    file->addAction(tr("&Open session…"), QKeySequence::Open, this, &MainWindow::openSessionDialog);
    m_recentMenu = file->addMenu(tr("Open &recent"));
    // Files deleted or moved since the list was built (by hand, or a failed start that removed
    // its empty session) are dropped when the menu opens.
    connect(m_recentMenu, &QMenu::aboutToShow, this, &MainWindow::rebuildRecentMenu);
    file->addSeparator();
    file->addAction(tr("Save a &copy as…"), QKeySequence::SaveAs, this, &MainWindow::saveCopyAs);
    file->addAction(tr("&Report to PDF…"), QKeySequence(Qt::CTRL | Qt::Key_P), this, &MainWindow::reportPdf);
    file->addAction(tr("&Export readings to CSV…"), QKeySequence(Qt::CTRL | Qt::Key_E), this, &MainWindow::exportCsv);
    file->addSeparator();
    file->addAction(tr("&Quit"), QKeySequence::Quit, this, &QWidget::close);

    // The same actions as the plan's Accept button and the strip's buttons: enabled together.
    m_sweepMenu = menuBar()->addMenu(tr("&Sweep"));
    m_sweepMenu->addAction(m_planPanel->acceptAction());
    m_sweepMenu->addSeparator();
    m_sweepMenu->addAction(m_nextStep->recordAction());
    m_sweepMenu->addAction(m_nextStep->pauseAction());
    m_sweepMenu->addSeparator();
    m_sweepMenu->addAction(m_nextStep->stopAction()); // no shortcut; asks first

    QMenu *readings = menuBar()->addMenu(tr("&Readings"));
    auto *exclude = readings->addAction(tr("E&xclude selected point…"), QKeySequence(Qt::CTRL | Qt::Key_Delete), this,
                                        &MainWindow::excludeSelected);
    auto *restore = readings->addAction(tr("Re&store selected point…"), QKeySequence(Qt::CTRL | Qt::Key_Insert), this,
                                        &MainWindow::restoreSelected);
    auto *note = readings->addAction(tr("Add a &note…"), QKeySequence(Qt::CTRL | Qt::SHIFT | Qt::Key_N), this,
                                     &MainWindow::addNote);
    auto *retake = readings->addAction(tr("Re&take the selected point's step…"), QKeySequence(Qt::CTRL | Qt::Key_R), this,
                                       &MainWindow::retakeSelected);
    auto *temperature = readings->addAction(tr("Record a &temperature…"), this, &MainWindow::recordTemperature);
    temperature->setStatusTip(tr("A winding or ambient temperature measured after the session began, e.g. the winding's "
                                 "right after the sweep"));
    m_readingsView->addActions({exclude, restore, note, retake});
    // Disabled while the session cannot change (showSessionState).
    m_changeActions = {exclude, restore, note, retake, temperature};
    for (QAction *action : m_changeActions)
        action->setEnabled(false); // no session yet

    QMenu *view = menuBar()->addMenu(tr("&View"));
    view->addAction(tr("&Setup"), QKeySequence(Qt::ALT | Qt::Key_1), this, [this] { m_leftTabs->setCurrentIndex(0); });
    view->addAction(tr("&Plan"), QKeySequence(Qt::ALT | Qt::Key_2), this, [this] { m_leftTabs->setCurrentIndex(1); });
    view->addAction(tr("&Instruments"), QKeySequence(Qt::ALT | Qt::Key_3), this, [this] { m_leftTabs->setCurrentIndex(2); });
    view->addAction(tr("R&eadings table"), QKeySequence(Qt::ALT | Qt::Key_4), this, [this] { m_readingsView->setFocus(); });
    addReviewMenu(this); // review workspace and supervised sessions (ui/ReviewMenu)
    addHelpMenu(this);   // user guide, shortcuts, About (ui/HelpMenu)
    rebuildRecentMenu();
}

void MainWindow::readSettings()
{
    QSettings settings;
    // The size the person left it at; the first time, most of the screen (all of a 1366 x 768
    // laptop's, less the panel), which the layout is made to fit.
    if (!restoreGeometry(settings.value(QStringLiteral("window/geometry")).toByteArray())) {
        const QScreen *screen = QGuiApplication::primaryScreen();
        const QSize available = screen ? screen->availableGeometry().size() : QSize(1366, 740);
        resize(std::min(available.width(), 1600), std::min(available.height(), 1000));
    }
    m_mainSplitter->restoreState(settings.value(QStringLiteral("window/mainSplitter")).toByteArray());
    m_chartSplitter->restoreState(settings.value(QStringLiteral("window/chartSplitter")).toByteArray());
    m_rightSplitter->restoreState(settings.value(QStringLiteral("window/rightSplitter")).toByteArray());
    m_recentFiles = settings.value(QStringLiteral("files/recent")).toStringList();
    m_recentSetups = settings.value(QStringLiteral("files/recentSetups")).toStringList();
    m_sessionFolder = settings.value(QStringLiteral("files/sessionFolder")).toString();
    if (m_sessionFolder.isEmpty())
        m_sessionFolder = QStandardPaths::writableLocation(QStandardPaths::DocumentsLocation)
                          + QStringLiteral("/Sagline sessions");
    SourceChoice choice;
    choice.source = static_cast<ReadingSource>(settings.value(QStringLiteral("instruments/source"), 0).toInt());
    choice.serialPort = settings.value(QStringLiteral("instruments/serialPort")).toString();
    choice.lanAddress = settings.value(QStringLiteral("instruments/lanAddress")).toString();
    choice.ammeterAddress = settings.value(QStringLiteral("instruments/ammeterAddress")).toString();
    choice.serialFormat = settings.value(QStringLiteral("instruments/serialFormat")).toString();
    choice.loadAddress = settings.value(QStringLiteral("instruments/loadAddress")).toString();
    m_instruments->setChoice(choice);
    m_defaultChoice = choice;
    SessionDetails details;
    details.operatorName = settings.value(QStringLiteral("session/operator")).toString();
    m_setupForm->setSessionDetails(details);
    rebuildRecentMenu();
    rebuildSetupMenus();
}

void MainWindow::writeSettings() const
{
    QSettings settings;
    settings.setValue(QStringLiteral("window/geometry"), saveGeometry());
    settings.setValue(QStringLiteral("window/mainSplitter"), m_mainSplitter->saveState());
    settings.setValue(QStringLiteral("window/chartSplitter"), m_chartSplitter->saveState());
    settings.setValue(QStringLiteral("window/rightSplitter"), m_rightSplitter->saveState());
    settings.setValue(QStringLiteral("files/recent"), m_recentFiles);
    settings.setValue(QStringLiteral("files/recentSetups"), m_recentSetups);
    const SourceChoice choice = m_instruments->choice();
    settings.setValue(QStringLiteral("instruments/source"), int(choice.source));
    settings.setValue(QStringLiteral("instruments/serialPort"), choice.serialPort);
    settings.setValue(QStringLiteral("instruments/lanAddress"), choice.lanAddress);
    settings.setValue(QStringLiteral("instruments/ammeterAddress"), choice.ammeterAddress);
    settings.setValue(QStringLiteral("instruments/serialFormat"), choice.serialFormat);
    settings.setValue(QStringLiteral("instruments/loadAddress"), choice.loadAddress);
    settings.setValue(QStringLiteral("session/operator"), m_setupForm->sessionDetails().operatorName);
}

void MainWindow::setSessionFolder(const QString &folder) { m_sessionFolder = folder; }

void MainWindow::closeEvent(QCloseEvent *event)
{
    // Every reading is already committed to the session file; nothing needs saving.
    if (m_workspace->isRunning())
        m_workspace->stop();
    writeSettings();
    event->accept();
}

void MainWindow::dragEnterEvent(QDragEnterEvent *event)
{
    const auto urls = event->mimeData()->urls();
    if (urls.size() == 1 && urls.front().isLocalFile() && urls.front().toLocalFile().endsWith(QLatin1String(".sagline")))
        event->acceptProposedAction();
}

void MainWindow::dropEvent(QDropEvent *event)
{
    openSessionFile(event->mimeData()->urls().front().toLocalFile());
    event->acceptProposedAction();
}

void MainWindow::newSession()
{
    if (m_workspace->isRunning()
        && QMessageBox::question(this, tr("New session"),
                                 tr("A sweep is running. Stop it? Every recorded point stays in its session file."))
               != QMessageBox::Yes)
        return;
    if (m_workspace->isRunning())
        m_workspace->stop();
    m_workspace->openSession(QString()); // closes the session; showSession() sets the defaults
}

void MainWindow::openSessionDialog()
{
    const QString path = QFileDialog::getOpenFileName(this, tr("Open session"), nearestExistingFolder(m_sessionFolder),
                                                      sessionFilter);
    if (!path.isEmpty())
        openSessionFile(path);
}

bool MainWindow::openSessionFile(const QString &path)
{
    if (m_workspace->isRunning())
        m_workspace->stop();
    // The workspace reads the whole session from the file; showSession() (on sessionChanged)
    // puts it in every view. A file that does not open leaves an empty window, not the last one.
    const QString error = m_workspace->openSession(path);
    if (!error.isEmpty()) {
        showMessage(tr("Cannot open %1: %2").arg(path, error), true);
        rebuildRecentMenu(); // a file that is gone leaves the list
        return false;
    }
    rememberRecent(path);
    const QString readOnly = m_workspace->readOnlyReason();
    if (!m_workspace->setup() && !m_workspace->errors().empty()) {
        // Its readings are shown, but nothing planned or judged from a setup that does not read.
        showMessage(tr("Opened %1, but its stored setup cannot be read: %2")
                        .arg(path, QString::fromStdString(m_workspace->errors().front().message())),
                    true);
        return true;
    }
    showMessage(readOnly.isEmpty() ? tr("Opened %1").arg(path) : tr("Opened %1 for review only. %2").arg(path, readOnly));
    return true;
}

void MainWindow::saveCopyAs()
{
    if (!m_workspace->store()) {
        showMessage(tr("No session is open."), true);
        return;
    }
    const QString path = QFileDialog::getSaveFileName(this, tr("Save a copy"), nearestExistingFolder(m_sessionFolder),
                                                      sessionFilter);
    if (path.isEmpty())
        return;
    const auto status = m_workspace->store()->saveCopyAs(path.toStdString());
    showMessage(status.ok() ? tr("Copy written to %1").arg(path) : QString::fromStdString(status.message), !status.ok());
}

void MainWindow::rememberRecent(const QString &path)
{
    if (path.isEmpty())
        return;
    const QString absolute = QFileInfo(path).absoluteFilePath();
    m_recentFiles.removeAll(absolute);
    m_recentFiles.prepend(absolute);
    while (m_recentFiles.size() > maxRecentFiles)
        m_recentFiles.removeLast();
    rebuildRecentMenu();
}

void MainWindow::rebuildRecentMenu()
{
    if (!m_recentMenu)
        return;
    m_recentFiles.removeIf([](const QString &path) { return !QFileInfo::exists(path); });
    m_recentMenu->clear();
    for (const QString &path : std::as_const(m_recentFiles))
        m_recentMenu->addAction(QFileInfo(path).fileName(), this, [this, path] { openSessionFile(path); })->setToolTip(path);
    m_recentMenu->setEnabled(!m_recentFiles.isEmpty());
}

void MainWindow::excludeSelected()
{
    const auto rows = m_readingsView->selectionModel()->selectedRows();
    if (rows.isEmpty()) {
        showMessage(tr("Select a reading in the table first."), true);
        return;
    }
    if (!ensurePerson())
        return;
    const auto reason = askReason(tr("Exclude point"), tr("Reason (kept with the session):"));
    if (!reason)
        return;
    const QString error = m_workspace->exclude(rows.front().row(), *reason);
    if (!error.isEmpty()) {
        showMessage(error, true);
        return;
    }
    m_readingsModel->setExcluded(rows.front().row(), true, reason->trimmed());
    showMessage(tr("Reading %1 excluded: %2").arg(rows.front().row() + 1).arg(reason->trimmed()));
}

void MainWindow::restoreSelected()
{
    const auto rows = m_readingsView->selectionModel()->selectedRows();
    if (rows.isEmpty()) {
        showMessage(tr("Select a reading in the table first."), true);
        return;
    }
    if (!ensurePerson())
        return;
    const auto reason = askReason(tr("Restore point"), tr("Reason (kept with the session):"));
    if (!reason)
        return;
    const QString error = m_workspace->restore(rows.front().row(), *reason);
    showMessage(error.isEmpty() ? tr("Reading %1 restored: %2").arg(rows.front().row() + 1).arg(reason->trimmed()) : error,
                !error.isEmpty());
}

void MainWindow::recordTemperature()
{
    if (!ensurePerson())
        return;
    const auto entry = m_temperaturePrompt();
    if (!entry)
        return;
    const QString error = m_workspace->recordTemperature(entry->kind, entry->celsius, entry->source);
    if (!error.isEmpty()) {
        showMessage(error, true);
        return;
    }
    // The form shows the session's latest temperatures; the results are worked out from them.
    m_setupForm->setSessionDetails(sessionDetailsFrom(m_workspace->records()));
    refreshFitViews();
    showMessage(tr("%1 temperature %2 °C recorded (%3).")
                    .arg(entry->kind == TemperatureKind::Winding ? tr("Winding") : tr("Ambient"))
                    .arg(entry->celsius)
                    .arg(entry->source));
}

void MainWindow::addNote()
{
    if (!ensurePerson())
        return;
    const auto note = askReason(tr("Add a note"), tr("Note (kept with the session):"));
    if (!note || note->trimmed().isEmpty())
        return;
    const QString text = note->trimmed();
    const QString error = m_workspace->addNote(text);
    showMessage(error.isEmpty() ? tr("Note recorded.") : error, !error.isEmpty());
    const auto rows = m_readingsView->selectionModel()->selectedRows();
    if (error.isEmpty() && !rows.isEmpty())
        m_readingsModel->setNote(rows.front().row(), text);
}

} // namespace sagline
