// An in-process link to one instrument of the virtual bench: the same line framing, queue and
// timeouts as a serial or TCP link (ScpiLink), with the bytes handed over through the event
// loop instead of a device. The desktop app and `sagline-cli run --sim` use it.
#pragma once

#include "ScpiLink.h"

#include <QPointer>

namespace sagline {

class SimInstrument;

class VirtualBenchLink final : public ScpiLink {
    Q_OBJECT
public:
    explicit VirtualBenchLink(SimInstrument *instrument, QObject *parent = nullptr);
    QString description() const override;

protected:
    void openTransport() override;
    void closeTransport() override;
    bool writeTransport(const QByteArray &bytes, QString *error) override;

private:
    QPointer<SimInstrument> m_instrument;
    QByteArray m_outgoing; // bytes written, up to the next line end
    int m_session = 0;     // bumps on close so replies to an earlier session are dropped
};

} // namespace sagline
