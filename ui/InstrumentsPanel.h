// Where readings come from: the virtual bench (default), a serial port (listed ports, or a
// path typed in), a LAN address, or readings typed in by hand; and what is connected. On a
// serial port or the LAN one meter reads V and I, or it is the voltmeter and a separate
// ammeter has its own address (serial or LAN).
#pragma once

#include "SweepWorkspace.h"

#include <QWidget>

class QComboBox;
class QLabel;
class QLineEdit;
class QStackedWidget;

namespace sagline {

class InstrumentsPanel : public QWidget {
    Q_OBJECT
public:
    explicit InstrumentsPanel(QWidget *parent = nullptr);
    SourceChoice choice() const;
    void setChoice(const SourceChoice &choice);
    void setStatus(const QString &status);
    void setLocked(bool locked);
    QComboBox *sourceBox() const { return m_source; }
    QComboBox *portBox() const { return m_port; }
    QLineEdit *addressEdit() const { return m_address; }
    QLineEdit *ammeterEdit() const { return m_ammeter; }
    QString statusText() const;

signals:
    void choiceChanged();

private:
    void refreshPorts();
    void showAmmeterRow();
    QComboBox *m_source;
    QStackedWidget *m_details;
    QComboBox *m_port;
    QLineEdit *m_address;
    QWidget *m_ammeterRow; // serial and LAN only
    QLineEdit *m_ammeter;
    QLabel *m_status;
};

} // namespace sagline
