#include "MainWindow.h"

#include "CautionStrip.h"
#include "ElidedLabel.h"
#include "ChartStyle.h"
#include "FitPresentation.h"
#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "OutlierFlagText.h"
#include "PlanPanel.h"
#include "QuantityField.h"
#include "ReadingsTableModel.h"
#include "ReadingsTableView.h"
#include "EfficiencyChart.h"
#include "PrimarySideLines.h"
#include "ResidualChart.h"
#include "ResultsPanel.h"
#include "SessionBand.h"
#include "SetupForm.h"
#include "SweepRun.h"
#include "VerdictCompleteness.h"
#include "SweepWorkspace.h"
#include "VoltageCurrentChart.h"
#include "WheelGuard.h"

#include <QAction>
#include <QFileInfo>
#include <QApplication>
#include <QComboBox>
#include <QFileDialog>
#include <QHeaderView>
#include <QInputDialog>
#include <QMessageBox>
#include <QLabel>
#include <QMenuBar>
#include <QPushButton>
#include <QRegularExpression>
#include <QScrollArea>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>
#include <QVBoxLayout>

#include <algorithm>
#include <span>

namespace sagline {

namespace {

// "45 s", "2 min 10 s", "1 h 05 min": how long a paused sweep has waited.
QString formatWaited(std::int64_t milliseconds)
{
    const std::int64_t seconds = milliseconds / 1000;
    if (seconds < 60)
        return QObject::tr("%1 s").arg(seconds);
    if (seconds < 3600)
        return QObject::tr("%1 min %2 s").arg(seconds / 60).arg(seconds % 60, 2, 10, QLatin1Char('0'));
    return QObject::tr("%1 h %2 min").arg(seconds / 3600).arg((seconds % 3600) / 60, 2, 10, QLatin1Char('0'));
}
constexpr int bandGridPoints = 150; // the band is drawn on a grid, not one point per reading

} // namespace

MainWindow::MainWindow(QWidget *parent)
    : QMainWindow(parent), m_workspace(new SweepWorkspace(this)), m_caution(new CautionStrip),
      m_nextStep(new NextStepStrip), m_leftTabs(new QTabWidget), m_setupForm(new SetupForm),
      m_planPanel(new PlanPanel), m_instruments(new InstrumentsPanel), m_chart(new VoltageCurrentChart(m_points)),
      m_residuals(new ResidualChart(m_points)), m_efficiency(new EfficiencyChart),
      m_lowerCharts(new QTabWidget), m_results(new ResultsPanel), m_readingsModel(new ReadingsTableModel(this)),
      m_readingsView(new QTableView), m_mainSplitter(new QSplitter(Qt::Horizontal)),
      m_chartSplitter(new QSplitter(Qt::Vertical)), m_rightSplitter(new QSplitter(Qt::Vertical)),
      m_statusMessage(new ElidedLabel), m_statusSource(new ElidedLabel),
      m_statusSession(new ElidedLabel(Qt::ElideMiddle)), m_statusPoints(new QLabel), m_recentMenu(nullptr),
      m_band(new SessionBand)
{
    setWindowTitle(tr("Sagline: transformer load test"));
    setAcceptDrops(true);
    m_textPrompt = [this](const QString &title, const QString &label) -> std::optional<QString> {
        bool ok = false;
        const QString text = QInputDialog::getText(this, title, label, QLineEdit::Normal, QString(), &ok);
        return ok ? std::optional<QString>(text) : std::nullopt;
    };
    m_temperaturePrompt = [this]() -> std::optional<TemperatureEntry> {
        TemperatureDialog dialog(this);
        return dialog.exec() == QDialog::Accepted ? dialog.entry() : std::nullopt;
    };
    m_confirmPrompt = [this](const QString &title, const QString &text) {
        return QMessageBox::question(this, title, text, QMessageBox::Yes | QMessageBox::No, QMessageBox::No)
               == QMessageBox::Yes;
    };
    m_savePathPrompt = [this](const QString &title, const QString &suggested, const QString &filter) {
        return QFileDialog::getSaveFileName(this, title, suggested, filter);
    };
    createLayout();
    m_planPanel->setFieldLabels([this](const QString &key) {
        const QString label = m_setupForm->labelFor(key);
        return label.isEmpty() ? key : label;
    });
    createActions();
    wireWorkspace();
    guardWheelInside(this); // no combo or spin box changes under a scrolling wheel
    m_resultsTimer.setSingleShot(true);
    m_resultsTimer.setInterval(100);
    connect(&m_resultsTimer, &QTimer::timeout, this, &MainWindow::refreshFitViews);
    m_settingsTimer.setSingleShot(true);
    m_settingsTimer.setInterval(1000);
    connect(&m_settingsTimer, &QTimer::timeout, this, &MainWindow::storeAnalysisSettings);
    // The window never gives up on a paused sweep (its operator decides) but says how long it
    // has been waiting and why.
    // A quarter second keeps the dwell countdown's seconds even.
    m_waitingTimer.setInterval(250);
    connect(&m_waitingTimer, &QTimer::timeout, this, [this] {
        const SweepRun *run = m_workspace->run();
        const SweepController *controller = run ? run->controller() : nullptr;
        const std::int64_t waitedMs = controller ? controller->pausedForMs() : -1;
        m_nextStep->setWaiting(waitedMs < 0 ? QString()
                                            : tr("Paused for %1: %2").arg(formatWaited(waitedMs), controller->pauseReason()));
        showSweepState();
    });
    m_messageTimer.setSingleShot(true);
    connect(&m_messageTimer, &QTimer::timeout, this, [this] { m_statusMessage->setFullText(QString()); });
    m_waitingTimer.start();
    readSettings();
    applyColourScheme();
    handleSetupChanged();
}

MainWindow::~MainWindow() = default;

bool MainWindow::efficiencyOffered() const { return m_lowerCharts->isTabVisible(m_lowerCharts->indexOf(m_efficiency)); }

void MainWindow::createLayout()
{
    auto *setupScroll = new QScrollArea;
    setupScroll->setWidget(m_setupForm);
    setupScroll->setWidgetResizable(true);
    m_leftTabs->addTab(setupScroll, tr("&1 Setup"));
    m_leftTabs->addTab(m_planPanel, tr("&2 Plan"));
    m_leftTabs->addTab(m_instruments, tr("&3 Instruments"));

    // The efficiency chart shares the lower half with the residuals (a tab of its own) rather
    // than standing beside the V–I chart: side by side, the two charts and their legends made
    // the window wider than a 1366 px screen.
    m_lowerCharts->addTab(m_residuals, tr("Residuals"));
    m_lowerCharts->addTab(m_efficiency, tr("Efficiency and losses"));
    m_lowerCharts->setTabVisible(m_lowerCharts->indexOf(m_efficiency), false); // until a reading carries the primary power
    m_lowerCharts->setDocumentMode(true);
    m_chartSplitter->addWidget(m_chart);
    m_chartSplitter->addWidget(m_lowerCharts);
    m_chartSplitter->setStretchFactor(0, 3);
    m_chartSplitter->setStretchFactor(1, 2);

    setUpReadingsTable(m_readingsView, m_readingsModel);
    m_readingsView->setContextMenuPolicy(Qt::ActionsContextMenu);
    auto *resultsScroll = new QScrollArea;
    resultsScroll->setWidget(m_results);
    resultsScroll->setWidgetResizable(true);
    m_rightSplitter->addWidget(resultsScroll);
    m_rightSplitter->addWidget(m_readingsView);
    m_rightSplitter->setStretchFactor(0, 3);
    m_rightSplitter->setStretchFactor(1, 2);

    m_mainSplitter->addWidget(m_leftTabs);
    m_mainSplitter->addWidget(m_chartSplitter);
    m_mainSplitter->addWidget(m_rightSplitter);
    m_mainSplitter->setStretchFactor(0, 2);
    m_mainSplitter->setStretchFactor(1, 4);
    m_mainSplitter->setStretchFactor(2, 3);
    m_mainSplitter->setChildrenCollapsible(false);
    m_leftTabs->setMinimumWidth(400);
    m_rightSplitter->setMinimumWidth(readingsTableMinimumWidth(m_readingsView));
    m_mainSplitter->setSizes({460, 760, 480}); // replaced by the saved layout, if any
    m_rightSplitter->setSizes({670, 230});

    auto *central = new QWidget;
    auto *layout = new QVBoxLayout(central);
    layout->setContentsMargins(6, 6, 6, 0);
    layout->addWidget(m_caution);
    layout->addWidget(m_nextStep);
    layout->addWidget(m_band);
    layout->addWidget(m_mainSplitter, 1);
    setCentralWidget(central);

    // Messages on the left, the fields on the right; each is shortened with "…" (whole text in
    // its tooltip) rather than run into its neighbour.
    m_statusMessage->setObjectName(QStringLiteral("statusMessage"));
    m_statusSource->setMaximumWidth(360);
    m_statusSession->setMaximumWidth(420);
    statusBar()->addWidget(m_statusMessage, 1);
    statusBar()->addPermanentWidget(m_statusPoints);
    statusBar()->addPermanentWidget(m_statusSource);
    statusBar()->addPermanentWidget(m_statusSession);
    m_nextStep->setInstruction(tr("Complete the setup, then accept the plan"),
                               tr("The plan tab shows each load step, the recommended fuse and the limits."));
}

void MainWindow::wireWorkspace()
{
    connect(m_setupForm, &SetupForm::changed, this, &MainWindow::handleSetupChanged);
    connect(m_setupForm, &SetupForm::verdictChanged, this, &MainWindow::refreshFitViews);
    connect(m_setupForm, &SetupForm::verdictChanged, this, [this] {
        if (m_workspace->store())
            m_settingsTimer.start();
    });
    connect(m_workspace, &SweepWorkspace::planChanged, this, &MainWindow::handlePlanChanged);
    connect(m_planPanel, &PlanPanel::acceptRequested, this, &MainWindow::handleAccept);
    connect(m_planPanel, &PlanPanel::safeStepsRequested, this, &MainWindow::useSafeSteps);
    connect(m_planPanel, &PlanPanel::overrideRequested, this, &MainWindow::overrideLimits);
    connect(m_band, &SessionBand::reopenRequested, this, &MainWindow::reopenSession);
    connect(m_band, &SessionBand::resumeRequested, this, &MainWindow::resumeSession);
    connect(m_nextStep, &NextStepStrip::recordRequested, this, &MainWindow::handleRecord);
    connect(m_nextStep, &NextStepStrip::pauseRequested, m_workspace, &SweepWorkspace::pauseOrResume);
    connect(m_nextStep, &NextStepStrip::stopRequested, this, &MainWindow::confirmStop);
    connect(m_workspace, &SweepWorkspace::sweepStateChanged, this, &MainWindow::showSweepState);
    connect(m_workspace, &SweepWorkspace::readingRecorded, this, &MainWindow::handleReadingRecorded);
    connect(m_workspace, &SweepWorkspace::readingChanged, this, &MainWindow::handleReadingChanged);
    connect(m_workspace, &SweepWorkspace::fitChanged, this, [this] {
        if (!m_resultsTimer.isActive())
            m_resultsTimer.start();
    });
    connect(m_chart, &VoltageCurrentChart::currentSpanChanged, this, [this] {
        if (!m_resultsTimer.isActive())
            m_resultsTimer.start(); // the line and band are evaluated over the shown currents
    });
    connect(m_workspace, &SweepWorkspace::stepChanged, this, &MainWindow::handleStep);
    connect(m_workspace, &SweepWorkspace::safetyStopped, this, &MainWindow::handleSafetyStop);
    connect(m_workspace, &SweepWorkspace::notice, this, [this](const QString &text) { showMessage(text); });
    connect(m_workspace, &SweepWorkspace::runningChanged, this, &MainWindow::handleRunningChanged);
    const auto showSessionFile = [this] {
        m_statusSession->setFullText(m_workspace->store() ? tr("Session: %1").arg(m_workspace->sessionPath()) : QString());
        rebuildRecentMenu(); // a failed start removes the session file it had created
    };
    connect(m_workspace, &SweepWorkspace::sessionChanged, this, showSessionFile);
    connect(m_workspace, &SweepWorkspace::sessionChanged, this, &MainWindow::showSession);
    connect(m_workspace, &SweepWorkspace::sessionDiscarded, this, showSessionFile);
    connect(m_workspace, &SweepWorkspace::instrumentStatus, m_instruments, &InstrumentsPanel::setStatus);
    connect(m_workspace, &SweepWorkspace::instrumentStatus, this, [this](const QString &status) {
        // Always visible, whichever tab is open: "connected", "link lost at step 3", ...
        m_instrumentState = status.section(QLatin1Char('\n'), 0, 0).section(QLatin1Char(':'), 0, 0).trimmed();
        showSourceStatus();
    });
    connect(m_instruments, &InstrumentsPanel::testRequested, this, &MainWindow::testMeters);
    connect(m_instruments, &InstrumentsPanel::choiceChanged, this, [this] {
        m_nextStep->setTypedEntry(m_instruments->choice().source == ReadingSource::TypedIn);
        m_instrumentState.clear();
        showSourceStatus();
    });
    m_nextStep->setTypedEntry(m_instruments->choice().source == ReadingSource::TypedIn);
    showSourceStatus();
}

void MainWindow::showSourceStatus()
{
    const QString source = m_instruments->sourceBox()->currentText();
    m_statusSource->setFullText(m_instrumentState.isEmpty() ? source : tr("%1: %2").arg(source, m_instrumentState));
}

QString MainWindow::sourceStatusText() const { return m_statusSource->fullText(); }

void MainWindow::loadSetup(const Setup &setup) { m_setupForm->loadSetup(setup); }

void MainWindow::handleSetupChanged() { m_workspace->setSetupJson(m_setupForm->setupJson()); }

void MainWindow::handlePlanChanged()
{
    m_setupForm->showErrors(m_workspace->errors());
    const auto &plan = m_workspace->plan();
    m_planPanel->setPlan(plan);
    if (m_workspace->setup())
        m_caution->setPrimaryVoltage(m_workspace->setup()->nameplate.primaryVoltageV);
    if (plan && m_workspace->readings().empty()) {
        m_chart->setLimits(chartLimits(*plan, m_workspace->setup()->nameplate.ratedPowerVa));
        m_residuals->setCurrentSpan(plan->steps.empty() ? 0.0 : plan->steps.back().currentA);
    }
    const QString blocked = m_workspace->store() ? QString() : m_workspace->acceptRefusal();
    m_planPanel->setAcceptBlocked(plan ? blocked : QString(), plan && !m_workspace->unsafeSteps().empty() && !m_workspace->store());
    if (m_workspace->store())
        m_planPanel->acceptButton()->setEnabled(false); // a session is open: its plan was accepted already
    if (!plan && !m_workspace->errors().empty())
        showMessage(QString::fromStdString(m_workspace->errors().front().message()), true);
    else if (plan && !blocked.isEmpty())
        showMessage(blocked, true);
    else if (plan)
        showMessage(tr("Plan ready: %1 steps.").arg(plan->steps.size()));
}

void MainWindow::handleAccept()
{
    if (const QString blocked = m_workspace->acceptRefusal(); !blocked.isEmpty()) {
        showMessage(blocked, true);
        m_leftTabs->setCurrentIndex(1);
        return;
    }
    if (!ensurePerson())
        return;
    const QString before = m_lastMessage;
    const QString error = m_workspace->startSweep(m_setupForm->sessionDetails(), m_sessionFolder, m_instruments->choice());
    if (!error.isEmpty()) {
        showMessage(error, true);
        const qsizetype colon = error.indexOf(QLatin1Char(':'));
        m_setupForm->showErrors({{error.left(colon).toStdString(), error.mid(colon + 1).trimmed().toStdString()}});
        m_leftTabs->setCurrentIndex(0);
        return;
    }
    rememberRecent(m_workspace->sessionPath());
    storeAnalysisSettings(); // the new session is judged as the screen judges it
    m_planPanel->setAccepted(true);
    m_setupForm->setLocked(true);
    m_instruments->setLocked(true);
    m_caution->clearAlarm();
    if (m_workspace->isTypedIn())
        m_nextStep->clearEntry();
    if (m_lastMessage == before) // "Plan ready" no longer says where things are; a notice from the start stays
        showMessage(tr("Sweep started: recording into %1").arg(QFileInfo(m_workspace->sessionPath()).fileName()));
}

void MainWindow::storeAnalysisSettings()
{
    m_settingsTimer.stop();
    const QString problem = m_workspace->recordAnalysisSettings(m_setupForm->verdictSettings());
    if (!problem.isEmpty())
        showMessage(problem, true);
}

void MainWindow::handleRecord()
{
    if (!m_workspace->isTypedIn()) {
        m_workspace->confirmLoadSet(); // the meters take the reading
        return;
    }
    auto *current = m_nextStep->currentField();
    auto *voltage = m_nextStep->voltageField();
    current->setError(QString());
    voltage->setError(QString());
    TypedOutcome outcome = m_workspace->submitTyped(current->text(), voltage->text());
    if (!outcome.question.isEmpty()) {
        // A second look: the value and what the step expects, recorded only when confirmed.
        const bool aboutCurrent = outcome.confirmField == current->field();
        const QString question = tr("%1.\n\nRecord it as typed? It is then flagged \"confirmed\"; choose No to correct it.")
                                     .arg(outcome.question.left(1).toUpper() + outcome.question.mid(1));
        if (!m_confirmPrompt(tr("Check the typed value"), question)) {
            (aboutCurrent ? current : voltage)->setError(outcome.question);
            (aboutCurrent ? current : voltage)->lineEdit()->setFocus();
            showMessage(tr("Not recorded: %1").arg(outcome.question), true);
            return;
        }
        outcome = m_workspace->submitTyped(current->text(), voltage->text(), true);
    }
    const QString refusal = outcome.refusal;
    if (refusal.isEmpty()) {
        m_nextStep->clearEntry();
        return;
    }
    // The refusal names its field ("reading.current_a: ..."); show it under that field.
    const bool aboutCurrent = refusal.startsWith(current->field());
    const QString rule = refusal.mid(refusal.indexOf(QLatin1Char(':')) + 1).trimmed();
    (aboutCurrent ? current : voltage)->setError(rule);
    showMessage(refusal, true);
}

void MainWindow::handleReadingRecorded(int row)
{
    showRecordedReadings(row, row + 1);
    checkNoLoadReading(m_workspace->readings()[static_cast<std::size_t>(row)]);
}

void MainWindow::showRecordedReadings(int first, int end)
{
    const std::span<const Reading> readings(m_workspace->readings());
    const auto from = static_cast<std::size_t>(first);
    const auto count = static_cast<std::size_t>(end - first);
    m_readingsModel->append(readings.subspan(from, count)); // one row insert for all of them
    showReadingMarks(first, end);
    for (std::size_t row = from; row < from + count; ++row) {
        const Reading &reading = readings[row];
        m_points.add(static_cast<std::int64_t>(row), reading.currentA, reading.voltageV, reading.excluded);
    }
    m_chart->pointsChanged();
    m_residuals->pointsChanged();
    if (!m_resultsTimer.isActive())
        m_resultsTimer.start();
}

void MainWindow::handleReadingChanged(int row)
{
    const Reading &reading = m_workspace->readings()[static_cast<std::size_t>(row)];
    if (reading.superseded)
        m_readingsModel->setSuperseded(row, m_workspace->supersededReason(reading.id));
    else
        m_readingsModel->setExcluded(row, reading.excluded, reading.excluded ? m_workspace->exclusionReason(reading.id) : QString());
    if (m_points.setExcluded(row, reading.excluded)) {
        m_chart->rescale(); // the axes fit the included points again, so they may shrink
        m_residuals->pointsChanged();
    }
    refreshFitViews();
}

void MainWindow::refreshFitViews()
{
    m_resultsTimer.stop();
    const auto recorded = static_cast<int>(m_workspace->readings().size());
    m_statusPoints->setText(m_workspace->store() ? tr("%n point(s) recorded", nullptr, recorded) : QString());
    const LineFit &fit = m_workspace->liveFit();
    m_chart->setFitOverlay(fitOverlay(fit, m_chart->gridCurrents(bandGridPoints), m_workspace->nextCurrentA()));
    const auto result = fit.result();
    SweepWorkspace *workspace = m_workspace;
    auto residual = result.ok() ? ReadingsTableModel::ResidualFunction([workspace](double i, double v) {
        return workspace->residualOf(i, v);
    })
                                : ReadingsTableModel::ResidualFunction();
    m_residuals->setResidualFunction(residual, result.residualSd.value_or(0.0));
    m_readingsModel->setResidualFunction(residual);
    const SweepWorkspace::PrimarySideView &primary = m_workspace->primarySide();
    ResultsInputs inputs;
    inputs.live = &fit;
    inputs.batch = &m_workspace->summary();
    if (primary.supply.readingsWithVoltage > 0) {
        inputs.supply = &primary.supply;
        if (primary.supply.fitVoltages == FitVoltages::Referred && primary.fit.ok()) {
            inputs.referred = &primary.fit;
            inputs.batch = &primary.fit; // the outliers the results and the report name
        }
    }
    std::vector<QString> outlierTexts;
    for (std::size_t row : inputs.batch->outlierRows)
        outlierTexts.push_back(QString::fromStdString(outlierFlagText(*inputs.batch, row)));
    m_readingsModel->setOutliers(inputs.batch->outlierRows, outlierTexts);
    inputs.setup = m_workspace->setup() ? &*m_workspace->setup() : nullptr;
    inputs.plan = m_workspace->plan() ? &*m_workspace->plan() : nullptr;
    inputs.verdict = m_setupForm->verdictSettings();
    inputs.details = m_setupForm->sessionDetails();
    ResultsView view = resultsView(inputs);
    if (m_workspace->store())
        applyCompleteness(view, m_workspace->progress()); // "provisional (k of N steps)" until complete
    if (m_workspace->setup())
        view.lines += primarySideLines(primary.supply, primary.result);
    const bool showEfficiency = primary.result && primary.result->hasPowerMeter;
    m_lowerCharts->setTabVisible(m_lowerCharts->indexOf(m_efficiency), showEfficiency);
    if (showEfficiency)
        m_efficiency->setResult(primary.result, primary.fit,
                                inputs.plan && !inputs.plan->steps.empty() ? inputs.plan->steps.back().currentA : 0.0);
    m_results->setLines(view.lines);
    m_results->setVerdict(view.state, view.verdictText, view.verdictRule);
    m_results->setBudgets(view.budgets);
}

void MainWindow::flushCharts()
{
    // Twice at most: a chart whose current axis grew asks for the line and band again, on
    // the wider grid.
    for (int pass = 0; pass < 2; ++pass) {
        if (m_resultsTimer.isActive())
            refreshFitViews();
        m_chart->flushNow();
    }
    m_residuals->flushNow();
}

void MainWindow::handleStep(int step, const QString &instruction)
{
    const auto &plan = m_workspace->plan();
    QString heading = tr("Step %1").arg(step);
    if (plan && !plan->steps.empty())
        heading = stepHeading(step, plan->steps.front().index, plan->steps.back().index);
    m_nextStep->setInstruction(heading, instruction);
}

void MainWindow::handleSafetyStop(const QString &text)
{
    m_caution->showAlarm(text);
    QApplication::beep();
    showMessage(text, true);
}

void MainWindow::handleRunningChanged(bool running)
{
    const SweepRun *run = m_workspace->run();
    m_nextStep->setRecordNeeded(!(run && run->controller() && run->controller()->hasProgrammableLoad()));
    m_nextStep->setRunning(running);
    m_nextStep->setPaused(m_workspace->isPaused());
    if (!running) {
        m_planPanel->setAccepted(false);
        m_planPanel->acceptButton()->setEnabled(false);
        if (m_workspace->store()) {
            showSessionState();
            refreshFitViews(); // the verdict is no longer provisional
        } else { // a start that failed left no session: correct the setup or the address, accept again
            m_setupForm->setLocked(false);
            m_instruments->setLocked(false);
            m_planPanel->acceptButton()->setEnabled(m_workspace->acceptRefusal().isEmpty());
        }
    } else if (m_workspace->store()) {
        showSessionState();
        refreshFitViews(); // provisional from now on
    }
    showSweepState();
}

void MainWindow::showSweepState()
{
    const SweepRun *run = m_workspace->run();
    const SweepController *controller = run ? run->controller() : nullptr;
    if (!m_workspace->isRunning() || !controller) {
        m_nextStep->setSweepState(StripState::Idle);
        return;
    }
    const int step = controller->currentStep();
    m_nextStep->setPaused(controller->state() == SweepState::Paused && (m_workspace->isPaused() || !controller->isLinkDown()));
    if (run->isConnecting()) {
        m_nextStep->setSweepState(StripState::Busy, {}, tr("Connecting to the meters…"));
        return;
    }
    switch (controller->state()) {
    case SweepState::Paused:
        if (controller->isLinkDown())
            m_nextStep->setSweepState(StripState::LinkLost, tr("⚠ Link lost at step %1 — recorded points are kept").arg(step),
                                      tr("The sweep goes on at this step when the meters answer again."));
        else
            m_nextStep->setSweepState(StripState::Paused, tr("❚❚ Paused — resume to continue at step %1").arg(step));
        break;
    case SweepState::Settling: {
        const std::int64_t remainingMs = controller->settlingRemainingMs();
        // Tenths, as the dwell is given: "reading in 0.8 s of 1.2 s" (the strip updates every 250 ms).
        const double remainingS = static_cast<double>(std::max<std::int64_t>(0, remainingMs)) / 1000.0;
        const double dwellS = static_cast<double>(controller->options().dwellMs) / 1000.0;
        m_nextStep->setSweepState(StripState::Settling, {},
                                  tr("Settling: reading in %1 s of %2 s")
                                      .arg(QString::number(remainingS, 'f', 1), QString::number(dwellS, 'f', 1)));
        break;
    }
    case SweepState::SettingLoad:
        m_nextStep->setSweepState(StripState::Busy, {}, tr("Setting the programmable load…"));
        break;
    case SweepState::Measuring:
        m_nextStep->setSweepState(StripState::Busy, {}, tr("Reading the meters…"));
        break;
    case SweepState::WaitingForLoad:
    case SweepState::WaitingForEntry:
        m_nextStep->setSweepState(StripState::Ready);
        break;
    case SweepState::Idle:
    case SweepState::Finished:
    case SweepState::Stopped:
        m_nextStep->setSweepState(StripState::Idle);
        break;
    }
}

void MainWindow::confirmStop()
{
    if (!m_workspace->isRunning())
        return;
    if (!m_confirmPrompt(tr("Stop the sweep"),
                         tr("Stop the sweep now? Every recorded point stays in the session file; the session can be "
                            "resumed later at its next step.")))
        return;
    m_workspace->stop();
}

void MainWindow::applyColourScheme()
{
    const bool dark = isDarkPalette(palette());
    m_chart->applyColours(dark);
    m_residuals->applyColours(dark);
    m_efficiency->applyColours(dark);
    m_nextStep->applyColours(dark);
}

void MainWindow::changeEvent(QEvent *event)
{
    if (event->type() == QEvent::PaletteChange)
        applyColourScheme();
    QMainWindow::changeEvent(event);
}

QString MainWindow::withFieldLabels(const QString &text) const
{
    // Messages from core name fields by their setup-file keys ("bench.fuse_factor: ..."); the
    // window speaks the labels the person sees on the form instead.
    static const QRegularExpression key(QStringLiteral(
        "\\b(?:nameplate|bench|session|verdict|meters|specification|reading|instruments)(?:\\.[a-z0-9_]+)+"));
    QString spoken = text;
    QRegularExpressionMatchIterator matches = key.globalMatch(text);
    QList<QRegularExpressionMatch> found;
    while (matches.hasNext())
        found.prepend(matches.next()); // replaced from the end, so earlier offsets hold
    for (const QRegularExpressionMatch &match : found) {
        QString label = m_setupForm->labelFor(match.captured());
        if (label.isEmpty() && match.captured() == QLatin1String("reading.current_a"))
            label = tr("Current I");
        if (label.isEmpty() && match.captured() == QLatin1String("reading.voltage_v"))
            label = tr("Voltage V");
        if (label.isEmpty() && match.captured() == QLatin1String("instruments.serial_port"))
            label = tr("Meter port");
        if (label.isEmpty() && match.captured() == QLatin1String("instruments.lan_address"))
            label = tr("Meter address");
        if (!label.isEmpty())
            spoken.replace(match.capturedStart(), match.capturedLength(), label);
    }
    return spoken;
}

void MainWindow::showMessage(const QString &rawText, bool error)
{
    const QString text = withFieldLabels(rawText);
    m_lastMessage = text;
    // Every message expires: a problem stays long enough to be read (it is also shown where it
    // belongs, under its field or in the strip), news goes sooner. A newer message replaces it.
    m_statusMessage->setStyleSheet(error ? QStringLiteral("QLabel { color: #d55e00; font-weight: bold; }") : QString());
    m_statusMessage->setFullText(error ? QStringLiteral("✖ ") + text : text);
    m_messageTimer.start(error ? 20000 : 8000);
}

QString MainWindow::shownMessage() const { return m_statusMessage->fullText(); }

void MainWindow::resetViews()
{
    m_readingsModel->clear();
    m_points.clear();
    m_chart->pointsCleared();
    m_residuals->pointsCleared();
    m_results->setLines({});
    m_results->setVerdict(VerdictState::None, {}, {});
    m_results->setBudgets({});
    m_caution->clearAlarm();
    m_statusPoints->clear();
}

} // namespace sagline
