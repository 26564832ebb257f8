// The live sweep workspace: setup and plan on the left, the V–I and residual charts in the
// middle, results and readings on the right, the caution strip and the next-step strip on
// top. It builds and wires the panels; SweepWorkspace (and through it core and the
// instruments layer) does the work.
#pragma once

#include "DisplayPoints.h"
#include "SessionSummary.h"
#include "SweepWorkspace.h"
#include "TemperatureDialog.h"
#include "Setup.h"

#include <QMainWindow>

#include <functional>
#include <optional>
#include <QStringList>
#include <QTimer>

class QAction;
class QLabel;
class QMenu;
class QSplitter;
class QTabWidget;
class QTableView;

namespace sagline {

class CautionStrip;
class ElidedLabel;
class MeterCheck;
class InstrumentsPanel;
class NextStepStrip;
class PlanPanel;
class ReadingsTableModel;
class ResidualChart;
class EfficiencyChart;
class ResultsPanel;
class SessionBand;
class SetupForm;
class SweepWorkspace;
class VoltageCurrentChart;


class MainWindow : public QMainWindow {
    Q_OBJECT
public:
    explicit MainWindow(QWidget *parent = nullptr);
    ~MainWindow() override;

    void loadSetup(const Setup &setup);
    // The setup File > New session starts from (the program's starting setup); without one,
    // New starts from a blank form.
    void setDefaultSetup(const Setup &setup);
    // Asks for text (the person's name, a reason): nothing when cancelled. Replaceable so that
    // tests answer instead of a person.
    using TextPrompt = std::function<std::optional<QString>(const QString &title, const QString &label)>;
    void setTextPrompt(TextPrompt prompt) { m_textPrompt = std::move(prompt); }
    // Readings → Record a temperature: the dialog by default; tests answer it themselves.
    using TemperaturePrompt = std::function<std::optional<TemperatureEntry>()>;
    void setTemperaturePrompt(TemperaturePrompt prompt) { m_temperaturePrompt = std::move(prompt); }
    // Asks yes or no (a typed value far from what the step expects). Replaceable for tests.
    using ConfirmPrompt = std::function<bool(const QString &title, const QString &text)>;
    void setConfirmPrompt(ConfirmPrompt prompt) { m_confirmPrompt = std::move(prompt); }
    // The person making changes in this session, when known beforehand (a demo); otherwise
    // the window asks once per session, at the first change.
    void setPerson(const QString &person);
    // Where new session files go (default: the user's documents folder, "Sagline sessions").
    void setSessionFolder(const QString &folder);
    bool openSessionFile(const QString &path);
    void applyColourScheme();
    // Writes the PDF report of the open session; "" or the reason it failed.
    QString writeReport(const QString &pdfPath);
    // Pushes pending chart updates now (the timers do it ~10 times a second).
    void flushCharts();

    SweepWorkspace *workspace() const { return m_workspace; }
    SetupForm *setupForm() const { return m_setupForm; }
    PlanPanel *planPanel() const { return m_planPanel; }
    InstrumentsPanel *instrumentsPanel() const { return m_instruments; }
    NextStepStrip *nextStep() const { return m_nextStep; }
    VoltageCurrentChart *chart() const { return m_chart; }
    ResidualChart *residualChart() const { return m_residuals; }
    EfficiencyChart *efficiencyChart() const { return m_efficiency; }
    QTabWidget *lowerCharts() const { return m_lowerCharts; }           // residuals | efficiency and losses
    bool efficiencyOffered() const;                                    // its tab is shown (readings carry primary power)
    ResultsPanel *results() const { return m_results; }
    CautionStrip *caution() const { return m_caution; }
    SessionBand *sessionBand() const { return m_band; }
    QString pointsStatusText() const; // the status bar's "N point(s) recorded"
    ReadingsTableModel *readingsModel() const { return m_readingsModel; }
    QTableView *readingsView() const { return m_readingsView; }
    QString lastMessage() const { return m_lastMessage; }  // the latest message, even after it expired
    QString shownMessage() const;                          // the message on display now ("" once expired)
    ElidedLabel *messageLabel() const { return m_statusMessage; }
    QString sourceStatusText() const; // the status bar's source and meter status
    QMenu *recentMenu() const { return m_recentMenu; }
    QMenu *sweepMenu() const { return m_sweepMenu; }
    // Exclude, restore, note and retake: enabled only while the open session can change (not
    // signed off, not open read-only).
    const QList<QAction *> &changeActions() const { return m_changeActions; }
    // Asks where to save (a save dialog): "" when cancelled. Replaceable for tests.
    using SavePathPrompt = std::function<QString(const QString &title, const QString &suggested, const QString &filter)>;
    void setSavePathPrompt(SavePathPrompt prompt) { m_savePathPrompt = std::move(prompt); }
    // Writes the open session's readings as CSV (core's session export: shortest round-trip
    // digits, exclusion reasons and who excluded). A path without an extension gets ".csv";
    // another extension is refused. "" or the reason nothing was written.
    QString exportCsvTo(const QString &path);
    QStringList recentFiles() const { return m_recentFiles; } // newest first; existing files only
    // Setup files in the CLI's format (DESIGN.md). Opening one closes the open session (a
    // running sweep is stopped only when the person agrees) and fills the form; saving writes
    // the form's setup as core reads it, refused with the fields named when it does not read.
    // "" or the reason.
    QString openSetupFile(const QString &path);
    QString saveSetupFile(const QString &path);
    QStringList recentSetups() const { return m_recentSetups; } // newest first; existing files only
    // Nameplates kept under a name in the user's settings, for units tested often.
    QString saveNameplatePreset(const QString &name); // "" or why not
    bool applyNameplatePreset(const QString &name);
    QStringList nameplatePresets() const;

protected:
    void closeEvent(QCloseEvent *event) override;
    void changeEvent(QEvent *event) override;
    void dragEnterEvent(QDragEnterEvent *event) override;
    void dropEvent(QDropEvent *event) override;

private:
    void createLayout();
    void createActions();
    void readSettings();
    void writeSettings() const;
    void wireWorkspace();

    void handleSetupChanged();
    void handlePlanChanged();
    void handleAccept();
    void storeAnalysisSettings(); // the verdict settings into the open session (a note)
    void handleRecord();
    void handleReadingRecorded(int row);
    void showRecordedReadings(int first, int end); // rows [first, end) into the table and charts
    void handleReadingChanged(int row);
    void refreshFitViews();
    void showSourceStatus();
    void handleStep(int step, const QString &instruction);
    void handleSafetyStop(const QString &text);
    void handleRunningChanged(bool running);
    void showSweepState(); // the strip's state, banner, countdown and buttons from the controller
    void testMeters();     // Connect and test (ui/MainWindowInstruments.cpp)
    void checkNoLoadReading(const Reading &reading);
    void confirmStop();
    void excludeSelected();
    void restoreSelected();
    void addNote();
    void recordTemperature();
    void retakeSelected();
    void resetViews();

    // The one place a session reaches the views: every field, label and chart is set from the
    // workspace's session (its file) or, with none open, from the defaults.
    void showSession();
    // The parts that change while a session is open: the band, the header, Accept, the verdict.
    void showSessionState();
    void showReadingMarks(int first, int end); // exclusion and retake reasons on table rows
    bool ensurePerson();                        // asks once per session; false when cancelled
    std::optional<QString> askReason(const QString &title, const QString &label);
    void reopenSession();
    void resumeSession();
    void useSafeSteps();
    void overrideLimits();
    // Setup files and nameplate presets (ui/MainWindowSetupFiles.cpp).
    void openSetupDialog();
    void saveSetupDialog();
    void rebuildSetupMenus();
    void savePresetDialog();

    void newSession();
    void openSessionDialog();
    void saveCopyAs();
    void exportCsv();
    void reportPdf();
    ReviewOptions reviewOptions() const; // the verdict settings on the form, for exports and the report
    void rememberRecent(const QString &path);
    void rebuildRecentMenu();
    void showMessage(const QString &text, bool error = false);
    QString withFieldLabels(const QString &text) const; // setup-file keys replaced by the form's labels

    SweepWorkspace *m_workspace;
    CautionStrip *m_caution;
    NextStepStrip *m_nextStep;
    QTabWidget *m_leftTabs;
    SetupForm *m_setupForm;
    PlanPanel *m_planPanel;
    InstrumentsPanel *m_instruments;
    DisplayPoints m_points; // what both charts draw, sorted once for both
    VoltageCurrentChart *m_chart;
    ResidualChart *m_residuals;
    EfficiencyChart *m_efficiency;   // a tab beside the residuals, shown once readings carry primary power
    QTabWidget *m_lowerCharts;       // under the V–I chart: the residuals, the efficiency and losses
    ResultsPanel *m_results;
    ReadingsTableModel *m_readingsModel;
    QTableView *m_readingsView;
    QSplitter *m_mainSplitter;
    QSplitter *m_chartSplitter;
    QSplitter *m_rightSplitter;
    ElidedLabel *m_statusMessage; // transient messages: they expire, and never cover the fields
    QTimer m_messageTimer;
    ElidedLabel *m_statusSource;
    QString m_instrumentState; // the meters' last status word, shown beside the source
    ElidedLabel *m_statusSession;
    QLabel *m_statusPoints;
    QMenu *m_recentMenu;
    QMenu *m_sweepMenu = nullptr;
    QList<QAction *> m_changeActions;
    SavePathPrompt m_savePathPrompt;
    MeterCheck *m_meterCheck = nullptr; // the last Connect and test (child of the window)
    QStringList m_recentFiles;
    QStringList m_recentSetups;
    QMenu *m_recentSetupsMenu = nullptr;
    QMenu *m_presetsMenu = nullptr;
    QString m_sessionFolder;
    QString m_lastMessage;
    QTimer m_resultsTimer;
    QTimer m_settingsTimer; // stores the verdict settings once typing pauses, not per keystroke
    QTimer m_waitingTimer;  // while the sweep is paused: how long it has waited, every second
    bool m_resultsPending = false;
    SessionBand *m_band;
    SourceChoice m_defaultChoice; // the instruments a new session starts with (the saved preference)
    std::optional<Setup> m_defaultSetup;
    TextPrompt m_textPrompt;
    TemperaturePrompt m_temperaturePrompt;
    ConfirmPrompt m_confirmPrompt;
};

} // namespace sagline
