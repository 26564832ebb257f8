#include "SimEndpoints.h"

#include "SimInstrument.h"

#include <QFile>
#include <QSocketNotifier>
#include <QTcpServer>
#include <QTcpSocket>
#include <QTimer>

#include <cerrno>
#include <cstring>
#include <fcntl.h>
#include <pty.h>
#include <termios.h>
#include <unistd.h>

namespace sagline {

namespace {
constexpr qsizetype maxCommandLine = 4096;
}

QList<QByteArray> SimLineReader::feed(const QByteArray &bytes)
{
    QList<QByteArray> lines;
    for (char c : bytes) {
        if (c == '\n') {
            if (!m_skipping) {
                QByteArray line = m_buffer;
                if (line.endsWith('\r'))
                    line.chop(1);
                lines << line;
            }
            m_buffer.clear();
            m_skipping = false;
            continue;
        }
        if (m_skipping)
            continue;
        m_buffer += c;
        if (m_buffer.size() > maxCommandLine) {
            m_buffer.clear();
            m_skipping = true;
        }
    }
    return lines;
}

PtyEndpoint::PtyEndpoint(SimInstrument *instrument, const QString &linkPath, QObject *parent)
    : QObject(parent), m_instrument(instrument), m_linkPath(linkPath)
{
    connect(instrument, &SimInstrument::vanished, this, &PtyEndpoint::closePty);
    connect(instrument, &SimInstrument::returned, this, [this] {
        QString error;
        if (!openPty(&error))
            qWarning("virtual bench: cannot reopen a pty: %s", qPrintable(error));
    });
}

PtyEndpoint::~PtyEndpoint()
{
    closePty();
}

bool PtyEndpoint::start(QString *error)
{
    return openPty(error);
}

bool PtyEndpoint::openPty(QString *error)
{
    closePty();
    char name[256] = {};
    if (::openpty(&m_master, &m_slave, name, nullptr, nullptr) != 0) {
        *error = QStringLiteral("openpty failed: %1").arg(QString::fromLocal8Bit(std::strerror(errno)));
        m_master = m_slave = -1;
        return false;
    }
    termios raw{};
    if (::tcgetattr(m_slave, &raw) == 0) {
        ::cfmakeraw(&raw);
        ::tcsetattr(m_slave, TCSANOW, &raw);
    }
    ::fcntl(m_master, F_SETFL, ::fcntl(m_master, F_GETFL) | O_NONBLOCK);
    m_ptyPath = QString::fromLocal8Bit(name);
    if (!m_linkPath.isEmpty()) {
        QFile::remove(m_linkPath);
        if (!QFile::link(m_ptyPath, m_linkPath)) {
            *error = QStringLiteral("cannot create the link %1 -> %2").arg(m_linkPath, m_ptyPath);
            closePty();
            return false;
        }
    }
    ++m_session;
    m_reader.clear();
    m_readNotifier = new QSocketNotifier(m_master, QSocketNotifier::Read, this);
    connect(m_readNotifier, &QSocketNotifier::activated, this, &PtyEndpoint::handleReadable);
    m_writeNotifier = new QSocketNotifier(m_master, QSocketNotifier::Write, this);
    m_writeNotifier->setEnabled(false);
    connect(m_writeNotifier, &QSocketNotifier::activated, this, &PtyEndpoint::handleWritable);
    return true;
}

void PtyEndpoint::closePty()
{
    ++m_session;
    delete m_readNotifier;
    delete m_writeNotifier;
    m_readNotifier = m_writeNotifier = nullptr;
    if (m_master >= 0)
        ::close(m_master);
    if (m_slave >= 0)
        ::close(m_slave);
    m_master = m_slave = -1;
    m_pending.clear();
    if (!m_linkPath.isEmpty())
        QFile::remove(m_linkPath);
}

void PtyEndpoint::handleReadable()
{
    char buffer[1024];
    const ssize_t n = ::read(m_master, buffer, sizeof buffer);
    if (n <= 0) {
        if (n < 0 && (errno == EAGAIN || errno == EINTR))
            return;
        // EIO without any slave open cannot happen (we keep one); anything else: stop reading.
        if (m_readNotifier)
            m_readNotifier->setEnabled(false);
        return;
    }
    const int session = m_session;
    QPointer<PtyEndpoint> self(this);
    for (const QByteArray &line : m_reader.feed(QByteArray(buffer, static_cast<qsizetype>(n)))) {
        if (!m_instrument)
            return;
        m_instrument->handleLine(line, [self, session](const QByteArray &reply) {
            if (self && session == self->m_session)
                self->write(reply);
        });
    }
}

void PtyEndpoint::write(const QByteArray &bytes)
{
    m_pending += bytes;
    handleWritable();
}

void PtyEndpoint::handleWritable()
{
    while (!m_pending.isEmpty() && m_master >= 0) {
        const ssize_t n = ::write(m_master, m_pending.constData(), static_cast<size_t>(m_pending.size()));
        if (n < 0) {
            if (errno == EAGAIN || errno == EINTR)
                break;
            m_pending.clear();
            break;
        }
        m_pending.remove(0, static_cast<qsizetype>(n));
    }
    if (m_writeNotifier)
        m_writeNotifier->setEnabled(!m_pending.isEmpty());
}

TcpEndpoint::TcpEndpoint(SimInstrument *instrument, QObject *parent)
    : QObject(parent), m_instrument(instrument), m_server(new QTcpServer(this))
{
    connect(m_server, &QTcpServer::newConnection, this, &TcpEndpoint::accept);
    connect(instrument, &SimInstrument::vanished, this, [this] {
        ++m_session;
        m_server->close();
        dropClients();
    });
    connect(instrument, &SimInstrument::returned, this, [this] {
        QString error;
        if (!listen(&error))
            qWarning("virtual bench: %s", qPrintable(error));
    });
}

TcpEndpoint::~TcpEndpoint() = default;

bool TcpEndpoint::start(quint16 port, QString *error)
{
    m_port = port;
    return listen(error);
}

bool TcpEndpoint::listen(QString *error)
{
    if (m_server->isListening())
        return true;
    if (!m_server->listen(QHostAddress::LocalHost, m_port)) {
        *error = QStringLiteral("cannot listen on 127.0.0.1:%1: %2").arg(m_port).arg(m_server->errorString());
        return false;
    }
    m_port = m_server->serverPort();
    return true;
}

void TcpEndpoint::dropClients()
{
    for (QTcpSocket *socket : findChildren<QTcpSocket *>()) {
        socket->abort();
        socket->deleteLater();
    }
}

void TcpEndpoint::accept()
{
    while (QTcpSocket *socket = m_server->nextPendingConnection()) {
        socket->setParent(this);
        auto reader = std::make_shared<SimLineReader>();
        const int session = m_session;
        QPointer<QTcpSocket> guard(socket);
        QPointer<TcpEndpoint> self(this);
        connect(socket, &QTcpSocket::readyRead, this, [this, self, guard, reader, session] {
            if (!guard || !m_instrument)
                return;
            for (const QByteArray &line : reader->feed(guard->readAll())) {
                m_instrument->handleLine(line, [self, guard, session](const QByteArray &reply) {
                    if (self && guard && session == self->m_session && guard->state() == QAbstractSocket::ConnectedState)
                        guard->write(reply);
                });
            }
        });
        connect(socket, &QTcpSocket::disconnected, socket, &QObject::deleteLater);
    }
}

} // namespace sagline
