// How the virtual bench's instruments are reached from outside the process: a pseudo-terminal
// per instrument (a serial port to any program, path printed by sagline-sim) and a loopback
// TCP port per instrument (raw SCPI socket). When an instrument's link "vanishes" the pty is
// closed (and comes back as a new pty behind the same stable symlink) and the TCP port stops
// listening and drops its clients (and listens again on the same port).
#pragma once

#include <QByteArray>
#include <QList>
#include <QObject>
#include <QPointer>
#include <QString>

class QSocketNotifier;
class QTcpServer;
class QTcpSocket;

namespace sagline {

class SimInstrument;

// Splits received bytes into lines for the instrument; a line over the bound is discarded.
class SimLineReader {
public:
    QList<QByteArray> feed(const QByteArray &bytes);
    void clear() { m_buffer.clear(); m_skipping = false; }

private:
    QByteArray m_buffer;
    bool m_skipping = false;
};

class PtyEndpoint final : public QObject {
    Q_OBJECT
public:
    // `linkPath`: a symlink kept pointing at the current pty ("" for none).
    PtyEndpoint(SimInstrument *instrument, const QString &linkPath, QObject *parent = nullptr);
    ~PtyEndpoint() override;

    bool start(QString *error);
    QString ptyPath() const { return m_ptyPath; }   // /dev/pts/N (changes after a vanish)
    QString linkPath() const { return m_linkPath; } // stable path to give to clients

private:
    bool openPty(QString *error);
    void closePty();
    void handleReadable();
    void handleWritable();
    void write(const QByteArray &bytes);

    QPointer<SimInstrument> m_instrument;
    QString m_linkPath;
    QString m_ptyPath;
    int m_master = -1;
    int m_slave = -1; // kept open so the master never reads EIO while no client has the port
    QSocketNotifier *m_readNotifier = nullptr;
    QSocketNotifier *m_writeNotifier = nullptr;
    QByteArray m_pending; // replies not yet taken by the pty
    SimLineReader m_reader;
    int m_session = 0;
};

class TcpEndpoint final : public QObject {
    Q_OBJECT
public:
    TcpEndpoint(SimInstrument *instrument, QObject *parent = nullptr);
    ~TcpEndpoint() override;

    bool start(quint16 port, QString *error); // 0: any free port
    quint16 port() const { return m_port; }

private:
    bool listen(QString *error);
    void accept();
    void dropClients();

    QPointer<SimInstrument> m_instrument;
    QTcpServer *m_server;
    quint16 m_port = 0;
    int m_session = 0;
};

} // namespace sagline
