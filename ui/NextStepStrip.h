// What to do next, readable from the bench: the step, the load to set, the voltage to expect
// with its 95 % prediction interval, and a large Record action (Ctrl+Enter, or Enter in the
// voltage field), with Pause and Stop. In typed-in mode it also holds the current and voltage
// fields; a refused entry shows its rule under the field.
#pragma once

#include <QWidget>

class QLabel;
class QPushButton;

namespace sagline {

class QuantityField;

class NextStepStrip : public QWidget {
    Q_OBJECT
public:
    explicit NextStepStrip(QWidget *parent = nullptr);

    void setInstruction(const QString &step, const QString &expectation);
    void setTypedEntry(bool typed);    // shows the I and V fields; otherwise Record confirms the load
    void setRecordNeeded(bool needed); // false when a programmable load steps itself
    void setRunning(bool running);     // enables Record/Pause/Stop
    void setPaused(bool paused);
    // "Paused for 2 min 10 s: link lost at step 3 ..." while the sweep waits; "" hides it.
    void setWaiting(const QString &text);
    QString waitingText() const;
    QuantityField *currentField() const { return m_current; }
    QuantityField *voltageField() const { return m_voltage; }
    QPushButton *recordButton() const { return m_record; }
    QPushButton *pauseButton() const { return m_pause; }
    QPushButton *stopButton() const { return m_stop; }
    QString instructionText() const;
    void clearEntry();

signals:
    void recordRequested();
    void pauseRequested();
    void stopRequested();

private:
    QLabel *m_step;
    QLabel *m_expect;
    QLabel *m_waiting;
    QuantityField *m_current;
    QuantityField *m_voltage;
    QWidget *m_entry;
    QPushButton *m_record;
    QPushButton *m_pause;
    QPushButton *m_stop;
    bool m_recordNeeded = true;
    bool m_running = false;
};

} // namespace sagline
