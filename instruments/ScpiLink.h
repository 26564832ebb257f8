// A line-based SCPI link to one instrument: the transport-independent half (request queue,
// line framing, timeouts, bounded receive buffer). Subclasses move the bytes: SerialLink
// (QSerialPort), TcpLink (raw socket, port 5025), VirtualBenchLink (in-process simulator).
//
// Asynchronous only. One request is in flight at a time; later ones wait in a queue. A query
// completes with its reply line or with a timeout; after a timeout the link discards whatever
// arrives during a short quiet period so that a late reply is not taken as the answer to the
// next query. A reply longer than maxLineBytes without a line end is an error, not unbounded
// memory: the rest of that line is skipped.
#pragma once

#include <QByteArray>
#include <QObject>
#include <QPointer>
#include <QString>
#include <QTimer>
#include <QElapsedTimer>

#include <deque>
#include <functional>
#include <optional>

namespace sagline {

struct LinkReply {
    enum class Status { Ok, Timeout, TooLong, LinkDown };
    Status status = Status::Ok;
    QByteArray line;       // the reply without its terminator (Ok only)
    QString error;         // for everything but Ok
    qint64 receivedMs = 0; // steady time (ms since the link was created) the reply completed

    bool ok() const { return status == Status::Ok; }
};

class ScpiLink : public QObject {
    Q_OBJECT
public:
    enum class State { Closed, Opening, Open };
    using ReplyHandler = std::function<void(const LinkReply &)>;

    explicit ScpiLink(QObject *parent = nullptr);
    ~ScpiLink() override;

    virtual QString description() const = 0; // "serial /dev/ttyUSB0 9600 8N1", "tcp 192.0.2.7:5025"

    void open();  // asynchronous: emits opened() or openFailed()
    void close(); // fails every waiting request with LinkDown; emits nothing
    State state() const { return m_state; }
    bool isOpen() const { return m_state == State::Open; }

    // Queues a query; `handler` gets exactly one reply (or none if `context` is destroyed).
    void query(const QByteArray &command, QObject *context, ReplyHandler handler);
    // Queues a command that has no reply; `handler` (optional) runs once it is written.
    void send(const QByteArray &command, QObject *context = nullptr, ReplyHandler handler = {});
    int pendingCount() const { return static_cast<int>(m_queue.size()) + (m_inFlight ? 1 : 0); }
    qint64 elapsedMs() const;

    void setTimeoutMs(int ms) { m_timeoutMs = ms; }
    int timeoutMs() const { return m_timeoutMs; }
    void setMaxLineBytes(int bytes) { m_maxLineBytes = bytes; }
    int maxLineBytes() const { return m_maxLineBytes; }
    void setWriteTerminator(const QByteArray &terminator) { m_writeTerminator = terminator; }
    void setQuietPeriodMs(int ms) { m_quietMs = ms; } // discard window after a timeout

signals:
    void opened();
    void openFailed(const QString &message);
    void lost(const QString &message);            // it was open and went away (unplugged, closed by peer)
    void strayLine(const QByteArray &line);       // a line nobody asked for (discarded)

protected:
    // Subclass half: start connecting and later call transportOpened() or transportFailed().
    virtual void openTransport() = 0;
    virtual void closeTransport() = 0;
    virtual bool writeTransport(const QByteArray &bytes, QString *error) = 0;

    void transportOpened();
    void transportFailed(const QString &message);
    void transportLost(const QString &message);
    void bytesReceived(const QByteArray &bytes);

private:
    struct Request {
        QByteArray command;
        bool expectsReply = true;
        QPointer<QObject> context;
        bool hasContext = false;
        ReplyHandler handler;
    };
    void startNext();
    void finish(LinkReply reply);
    void handleTimeout();
    void handleLine(const QByteArray &line);
    void failAll(const QString &message);

    State m_state = State::Closed;
    std::deque<Request> m_queue;
    std::optional<Request> m_inFlight;
    QByteArray m_buffer;
    bool m_skippingLongLine = false;
    QTimer m_timeout;
    QTimer m_quiet;
    QElapsedTimer m_clock;
    int m_timeoutMs = 2000;
    int m_maxLineBytes = 4096;
    int m_quietMs = 300;
    QByteArray m_writeTerminator = "\n";
};

} // namespace sagline
