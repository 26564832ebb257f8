// SCPI over a serial port (RS-232, USB serial adapters, pseudo-terminals) with QSerialPort.
// Qt 6.4 floods ReadError when the other end goes away unless the port is closed in the
// error handler, and may hand back stale bytes right after open; both are handled here
// (QT-NOTES.md §2.2).
#pragma once

#include "ScpiLink.h"

#include <QSerialPort>

namespace sagline {

struct SerialSettings {
    QString portName;                                   // "ttyUSB0", "/dev/pts/3", "COM3"
    qint32 baudRate = 9600;
    QSerialPort::DataBits dataBits = QSerialPort::Data8;
    QSerialPort::Parity parity = QSerialPort::NoParity;
    QSerialPort::StopBits stopBits = QSerialPort::OneStop;
    QSerialPort::FlowControl flowControl = QSerialPort::NoFlowControl;
    QByteArray terminator = "\n";                       // appended to every command

    QString summary() const; // "9600 8N1", "115200 7E2 RTS/CTS"
};

class SerialLink final : public ScpiLink {
    Q_OBJECT
public:
    explicit SerialLink(const SerialSettings &settings, QObject *parent = nullptr);
    ~SerialLink() override;
    QString description() const override;
    const SerialSettings &settings() const { return m_settings; }

protected:
    void openTransport() override;
    void closeTransport() override;
    bool writeTransport(const QByteArray &bytes, QString *error) override;

private:
    void handleError(QSerialPort::SerialPortError error);

    SerialSettings m_settings;
    QSerialPort *m_port; // child of this
};

} // namespace sagline
