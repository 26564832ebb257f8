#include "ScpiLink.h"

namespace sagline {

ScpiLink::ScpiLink(QObject *parent) : QObject(parent)
{
    m_clock.start();
    m_timeout.setSingleShot(true);
    m_quiet.setSingleShot(true);
    connect(&m_timeout, &QTimer::timeout, this, &ScpiLink::handleTimeout);
    connect(&m_quiet, &QTimer::timeout, this, &ScpiLink::startNext);
}

ScpiLink::~ScpiLink() = default;

qint64 ScpiLink::elapsedMs() const
{
    return m_clock.elapsed();
}

void ScpiLink::open()
{
    if (m_state != State::Closed)
        return;
    m_state = State::Opening;
    m_buffer.clear();
    m_skippingLongLine = false;
    openTransport();
}

void ScpiLink::close()
{
    const bool wasOpen = m_state != State::Closed;
    m_state = State::Closed;
    if (wasOpen)
        closeTransport();
    failAll(tr("the link was closed"));
}

void ScpiLink::query(const QByteArray &command, QObject *context, ReplyHandler handler)
{
    m_queue.push_back(Request{command, true, context, context != nullptr, std::move(handler)});
    startNext();
}

void ScpiLink::send(const QByteArray &command, QObject *context, ReplyHandler handler)
{
    m_queue.push_back(Request{command, false, context, context != nullptr, std::move(handler)});
    startNext();
}

void ScpiLink::startNext()
{
    if (m_inFlight || m_queue.empty() || m_quiet.isActive())
        return;
    if (m_state != State::Open) {
        failAll(m_state == State::Opening ? tr("the link is still opening") : tr("the link is not open"));
        return;
    }
    m_inFlight = std::move(m_queue.front());
    m_queue.pop_front();
    QString error;
    if (!writeTransport(m_inFlight->command + m_writeTerminator, &error)) {
        LinkReply reply;
        reply.status = LinkReply::Status::LinkDown;
        reply.error = tr("could not send '%1': %2").arg(QString::fromLatin1(m_inFlight->command), error);
        finish(reply);
        return;
    }
    if (!m_inFlight->expectsReply) {
        finish(LinkReply{});
        return;
    }
    m_timeout.start(m_timeoutMs);
}

void ScpiLink::finish(LinkReply reply)
{
    m_timeout.stop();
    if (!m_inFlight)
        return;
    Request request = std::move(*m_inFlight);
    m_inFlight.reset();
    reply.receivedMs = elapsedMs();
    if (request.handler && (!request.hasContext || request.context))
        request.handler(reply);
    // The handler may have closed or destroyed the link's user; carry on only if still open.
    QMetaObject::invokeMethod(this, &ScpiLink::startNext, Qt::QueuedConnection);
}

void ScpiLink::handleTimeout()
{
    if (!m_inFlight)
        return;
    LinkReply reply;
    reply.status = LinkReply::Status::Timeout;
    reply.error = tr("no reply to '%1' within %2 ms").arg(QString::fromLatin1(m_inFlight->command)).arg(m_timeoutMs);
    m_buffer.clear();
    m_skippingLongLine = false;
    m_quiet.start(m_quietMs); // a late reply arriving now is discarded, not taken for the next one
    finish(reply);
}

void ScpiLink::transportOpened()
{
    m_state = State::Open;
    m_buffer.clear();
    emit opened();
    startNext();
}

void ScpiLink::transportFailed(const QString &message)
{
    m_state = State::Closed;
    failAll(message);
    emit openFailed(message);
}

void ScpiLink::transportLost(const QString &message)
{
    if (m_state == State::Closed)
        return;
    const bool wasOpen = m_state == State::Open;
    m_state = State::Closed;
    closeTransport();
    failAll(message);
    if (wasOpen)
        emit lost(message);
    else
        emit openFailed(message);
}

void ScpiLink::bytesReceived(const QByteArray &bytes)
{
    for (char c : bytes) {
        if (c == '\n') {
            if (m_skippingLongLine) {
                m_skippingLongLine = false;
                m_buffer.clear();
                continue;
            }
            QByteArray line = m_buffer;
            m_buffer.clear();
            if (line.endsWith('\r'))
                line.chop(1);
            handleLine(line);
            continue;
        }
        if (m_skippingLongLine)
            continue;
        m_buffer.append(c);
        if (m_buffer.size() > m_maxLineBytes) {
            m_buffer.clear();
            m_skippingLongLine = true;
            if (m_inFlight && m_inFlight->expectsReply) {
                LinkReply reply;
                reply.status = LinkReply::Status::TooLong;
                reply.error = tr("reply to '%1' is longer than %2 bytes without a line end")
                                  .arg(QString::fromLatin1(m_inFlight->command))
                                  .arg(m_maxLineBytes);
                finish(reply);
            }
        }
    }
}

void ScpiLink::handleLine(const QByteArray &line)
{
    if (m_quiet.isActive() || !m_inFlight || !m_inFlight->expectsReply) {
        emit strayLine(line);
        return;
    }
    LinkReply reply;
    reply.line = line;
    finish(reply);
}

void ScpiLink::failAll(const QString &message)
{
    m_timeout.stop();
    m_quiet.stop();
    std::deque<Request> requests;
    if (m_inFlight) {
        requests.push_back(std::move(*m_inFlight));
        m_inFlight.reset();
    }
    while (!m_queue.empty()) {
        requests.push_back(std::move(m_queue.front()));
        m_queue.pop_front();
    }
    for (Request &request : requests) {
        LinkReply reply;
        reply.status = LinkReply::Status::LinkDown;
        reply.error = message;
        reply.receivedMs = elapsedMs();
        if (request.handler && (!request.hasContext || request.context))
            request.handler(reply);
    }
}

} // namespace sagline
