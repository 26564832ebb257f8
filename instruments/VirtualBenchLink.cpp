#include "VirtualBenchLink.h"

#include "SimInstrument.h"

namespace sagline {

VirtualBenchLink::VirtualBenchLink(SimInstrument *instrument, QObject *parent) : ScpiLink(parent), m_instrument(instrument)
{
    connect(instrument, &SimInstrument::vanished, this, [this] {
        ++m_session;
        transportLost(tr("%1: the link vanished").arg(description()));
    });
}

QString VirtualBenchLink::description() const
{
    return m_instrument ? QStringLiteral("virtual bench %1").arg(toString(m_instrument->kind()))
                        : QStringLiteral("virtual bench (gone)");
}

void VirtualBenchLink::openTransport()
{
    const int session = ++m_session;
    m_outgoing.clear();
    QMetaObject::invokeMethod(
        this,
        [this, session] {
            if (session != m_session || state() != State::Opening)
                return;
            if (!m_instrument || m_instrument->isVanished())
                transportFailed(tr("%1: no answer on the link").arg(description()));
            else
                transportOpened();
        },
        Qt::QueuedConnection);
}

void VirtualBenchLink::closeTransport()
{
    ++m_session;
    m_outgoing.clear();
}

bool VirtualBenchLink::writeTransport(const QByteArray &bytes, QString *error)
{
    if (!m_instrument || m_instrument->isVanished()) {
        *error = tr("the link is down");
        return false;
    }
    m_outgoing += bytes;
    const int session = m_session;
    qsizetype end;
    while ((end = m_outgoing.indexOf('\n')) >= 0) {
        QByteArray line = m_outgoing.left(end);
        m_outgoing.remove(0, end + 1);
        if (line.endsWith('\r'))
            line.chop(1);
        QPointer<VirtualBenchLink> self(this);
        QPointer<SimInstrument> instrument = m_instrument;
        // Delivered through the event loop, as a device would: never inside the caller's write().
        QMetaObject::invokeMethod(
            m_instrument,
            [self, instrument, line, session] {
                if (!self || !instrument || session != self->m_session)
                    return;
                instrument->handleLine(line, [self, session](const QByteArray &reply) {
                    QMetaObject::invokeMethod(
                        self,
                        [self, session, reply] {
                            if (self && session == self->m_session && self->isOpen())
                                self->bytesReceived(reply);
                        },
                        Qt::QueuedConnection);
                });
            },
            Qt::QueuedConnection);
    }
    return true;
}

} // namespace sagline
