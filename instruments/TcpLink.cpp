#include "TcpLink.h"

namespace sagline {

TcpLink::TcpLink(const QString &host, quint16 port, QObject *parent)
    : ScpiLink(parent), m_host(host), m_port(port), m_socket(new QTcpSocket(this))
{
    m_connectTimer.setSingleShot(true);
    connect(m_socket, &QTcpSocket::connected, this, [this] {
        m_connectTimer.stop();
        m_socket->setSocketOption(QAbstractSocket::LowDelayOption, 1);
        transportOpened();
    });
    connect(m_socket, &QTcpSocket::readyRead, this, [this] { bytesReceived(m_socket->readAll()); });
    connect(m_socket, &QTcpSocket::errorOccurred, this, [this](QAbstractSocket::SocketError) {
        m_connectTimer.stop();
        const QString message = tr("%1: %2").arg(description(), m_socket->errorString());
        if (state() == State::Opening)
            transportFailed(message);
        else
            transportLost(message);
    });
    connect(m_socket, &QTcpSocket::disconnected, this, [this] {
        transportLost(tr("%1: the instrument closed the connection").arg(description()));
    });
    connect(&m_connectTimer, &QTimer::timeout, this, [this] {
        m_socket->abort();
        transportFailed(tr("%1: no connection within %2 ms").arg(description()).arg(m_connectTimeoutMs));
    });
}

QString TcpLink::description() const
{
    return QStringLiteral("tcp %1:%2").arg(m_host).arg(m_port);
}

void TcpLink::openTransport()
{
    m_socket->abort();
    m_connectTimer.start(m_connectTimeoutMs);
    m_socket->connectToHost(m_host, m_port);
}

void TcpLink::closeTransport()
{
    m_connectTimer.stop();
    // abort() emits disconnected() synchronously; the link is already marked closed, so that
    // second report is ignored by transportLost().
    m_socket->abort();
}

bool TcpLink::writeTransport(const QByteArray &bytes, QString *error)
{
    if (m_socket->state() != QAbstractSocket::ConnectedState) {
        *error = tr("not connected");
        return false;
    }
    if (m_socket->write(bytes) != bytes.size()) {
        *error = m_socket->errorString();
        return false;
    }
    return true;
}

} // namespace sagline
