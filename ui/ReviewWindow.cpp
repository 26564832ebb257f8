#include "ReviewWindow.h"


#include "ComparisonExport.h"
#include "NumberFormat.h"
#include "OutputFile.h"
#include "ReviewDetailView.h"
#include "ReviewFilterModel.h"
#include "ReviewOverlayChart.h"
#include "ReviewPdfExport.h"
#include "ReviewScanWorker.h"
#include "ReviewTableModel.h"
#include "ReviewTrendChart.h"
#include "SignOffDialog.h"

#include "ConformityDecision.h"

#include <QAction>
#include <QComboBox>
#include <QDateEdit>
#include <QDateTime>
#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QHBoxLayout>
#include <QHeaderView>
#include <QLabel>
#include <QLineEdit>
#include <QMenu>
#include <QMessageBox>
#include <QProgressBar>
#include <QScrollArea>
#include <QSplitter>
#include <QStatusBar>
#include <QTabWidget>
#include <QTableView>
#include <QToolBar>
#include <QToolButton>
#include <QVBoxLayout>

namespace sagline {

namespace {

const QDate anyDate(2000, 1, 1); // the date edits' "any" value

QString ohm(const std::optional<double> &value)
{
    return value ? QString::fromStdString(formatQuantity(*value, "Ω")) : QStringLiteral("—");
}

} // namespace

ReviewWindow::ReviewWindow(QWidget *parent)
    : QMainWindow(parent), m_model(new ReviewTableModel(this)), m_filter(new ReviewFilterModel(this)),
      m_table(new QTableView), m_text(new QLineEdit), m_verdict(new QComboBox), m_from(new QDateEdit), m_to(new QDateEdit),
      m_summary(new QLabel), m_problems(new QLabel), m_status(new QLabel), m_progress(new QProgressBar),
      m_tabs(new QTabWidget), m_overlay(new ReviewOverlayChart), m_detail(new ReviewDetailView),
      m_trend(new ReviewTrendChart)
{
    setWindowTitle(tr("Sagline review: compare and sign off sessions"));
    m_model->setReferenceTemperature(m_options.figures.referenceTemperatureC);
    m_filter->setSourceModel(m_model);
    m_table->setModel(m_filter);
    m_table->setSortingEnabled(true);
    // Grouped by design: units of one design next to each other, in the order they were loaded.
    m_table->sortByColumn(ReviewTableModel::Design, Qt::AscendingOrder);
    m_table->setSelectionBehavior(QAbstractItemView::SelectRows);
    m_table->setSelectionMode(QAbstractItemView::ExtendedSelection);
    m_table->setEditTriggers(QAbstractItemView::NoEditTriggers);
    m_table->setAlternatingRowColors(true);
    m_table->verticalHeader()->hide();
    m_table->horizontalHeader()->setSectionResizeMode(QHeaderView::ResizeToContents);
    m_table->horizontalHeader()->setStretchLastSection(true);
    for (int column : {ReviewTableModel::Instruments, ReviewTableModel::Rule})
        m_table->setColumnHidden(column, true); // on offer in the Columns menu
    m_summary->setTextFormat(Qt::RichText);
    m_summary->setWordWrap(true);
    m_summary->setAlignment(Qt::AlignTop | Qt::AlignLeft);
    m_problems->setWordWrap(true);
    m_problems->setTextFormat(Qt::PlainText);
    m_progress->setVisible(false);
    m_progress->setMaximumWidth(260);

    auto *summaryScroll = new QScrollArea;
    auto *summaryBox = new QWidget;
    auto *summaryLayout = new QVBoxLayout(summaryBox);
    summaryLayout->addWidget(m_summary);
    summaryLayout->addWidget(m_problems);
    summaryLayout->addStretch(1);
    summaryScroll->setWidget(summaryBox);
    summaryScroll->setWidgetResizable(true);
    summaryScroll->setMinimumWidth(300);
    m_tabs->addTab(m_overlay, tr("Overlay of selected sessions"));
    m_tabs->addTab(m_trend, tr("Trend per design (control chart)"));
    m_tabs->addTab(m_detail, tr("Session detail (read-only)"));
    auto *lower = new QSplitter(Qt::Horizontal);
    lower->addWidget(summaryScroll);
    lower->addWidget(m_tabs);
    lower->setStretchFactor(1, 1);
    auto *split = new QSplitter(Qt::Vertical);
    split->addWidget(m_table);
    split->addWidget(lower);
    split->setStretchFactor(0, 1);
    split->setStretchFactor(1, 1);
    // The table is what a lab lead reads first: at least seven sessions in view (it was squeezed
    // to three or four at 1366 x 768 by the charts' own minimum heights).
    m_table->setMinimumHeight(m_table->horizontalHeader()->sizeHint().height()
                              + 7 * m_table->verticalHeader()->defaultSectionSize() + 2 * m_table->frameWidth());

    auto *central = new QWidget;
    auto *layout = new QVBoxLayout(central);
    layout->addWidget(createFilterBar());
    layout->addWidget(split, 1);
    setCentralWidget(central);
    statusBar()->addWidget(m_status, 1);
    statusBar()->addPermanentWidget(m_progress);
    createActions();

    connect(m_table->selectionModel(), &QItemSelectionModel::selectionChanged, this, &ReviewWindow::selectionChanged);
    connect(m_table, &QTableView::clicked, this, [this](const QModelIndex &index) {
        m_detail->showSession(&m_model->sessionRow(m_filter->mapToSource(index).row()));
        m_tabs->setCurrentWidget(m_detail);
    });
    connect(m_filter, &QAbstractItemModel::rowsInserted, this, &ReviewWindow::updateSummary);
    connect(m_filter, &QAbstractItemModel::modelReset, this, &ReviewWindow::updateSummary);
    connect(m_filter, &QAbstractItemModel::layoutChanged, this, &ReviewWindow::updateSummary);
    m_thread.setObjectName(QStringLiteral("review-scan"));
    m_thread.start();
    m_status->setText(tr("Open session files or a folder to compare them. Files are opened read-only."));
    updateSummary();
    resize(1400, 900);
}

ReviewWindow::~ReviewWindow()
{
    if (m_worker)
        m_worker->cancel();
    m_thread.quit();
    m_thread.wait();
}

QWidget *ReviewWindow::createFilterBar()
{
    auto *bar = new QWidget;
    auto *row = new QHBoxLayout(bar);
    row->setContentsMargins(0, 0, 0, 0);
    m_text->setPlaceholderText(tr("Filter: unit, operator, instrument, file, lab sheet…"));
    m_text->setClearButtonEnabled(true);
    m_verdict->addItem(tr("every verdict"), QString());
    // The words people read (as in the table, the window and the reports); the tokens filter.
    for (ConformityOutcome outcome : {ConformityOutcome::Pass, ConformityOutcome::ConditionalPass,
                                      ConformityOutcome::ConditionalFail, ConformityOutcome::Fail,
                                      ConformityOutcome::NotJudged})
        m_verdict->addItem(QString::fromStdString(outcomeWords(outcome)), QString::fromStdString(toString(outcome)));
    m_verdict->addItem(QString::fromLatin1(noAnalysisWords), QStringLiteral("n/a"));
    m_verdict->addItem(tr("incomplete (no verdict)"), QStringLiteral("incomplete"));
    m_verdict->addItem(tr("unreadable"), QStringLiteral("unreadable"));
    for (QDateEdit *edit : {m_from, m_to}) {
        edit->setCalendarPopup(true);
        edit->setDisplayFormat(QStringLiteral("yyyy-MM-dd"));
        edit->setMinimumDate(anyDate);
        edit->setSpecialValueText(tr("any"));
        edit->setDate(anyDate);
    }
    row->addWidget(new QLabel(tr("Text")));
    row->addWidget(m_text, 2);
    row->addWidget(new QLabel(tr("Verdict")));
    row->addWidget(m_verdict);
    row->addWidget(new QLabel(tr("Date (UTC) from")));
    row->addWidget(m_from);
    row->addWidget(new QLabel(tr("to")));
    row->addWidget(m_to);
    connect(m_text, &QLineEdit::textChanged, m_filter, &ReviewFilterModel::setText);
    connect(m_verdict, &QComboBox::currentIndexChanged, this,
            [this] { m_filter->setVerdict(m_verdict->currentData().toString()); updateSummary(); });
    auto dates = [this] {
        m_filter->setDateRange(m_from->date() == anyDate ? QDate() : m_from->date(),
                               m_to->date() == anyDate ? QDate() : m_to->date());
        updateSummary();
    };
    connect(m_from, &QDateEdit::dateChanged, this, dates);
    connect(m_to, &QDateEdit::dateChanged, this, dates);
    connect(m_text, &QLineEdit::textChanged, this, &ReviewWindow::updateSummary);
    return bar;
}

void ReviewWindow::createActions()
{
    QToolBar *tools = addToolBar(tr("Review"));
    tools->setMovable(false);
    tools->addAction(tr("Open files…"), this, &ReviewWindow::openFiles);
    tools->addAction(tr("Open folder…"), this, &ReviewWindow::openFolder);
    m_cancelAction = tools->addAction(tr("Cancel scan"), this, &ReviewWindow::cancelScan);
    m_cancelAction->setEnabled(false);
    tools->addSeparator();
    auto *columns = new QMenu(tr("Columns"), this);
    for (int c = 0; c < ReviewTableModel::ColumnCount; ++c) {
        QAction *action = columns->addAction(m_model->headerData(c, Qt::Horizontal).toString());
        action->setCheckable(true);
        action->setChecked(!m_table->isColumnHidden(c));
        connect(action, &QAction::toggled, this, [this, c](bool on) { setColumnVisible(c, on); });
    }
    auto *columnsButton = new QToolButton;
    columnsButton->setText(tr("Columns"));
    columnsButton->setMenu(columns);
    columnsButton->setPopupMode(QToolButton::InstantPopup);
    tools->addWidget(columnsButton);
    tools->addSeparator();
    tools->addAction(tr("Sign off selected…"), this, &ReviewWindow::signOffSelected);
    tools->addSeparator();
    tools->addAction(tr("Export CSV…"), this, &ReviewWindow::exportCsvDialog);
    tools->addAction(tr("Export PDF…"), this, &ReviewWindow::exportPdfDialog);
}

void ReviewWindow::setColumnVisible(int column, bool visible)
{
    m_table->setColumnHidden(column, !visible);
}

void ReviewWindow::addInputs(const QStringList &paths)
{
    if (paths.isEmpty())
        return;
    if (m_worker) {
        m_queued += paths;
        return;
    }
    m_worker = new ReviewScanWorker(m_options);
    m_worker->moveToThread(&m_thread);
    connect(&m_thread, &QThread::finished, m_worker, &QObject::deleteLater);
    connect(m_worker, &ReviewScanWorker::rowsLoaded, this, &ReviewWindow::handleRows);
    connect(m_worker, &ReviewScanWorker::progress, this, &ReviewWindow::handleProgress);
    connect(m_worker, &ReviewScanWorker::finished, this, &ReviewWindow::handleFinished);
    connect(m_worker, &ReviewScanWorker::filesFound, this,
            [this](int count) { m_status->setText(tr("Opening %n session file(s) read-only…", "", count)); });
    m_progress->setRange(0, 0);
    m_progress->setVisible(true);
    m_cancelAction->setEnabled(true);
    m_status->setText(tr("Looking for session files…"));
    ReviewScanWorker *worker = m_worker;
    QMetaObject::invokeMethod(worker, [worker, paths] { worker->scan(paths); }, Qt::QueuedConnection);
}

void ReviewWindow::cancelScan()
{
    m_queued.clear();
    if (m_worker)
        m_worker->cancel();
}

void ReviewWindow::handleRows(const std::vector<SessionRow> &rows)
{
    m_model->appendRows(rows);
}

void ReviewWindow::handleProgress(int done, int total)
{
    m_progress->setRange(0, total);
    m_progress->setValue(done);
}

void ReviewWindow::handleFinished(const std::vector<ScanProblem> &problems, bool cancelled)
{
    if (m_worker) {
        m_worker->deleteLater();
        m_worker = nullptr;
    }
    for (const ScanProblem &p : problems)
        m_problemLines << tr("%1: %2").arg(QString::fromStdString(p.path), QString::fromStdString(p.reason));
    m_progress->setVisible(false);
    m_cancelAction->setEnabled(false);
    m_status->setText(cancelled ? tr("Scan cancelled: %n session(s) loaded.", "", m_model->rowCount())
                                : tr("%n session(s) loaded, read-only.", "", m_model->rowCount()));
    updateSummary();
    if (!m_queued.isEmpty()) {
        const QStringList next = m_queued;
        m_queued.clear();
        addInputs(next);
        return;
    }
    emit scanFinished();
}

std::vector<int> ReviewWindow::selectedSourceRows() const
{
    std::vector<int> rows;
    for (const QModelIndex &index : m_table->selectionModel()->selectedRows())
        rows.push_back(m_filter->mapToSource(index).row());
    std::sort(rows.begin(), rows.end());
    return rows;
}

std::vector<const SessionRow *> ReviewWindow::selectedOrVisibleRows() const
{
    std::vector<const SessionRow *> rows;
    const std::vector<int> selected = selectedSourceRows();
    if (!selected.empty()) {
        for (int row : selected)
            rows.push_back(&m_model->sessionRow(row));
        return rows;
    }
    for (int r = 0; r < m_filter->rowCount(); ++r)
        rows.push_back(&m_model->sessionRow(m_filter->mapToSource(m_filter->index(r, 0)).row()));
    return rows;
}

void ReviewWindow::selectionChanged()
{
    std::vector<const SessionRow *> rows;
    for (int row : selectedSourceRows())
        rows.push_back(&m_model->sessionRow(row));
    m_overlay->setSessions(rows);
    updateSummary();
}

void ReviewWindow::updateSummary()
{
    const bool selection = !selectedSourceRows().empty();
    const auto rows = selectedOrVisibleRows();
    const BatchStatistics s = summarizeBatch(rows);
    const QString basis = s.atReferenceTemperature ? tr("at %1 °C").arg(m_options.figures.referenceTemperatureC)
                                                   : tr("as measured");
    QString text = tr("<b>%1: %2 session(s) of %n design(s)</b>", "", static_cast<int>(s.designs.size()))
                       .arg(selection ? tr("Selection") : tr("Shown"))
                       .arg(s.sessions);
    if (s.designs.size() > 1)
        text += tr("<br><i>Statistics, far-from-batch marks and control limits are per design, never across designs.</i>");
    for (const DesignStatistics &d : s.designs) {
        QString far;
        for (std::size_t index : d.rows)
            if (s.isFarFromBatch(index))
                far += (far.isEmpty() ? QString() : QStringLiteral(", ")) + QString::fromStdString(rows[index]->unitSerial);
        QString limits;
        if (d.chart.hasLimits())
            limits = tr("control limits %1 to %2 (%n outside)", "", static_cast<int>(d.chart.outside.size()))
                         .arg(ohm(d.chart.lower), ohm(d.chart.upper));
        else
            limits = QString::fromStdString(d.chart.note).toHtmlEscaped();
        text += tr("<hr><b>%1</b> (%2 session(s))<br>"
                   "R %3 (%4): mean %5, standard deviation %6, median %7, range %8 to %9<br>"
                   "%10<br><b>Far from the batch:</b> %11<br><small>%12</small>")
                    .arg(QString::fromStdString(d.design).toHtmlEscaped())
                    .arg(d.rows.size())
                    .arg(basis)
                    .arg(QString::fromStdString(unitsInStatisticsText(d)).toHtmlEscaped())
                    .arg(ohm(d.meanOhm), ohm(d.sdOhm), ohm(d.medianOhm), ohm(d.minOhm), ohm(d.maxOhm))
                    .arg(limits, far.isEmpty() ? tr("none") : far.toHtmlEscaped(),
                         QString::fromStdString(d.ruleNote).toHtmlEscaped());
    }
    text += tr("<hr>Verdicts: %1<br>"
               "Reviewer's decisions: accepted %2, rejected %3, retest %4, unreviewed %5, changed after sign-off %6<br>"
               "Safety stops in %7 · incomplete %8 · lab-sheet limit hit in %9 · unreadable %10")
                .arg(QString::fromStdString(verdictCountsText(s)).toHtmlEscaped())
                .arg(s.accepted).arg(s.rejected).arg(s.retest).arg(s.notReviewed).arg(s.changedAfterSignOff)
                .arg(s.safetyStopped).arg(s.incomplete).arg(s.limitHit).arg(s.unreadable);
    m_summary->setText(text);
    m_trend->setBatch(rows, s, m_options.figures.referenceTemperatureC);
    QStringList unreadable = m_problemLines;
    for (const SessionRow &row : m_model->rows())
        if (!row.opened)
            unreadable << tr("%1: %2").arg(QString::fromStdString(row.path), QString::fromStdString(row.problem));
    m_problems->setText(unreadable.isEmpty() ? QString() : tr("Not compared:\n") + unreadable.join(QLatin1Char('\n')));
}

QString ReviewWindow::summaryText() const { return m_summary->text(); }
QString ReviewWindow::problemsText() const { return m_problems->text(); }
QString ReviewWindow::statusText() const { return m_status->text(); }

void ReviewWindow::openFiles()
{
    addInputs(QFileDialog::getOpenFileNames(this, tr("Open sessions for review"), QString(),
                                            tr("Sagline sessions (*.sagline);;All files (*)")));
}

void ReviewWindow::openFolder()
{
    const QString folder = QFileDialog::getExistingDirectory(this, tr("Scan a folder for sessions"));
    if (!folder.isEmpty())
        addInputs({folder});
}

QString ReviewWindow::signOff(int sourceRow, const SignOffRequest &request, bool confirmed)
{
    if (sourceRow < 0 || sourceRow >= m_model->rowCount())
        return tr("no session selected");
    const SessionRow &row = m_model->sessionRow(sourceRow);
    if (!confirmed) {
        const auto answer = QMessageBox::question(
            this, tr("Write the sign-off?"),
            tr("Add this sign-off to %1?\n\n%2 by %3\n\nIt is written into the session file as a new review record "
               "with the UTC time. The readings and every other record stay unchanged.")
                .arg(QString::fromStdString(row.path), QString::fromLatin1(toString(request.decision)),
                     QString::fromStdString(request.reviewer)));
        if (answer != QMessageBox::Yes)
            return tr("not signed: cancelled");
    }
    const auto written = signOffSession(row.path, request);
    if (!written.ok())
        return QString::fromStdString(written.message);
    m_reviewer = QString::fromStdString(request.reviewer);
    m_model->replaceRow(sourceRow, loadSessionRow(row.path, m_options));
    m_detail->showSession(&m_model->sessionRow(sourceRow));
    updateSummary();
    m_status->setText(tr("Signed %1 as %2.").arg(QFileInfo(QString::fromStdString(row.path)).fileName(),
                                                  QString::fromLatin1(toString(request.decision))));
    return {};
}

void ReviewWindow::signOffSelected()
{
    const auto rows = selectedSourceRows();
    if (rows.size() != 1) {
        QMessageBox::information(this, tr("Sign off"), tr("Select exactly one session to sign off."));
        return;
    }
    const SessionRow &row = m_model->sessionRow(rows.front());
    SignOffDialog dialog(QString::fromStdString(row.unitSerial), m_reviewer, this);
    if (dialog.exec() != QDialog::Accepted)
        return;
    const QString problem = signOff(rows.front(), dialog.request(), false);
    if (!problem.isEmpty() && !problem.startsWith(tr("not signed")))
        QMessageBox::warning(this, tr("Sign-off not written"), problem);
}

QString ReviewWindow::exportCsv(const QString &path) const
{
    std::vector<SessionRow> rows;
    for (const SessionRow *row : selectedOrVisibleRows())
        rows.push_back(*row);
    const std::string csv = comparisonCsv(rows, summarizeBatch(rows));
    return writeOutputFile(path, QByteArray::fromStdString(csv));
}

QString ReviewWindow::exportPdf(const QString &path) const
{
    ReportOptions options;
    options.producedBy = QStringLiteral("Sagline review");
    options.generatedUtc = QDateTime::currentDateTimeUtc().toString(Qt::ISODate);
    return writeReviewPdf(selectedOrVisibleRows(), m_options, path, options);
}

void ReviewWindow::exportCsvDialog()
{
    const QString path = QFileDialog::getSaveFileName(this, tr("Export the comparison"), QStringLiteral("review.csv"),
                                                      tr("CSV (*.csv)"));
    if (path.isEmpty())
        return;
    const QString problem = exportCsv(path);
    problem.isEmpty() ? m_status->setText(tr("Wrote %1").arg(path)) : (void)QMessageBox::warning(this, tr("Export"), problem);
}

void ReviewWindow::exportPdfDialog()
{
    const QString path = QFileDialog::getSaveFileName(this, tr("Combined PDF"), QStringLiteral("review.pdf"), tr("PDF (*.pdf)"));
    if (path.isEmpty())
        return;
    const QString problem = exportPdf(path);
    problem.isEmpty() ? m_status->setText(tr("Wrote %1").arg(path)) : (void)QMessageBox::warning(this, tr("Export"), problem);
}

} // namespace sagline
