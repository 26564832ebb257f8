#include "SerialLink.h"

#include <QMetaEnum>

namespace sagline {

QString SerialSettings::summary() const
{
    QString parityLetter = QStringLiteral("N");
    switch (parity) {
    case QSerialPort::EvenParity: parityLetter = QStringLiteral("E"); break;
    case QSerialPort::OddParity: parityLetter = QStringLiteral("O"); break;
    case QSerialPort::SpaceParity: parityLetter = QStringLiteral("S"); break;
    case QSerialPort::MarkParity: parityLetter = QStringLiteral("M"); break;
    default: break;
    }
    const QString stop = stopBits == QSerialPort::TwoStop ? QStringLiteral("2")
                         : stopBits == QSerialPort::OneAndHalfStop ? QStringLiteral("1.5")
                                                                     : QStringLiteral("1");
    QString text = QStringLiteral("%1 %2%3%4").arg(baudRate).arg(static_cast<int>(dataBits)).arg(parityLetter, stop);
    if (flowControl == QSerialPort::HardwareControl)
        text += QStringLiteral(" RTS/CTS");
    else if (flowControl == QSerialPort::SoftwareControl)
        text += QStringLiteral(" XON/XOFF");
    return text;
}

SerialLink::SerialLink(const SerialSettings &settings, QObject *parent)
    : ScpiLink(parent), m_settings(settings), m_port(new QSerialPort(this))
{
    setWriteTerminator(settings.terminator);
    connect(m_port, &QSerialPort::readyRead, this, [this] { bytesReceived(m_port->readAll()); });
    connect(m_port, &QSerialPort::errorOccurred, this, &SerialLink::handleError);
}

SerialLink::~SerialLink()
{
    if (m_port->isOpen())
        m_port->close();
}

QString SerialLink::description() const
{
    return QStringLiteral("serial %1 %2").arg(m_settings.portName, m_settings.summary());
}

void SerialLink::openTransport()
{
    m_port->setPortName(m_settings.portName);
    if (!m_port->open(QIODevice::ReadWrite)) {
        const QString message = tr("cannot open %1: %2").arg(m_settings.portName, m_port->errorString());
        // Report after returning, like every other outcome of open().
        QMetaObject::invokeMethod(this, [this, message] { transportFailed(message); }, Qt::QueuedConnection);
        return;
    }
    bool ok = m_port->setBaudRate(m_settings.baudRate) && m_port->setDataBits(m_settings.dataBits)
              && m_port->setParity(m_settings.parity) && m_port->setStopBits(m_settings.stopBits)
              && m_port->setFlowControl(m_settings.flowControl);
    if (!ok) {
        const QString message = tr("cannot set %1 on %2: %3").arg(m_settings.summary(), m_settings.portName, m_port->errorString());
        m_port->close();
        QMetaObject::invokeMethod(this, [this, message] { transportFailed(message); }, Qt::QueuedConnection);
        return;
    }
    // Qt 6.4 may return bytes left from earlier traffic right after open (QTBUG-115205).
    m_port->clear();
    m_port->clearError();
    QMetaObject::invokeMethod(this, [this] { if (m_port->isOpen()) transportOpened(); }, Qt::QueuedConnection);
}

void SerialLink::closeTransport()
{
    if (m_port->isOpen())
        m_port->close();
}

bool SerialLink::writeTransport(const QByteArray &bytes, QString *error)
{
    if (!m_port->isOpen()) {
        *error = tr("the port is not open");
        return false;
    }
    if (m_port->write(bytes) != bytes.size()) {
        *error = m_port->errorString();
        return false;
    }
    return true;
}

void SerialLink::handleError(QSerialPort::SerialPortError error)
{
    switch (error) {
    case QSerialPort::NoError:
    case QSerialPort::UnsupportedOperationError: // DTR/RTS on a pseudo-terminal (QT-NOTES.md §2.4)
    case QSerialPort::TimeoutError:
        return;
    case QSerialPort::OpenError:
    case QSerialPort::DeviceNotFoundError:
    case QSerialPort::PermissionError:
        if (state() != State::Open)
            return; // open() reports these itself
        break;
    default:
        break;
    }
    // ReadError / ResourceError / WriteError: close now, or Qt 6.4 re-emits the error
    // hundreds of thousands of times a second (QT-NOTES.md §2.2).
    const QString name = QString::fromLatin1(QMetaEnum::fromType<QSerialPort::SerialPortError>().valueToKey(error));
    const QString message = tr("%1 disconnected (%2: %3)").arg(m_settings.portName, name, m_port->errorString());
    if (m_port->isOpen())
        m_port->close();
    transportLost(message);
}

} // namespace sagline
