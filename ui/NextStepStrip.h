// What to do next, readable from the bench: the step, the load to set, the voltage to expect
// with its 95 % prediction interval, and a large Record action (Ctrl+Enter, or Enter in the
// voltage field), with Pause and Stop. In typed-in mode it also holds the current and voltage
// fields; a refused entry shows its rule under the field.
//
// The strip cannot be misread: while a step settles it counts the dwell down with Record
// disabled; paused or with a link lost it changes colour, says so in words above the step
// ("Paused — resume to continue at step 4", "Link lost at step 4 — recorded points are kept")
// and only the buttons that apply stay enabled. Record, Pause/Resume and Stop are QActions
// owned here and shared with the window's Sweep menu, so a menu item is enabled exactly when
// its button is.
#pragma once

#include <QWidget>

class QAction;
class QLabel;
class QPushButton;

namespace sagline {

// "Step 3 (plan steps 0–8)": numbered as the plan table numbers its steps, with the range rather
// than a count, so it never disagrees with "3 of 9 steps" recorded beside the verdict.
QString stepHeading(int step, int firstStep, int lastStep);

class QuantityField;

// Where the sweep is, as the strip shows it.
enum class StripState {
    Idle,       // no sweep running
    Ready,      // waiting for the operator: set the load (or type the reading), then Record
    Busy,       // connecting, setting a programmable load or reading the meters
    Settling,   // the dwell: the countdown runs, Record is disabled
    Paused,     // paused by the operator (or waiting for someone): Resume continues
    LinkLost,   // a meter's link is lost: the sweep resumes when it is back
};

class NextStepStrip : public QWidget {
    Q_OBJECT
public:
    explicit NextStepStrip(QWidget *parent = nullptr);

    void setInstruction(const QString &step, const QString &expectation);
    void setTypedEntry(bool typed);    // shows the I and V fields
    void setRecordNeeded(bool needed); // false when a programmable load steps itself
    void setRunning(bool running);     // enables Pause/Stop (and Record when the state allows it)
    void setPaused(bool paused);       // Pause reads Resume
    // The state and its words: `banner` is the line above the step ("Paused — ..."), `countdown`
    // the line under it ("Reading in 4 s"); "" hides either.
    void setSweepState(StripState state, const QString &banner = {}, const QString &countdown = {});
    StripState sweepState() const { return m_state; }
    QString bannerText() const;
    QString countdownText() const;
    // "Paused for 2 min 10 s: link lost at step 3 ..." while the sweep waits; "" hides it.
    void setWaiting(const QString &text);
    QString waitingText() const;
    QuantityField *currentField() const { return m_current; }
    QuantityField *voltageField() const { return m_voltage; }
    QPushButton *recordButton() const { return m_record; }
    QPushButton *pauseButton() const { return m_pause; }
    QPushButton *stopButton() const { return m_stop; }
    QAction *recordAction() const { return m_recordAction; }
    QAction *pauseAction() const { return m_pauseAction; }
    QAction *stopAction() const { return m_stopAction; }
    QString instructionText() const;
    void clearEntry();
    // Colours follow the desktop palette; call after it changes.
    void applyColours(bool dark);

signals:
    void recordRequested();
    void pauseRequested();
    void stopRequested();

private:
    void updateEnabled();

    QLabel *m_banner;
    QLabel *m_step;
    QLabel *m_expect;
    QLabel *m_countdown;
    QLabel *m_waiting;
    QuantityField *m_current;
    QuantityField *m_voltage;
    QWidget *m_entry;
    QAction *m_recordAction;
    QAction *m_pauseAction;
    QAction *m_stopAction;
    QPushButton *m_record;
    QPushButton *m_pause;
    QPushButton *m_stop;
    StripState m_state = StripState::Idle;
    bool m_recordNeeded = true;
    bool m_running = false;
    bool m_dark = false;
};

} // namespace sagline
