// Where readings come from: the virtual bench (default), a serial port (listed ports, or a
// path typed in, with baud rate, data bits, parity, stop bits and flow control), a LAN
// address, or readings typed in by hand; and what is connected. On a serial port or the LAN
// one meter reads V and I, or it is the voltmeter and a separate ammeter has its own address
// (serial or LAN); a programmable load may have one too. "Connect and test" shows each
// meter's *IDN? reply, its function and one live reading before a sweep.
#pragma once

#include "SweepWorkspace.h"

#include <QWidget>

class QComboBox;
class QLabel;
class QLineEdit;
class QPushButton;
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
    QLineEdit *loadEdit() const { return m_load; }
    QComboBox *baudBox() const { return m_baud; }
    QComboBox *dataBitsBox() const { return m_dataBits; }
    QComboBox *parityBox() const { return m_parity; }
    QComboBox *stopBitsBox() const { return m_stopBits; }
    QComboBox *flowBox() const { return m_flow; }
    QPushButton *testButton() const { return m_test; }
    QString statusText() const;
    // The outcome of Connect and test, shown under the button; "" clears it.
    void setTestResult(const QString &text, bool ok);
    QString testResultText() const;
    void setTesting(bool testing); // the button reads "Testing…" and is disabled meanwhile

signals:
    void choiceChanged();
    void testRequested();

private:
    void refreshPorts();
    void showAmmeterRow();
    QString serialFormat() const; // "9600,8N1,none" from the serial settings
    QComboBox *m_source;
    QStackedWidget *m_details;
    QComboBox *m_port;
    QLineEdit *m_address;
    QWidget *m_ammeterRow; // serial and LAN only
    QLineEdit *m_ammeter;
    QLineEdit *m_load;
    QComboBox *m_baud;
    QComboBox *m_dataBits;
    QComboBox *m_parity;
    QComboBox *m_stopBits;
    QComboBox *m_flow;
    QPushButton *m_test;
    QLabel *m_testResult;
    QLabel *m_status;
};

} // namespace sagline
