#include "StudentBenchWindow.h"

#include "CautionStrip.h"
#include "ChartStyle.h"
#include "FitPresentation.h"
#include "NextStepStrip.h"
#include "ReadingsTableModel.h"
#include "ReadingsTableView.h"
#include "ResidualChart.h"
#include "ResultsPanel.h"
#include "SweepWorkspace.h"
#include "VerdictCompleteness.h"
#include "VoltageCurrentChart.h"

#include <QCloseEvent>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QScrollArea>
#include <QSplitter>
#include <QStatusBar>
#include <QTableView>
#include <QVBoxLayout>

#include <span>

namespace sagline {

namespace {

constexpr int bandGridPoints = 150; // as the bench: the band on a grid, not one point per reading

} // namespace

StudentBenchWindow::StudentBenchWindow(QWidget *parent)
    : QMainWindow(parent), m_workspace(new SweepWorkspace(this)), m_caution(new CautionStrip),
      m_nextStep(new NextStepStrip), m_chart(new VoltageCurrentChart(m_points)), m_residuals(new ResidualChart(m_points)),
      m_results(new ResultsPanel), m_readingsModel(new ReadingsTableModel(this)), m_readingsView(new QTableView)
{
    setWindowTitle(tr("Sagline: supervised session"));
    createLayout();
    wireWorkspace();
    m_resultsTimer.setSingleShot(true);
    m_resultsTimer.setInterval(100);
    connect(&m_resultsTimer, &QTimer::timeout, this, &StudentBenchWindow::refreshFitViews);
    const bool dark = isDarkPalette(palette());
    m_chart->applyColours(dark);
    m_residuals->applyColours(dark);
    m_nextStep->setTypedEntry(true); // the sheet locks the bench to readings typed in by hand
    m_nextStep->setRunning(false);
    m_nextStep->setInstruction(tr("Choose a lab sheet"), tr("Then fill in “Before you start” with your supervisor."));
    resize(1500, 900);
}

StudentBenchWindow::~StudentBenchWindow() = default;

void StudentBenchWindow::createLayout()
{
    auto *sheetScroll = new QScrollArea;
    m_sheetScroll = sheetScroll;
    sheetScroll->setWidget(createSheetPanel());
    sheetScroll->setWidgetResizable(true);
    sheetScroll->setHorizontalScrollBarPolicy(Qt::ScrollBarAlwaysOff); // texts wrap to the panel's width
    sheetScroll->setMinimumWidth(380);

    auto *chartSplitter = new QSplitter(Qt::Vertical);
    chartSplitter->addWidget(m_chart);
    chartSplitter->addWidget(m_residuals);
    chartSplitter->setStretchFactor(0, 3);
    chartSplitter->setStretchFactor(1, 1);

    setUpReadingsTable(m_readingsView, m_readingsModel);
    auto *resultsScroll = new QScrollArea;
    resultsScroll->setWidget(m_results);
    resultsScroll->setWidgetResizable(true);
    auto *rightSplitter = new QSplitter(Qt::Vertical);
    rightSplitter->addWidget(resultsScroll);
    rightSplitter->addWidget(m_readingsView);
    rightSplitter->setStretchFactor(0, 3);
    rightSplitter->setStretchFactor(1, 2);
    rightSplitter->setMinimumWidth(readingsTableMinimumWidth(m_readingsView));

    auto *mainSplitter = new QSplitter(Qt::Horizontal);
    mainSplitter->addWidget(sheetScroll);
    mainSplitter->addWidget(chartSplitter);
    mainSplitter->addWidget(rightSplitter);
    mainSplitter->setStretchFactor(0, 2);
    mainSplitter->setStretchFactor(1, 4);
    mainSplitter->setStretchFactor(2, 3);
    mainSplitter->setChildrenCollapsible(false);
    mainSplitter->setSizes({420, 700, 460});

    auto *central = new QWidget;
    auto *layout = new QVBoxLayout(central);
    layout->setContentsMargins(6, 6, 6, 0);
    layout->addWidget(m_caution);
    layout->addWidget(m_nextStep);
    layout->addWidget(mainSplitter, 1);
    setCentralWidget(central);
}

void StudentBenchWindow::wireWorkspace()
{
    connect(m_nextStep, &NextStepStrip::recordRequested, this, &StudentBenchWindow::handleRecord);
    connect(m_nextStep, &NextStepStrip::pauseRequested, m_workspace, &SweepWorkspace::pauseOrResume);
    connect(m_nextStep, &NextStepStrip::stopRequested, m_workspace, &SweepWorkspace::stop);
    connect(m_workspace, &SweepWorkspace::readingRecorded, this, &StudentBenchWindow::handleReadingRecorded);
    connect(m_workspace, &SweepWorkspace::fitChanged, this, [this] {
        if (!m_resultsTimer.isActive())
            m_resultsTimer.start();
    });
    connect(m_chart, &VoltageCurrentChart::currentSpanChanged, this, [this] {
        if (!m_resultsTimer.isActive())
            m_resultsTimer.start();
    });
    connect(m_workspace, &SweepWorkspace::stepChanged, this, &StudentBenchWindow::handleStep);
    connect(m_workspace, &SweepWorkspace::safetyStopped, this, [this](const QString &text) {
        m_caution->showAlarm(text);
        showMessage(tr("Safety stop: %1. Switch the supply off and call your supervisor.").arg(text), true);
    });
    connect(m_workspace, &SweepWorkspace::notice, this, [this](const QString &text) { showMessage(text); });
    connect(m_workspace, &SweepWorkspace::runningChanged, this, &StudentBenchWindow::handleRunningChanged);
}

void StudentBenchWindow::handleReadingRecorded(int row)
{
    const std::span<const Reading> readings(m_workspace->readings());
    const Reading &reading = readings[static_cast<std::size_t>(row)];
    m_readingsModel->append(reading);
    m_points.add(static_cast<std::int64_t>(row), reading.currentA, reading.voltageV, reading.excluded);
    m_chart->pointsChanged();
    m_residuals->pointsChanged();
    if (!m_resultsTimer.isActive())
        m_resultsTimer.start();
}

void StudentBenchWindow::refreshFitViews()
{
    m_resultsTimer.stop();
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
            inputs.referred = &primary.fit; // the same results as the lab lead's window and the report
            inputs.batch = &primary.fit;
        }
    }
    m_readingsModel->setOutliers(inputs.batch->outlierRows);
    inputs.setup = m_workspace->setup() ? &*m_workspace->setup() : nullptr;
    inputs.plan = m_workspace->plan() ? &*m_workspace->plan() : nullptr;
    inputs.details.operatorName = m_student->text();
    inputs.details.unitSerial = m_serial->text();
    ResultsView view = resultsView(inputs);
    if (m_workspace->store())
        applyCompleteness(view, m_workspace->progress());
    m_results->setLines(view.lines);
    m_results->setVerdict(view.state, view.verdictText, view.verdictRule);
    m_results->setBudgets(view.budgets);
}

void StudentBenchWindow::flushCharts()
{
    for (int pass = 0; pass < 2; ++pass) {
        if (m_resultsTimer.isActive())
            refreshFitViews();
        m_chart->flushNow();
    }
    m_residuals->flushNow();
}

void StudentBenchWindow::handleStep(int step, const QString &instruction)
{
    // Numbered as the plan numbers its steps, as on the bench (step 0 is the open circuit).
    const auto &plan = m_workspace->plan();
    QString heading = tr("Step %1").arg(step);
    if (plan && !plan->steps.empty())
        heading = stepHeading(step, plan->steps.front().index, plan->steps.back().index);
    m_nextStep->setInstruction(heading, instruction);
}

void StudentBenchWindow::closeEvent(QCloseEvent *event)
{
    // Every reading is already committed; the stop is recorded before the window goes.
    if (m_workspace->isRunning())
        m_workspace->stop();
    event->accept();
}

void StudentBenchWindow::resetViews()
{
    m_readingsModel->clear();
    m_points.clear();
    m_chart->pointsCleared();
    m_residuals->pointsCleared();
    m_results->setLines({});
    m_results->setVerdict(VerdictState::None, {}, {});
    m_results->setBudgets({});
    m_caution->clearAlarm();
}

void StudentBenchWindow::showMessage(const QString &text, bool error)
{
    m_lastMessage = text;
    m_message->setText(text);
    statusBar()->showMessage(error ? QStringLiteral("✖ ") + text : text, error ? 0 : 8000);
}

} // namespace sagline
