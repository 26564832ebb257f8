// The review workspace for lab leads: open many saved sessions (files, or folders scanned in
// the background with progress and cancel), compare them in a sortable, filterable table with
// chosen columns grouped by design, see each design's statistics, far-from-batch flag and control
// chart (trend of R) for the selection, overlay
// the selected sessions' V–I data, read one session in full, sign sessions off (the only
// write, after confirmation) and export the comparison to CSV and a combined PDF.
#pragma once

#include "SessionComparison.h"
#include "SessionScan.h"
#include "SessionSignOff.h"

#include <QMainWindow>
#include <QThread>

class QComboBox;
class QDateEdit;
class QLabel;
class QLineEdit;
class QProgressBar;
class QTableView;
class QTabWidget;
class QAction;

namespace sagline {

class ReviewDetailView;
class ReviewFilterModel;
class ReviewOverlayChart;
class ReviewScanWorker;
class ReviewTableModel;
class ReviewTrendChart;

class ReviewWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit ReviewWindow(QWidget *parent = nullptr);
    ~ReviewWindow() override;

    // Scans files and folders in the background; rows appear as they load.
    void addInputs(const QStringList &paths);
    void cancelScan();
    bool isScanning() const { return m_worker != nullptr; }
    // Writes the sign-off of a table row (source row). `confirmed` false asks first.
    QString signOff(int sourceRow, const SignOffRequest &request, bool confirmed);
    QString exportCsv(const QString &path) const;
    QString exportPdf(const QString &path) const;
    void setColumnVisible(int column, bool visible);

    ReviewTableModel *model() const { return m_model; }
    ReviewFilterModel *filter() const { return m_filter; }
    QTableView *table() const { return m_table; }
    ReviewOverlayChart *overlay() const { return m_overlay; }
    ReviewDetailView *detail() const { return m_detail; }
    ReviewTrendChart *trend() const { return m_trend; }
    QTabWidget *tabs() const { return m_tabs; }
    QString summaryText() const;
    QString problemsText() const;
    QString statusText() const;

signals:
    void scanFinished();

private:
    void createActions();
    QWidget *createFilterBar();
    void handleRows(const std::vector<SessionRow> &rows);
    void handleProgress(int done, int total);
    void handleFinished(const std::vector<ScanProblem> &problems, bool cancelled);
    void selectionChanged();
    void updateSummary();
    void openFiles();
    void openFolder();
    void signOffSelected();
    void exportCsvDialog();
    void exportPdfDialog();
    std::vector<const SessionRow *> selectedOrVisibleRows() const;
    std::vector<int> selectedSourceRows() const;

    ComparisonOptions m_options;
    ReviewTableModel *m_model;
    ReviewFilterModel *m_filter;
    QTableView *m_table;
    QLineEdit *m_text;
    QComboBox *m_verdict;
    QDateEdit *m_from;
    QDateEdit *m_to;
    QLabel *m_summary;
    QLabel *m_problems;
    QLabel *m_status;
    QProgressBar *m_progress;
    QTabWidget *m_tabs;
    ReviewOverlayChart *m_overlay;
    ReviewDetailView *m_detail;
    ReviewTrendChart *m_trend;
    QAction *m_cancelAction = nullptr;
    QThread m_thread;
    ReviewScanWorker *m_worker = nullptr;
    QStringList m_queued;
    QStringList m_problemLines;
    QString m_reviewer;
};

} // namespace sagline
