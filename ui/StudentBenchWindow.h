// The student's window for a supervised session: the bench's own views (the live V–I chart with
// fit and band, the residuals, the next-step strip with the current field before the voltage
// field and Enter moving on and recording, the results and the readings table), driven by the
// same SweepWorkspace as the bench in typed-in mode, with a lab sheet's locks and limits applied
// and explained. On the left: the sheets found in the lab-sheet folder, what the chosen sheet
// fixes and why, and the start: student, unit, safety checklist, and the supervisor's own
// confirmation (name, and the sheet's PIN when it asks for one). The session file is named from
// the student, the unit and the time, in the session folder. At the end: Close, or Next unit.
#pragma once

#include "DisplayPoints.h"
#include "LabSheetFolder.h"

#include <QMainWindow>
#include <QTimer>

#include <optional>
#include <vector>

class QCheckBox;
class QCloseEvent;
class QLabel;
class QLineEdit;
class QListWidget;
class QPushButton;
class QScrollArea;
class QTableView;

namespace sagline {

class CautionStrip;
class NextStepStrip;
class ReadingsTableModel;
class ResidualChart;
class ResultsPanel;
class SweepWorkspace;
class VoltageCurrentChart;

// What the student and the supervisor fill in before the first reading.
struct StudentStart {
    QString student;
    QString unitSerial;
    QString supervisor;
    QString supervisorPin;          // only when the sheet asks for one
};

class StudentBenchWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit StudentBenchWindow(QWidget *parent = nullptr);
    ~StudentBenchWindow() override;

    // Lists the *.json lab sheets in `folder` (unusable ones greyed, with their reason).
    void setSheetFolder(const QString &folder);
    void setSessionFolder(const QString &folder) { m_sessionFolder = folder; }
    QString sessionFolder() const { return m_sessionFolder; }
    // Chooses the n-th listed sheet; "" or why it cannot be used.
    QString chooseSheet(int index);
    int sheetCount() const;

    // The start, as the form does it (also for tests): "" or the field and the rule.
    void setChecklistTicked(int item, bool ticked);
    QString start(const StudentStart &start);
    // Types a reading into the strip's fields and records it as Enter would; "" when recorded.
    QString enterReading(const QString &current, const QString &voltage);
    // After the last step (or a stop): the same student and supervisor, the next transformer.
    void nextUnit();

    SweepWorkspace *workspace() const { return m_workspace; }
    NextStepStrip *nextStep() const { return m_nextStep; }
    VoltageCurrentChart *chart() const { return m_chart; }
    ResidualChart *residuals() const { return m_residuals; }
    ResultsPanel *results() const { return m_results; }
    ReadingsTableModel *readingsModel() const { return m_readingsModel; }
    QTableView *readingsView() const { return m_readingsView; }
    QList<QWidget *> lockedControls() const { return m_locked; }
    QPushButton *startButton() const { return m_start; }
    QPushButton *nextUnitButton() const { return m_nextUnit; }
    QPushButton *closeButton() const { return m_close; }
    QLineEdit *pinField() const { return m_pin; }
    QString messageText() const { return m_lastMessage; }
    void flushCharts();             // draw now (tests, screenshots)

protected:
    // Closing mid-session stops the sweep (recorded as stopped, as the bench window does), so the
    // review reads "stopped", not "interrupted" as after a crash.
    void closeEvent(QCloseEvent *event) override;

private:
    QWidget *createSheetPanel();
    void createLayout();
    void wireWorkspace();
    void showSheet();
    void refreshStartButton();
    void handleRecord();
    void handleReadingRecorded(int row);
    void refreshFitViews();
    void handleStep(int step, const QString &instruction);
    void handleRunningChanged(bool running);
    void recordSupervision(const StudentStart &start, bool pinChecked);
    void resetViews();
    void showMessage(const QString &text, bool error = false);

    SweepWorkspace *m_workspace;
    DisplayPoints m_points;
    CautionStrip *m_caution;
    NextStepStrip *m_nextStep;
    VoltageCurrentChart *m_chart;
    ResidualChart *m_residuals;
    ResultsPanel *m_results;
    ReadingsTableModel *m_readingsModel;
    QTableView *m_readingsView;
    QScrollArea *m_sheetScroll = nullptr; // the left panel: scrolled to Close and Next unit at the end
    QListWidget *m_sheetList;
    QLabel *m_folderLabel;
    QLabel *m_sheetTitle;
    QLabel *m_instructions;
    QWidget *m_lockBox;
    QList<QWidget *> m_locked;
    QLineEdit *m_student;
    QLineEdit *m_serial;
    QList<QCheckBox *> m_checks;
    QLineEdit *m_supervisor;
    QLineEdit *m_pin;
    QLabel *m_pinLabel;
    QPushButton *m_start;
    QPushButton *m_nextUnit;
    QPushButton *m_close;
    QLabel *m_message;
    QTimer m_resultsTimer;
    std::vector<LabSheetListing> m_sheets;
    std::optional<LabSheet> m_sheet;
    QString m_sessionFolder;
    QString m_lastMessage;
    bool m_pendingConfirmation = false; // a typed value far from the step's expectation was shown once
};

} // namespace sagline
