// The safety caution shown whenever the setup involves mains voltage, and the alarm banner for
// a hard stop from the sweep controller (names the limit and the reading).
#pragma once

#include <QWidget>

class QLabel;

namespace sagline {

class CautionStrip : public QWidget {
    Q_OBJECT
public:
    explicit CautionStrip(QWidget *parent = nullptr);

    // Shows the mains caution when the primary voltage is above extra-low voltage.
    void setPrimaryVoltage(double volts);
    // A hard stop: stays until clearAlarm(); text names the limit and the reading.
    void showAlarm(const QString &text);
    void clearAlarm();
    bool isAlarmShown() const;
    QString alarmText() const;
    bool isCautionShown() const;

private:
    QLabel *m_caution;
    QLabel *m_alarm;
};

} // namespace sagline
