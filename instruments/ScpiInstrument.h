// One SCPI instrument on one link, serving one or more meter roles (or a programmable load).
// Connecting runs the IEEE 488.2 sequence: *IDN? (the identity recorded in the session), an
// optional *RST (then *OPC?), the roles' configure commands, then SYSTem:ERRor? drained until
// it answers 0; every instrument error is reported. A link that drops (unplugged, closed by
// the peer) or stops answering (several timeouts in a row) is reported lost, and the
// instrument keeps trying to reconnect until it is back, then reports it restored.
#pragma once

#include "MeterRole.h"
#include "ScpiLink.h"
#include "ScpiResponse.h"

#include <QList>
#include <QObject>
#include <QPointer>
#include <QTimer>

#include <functional>

namespace sagline {

struct MeterValue {
    enum class Status { Value, Overload, NotANumber, Failed };
    MeterRole role = MeterRole::SecondaryVoltage;
    Status status = Status::Failed;
    double value = 0.0; // Value only
    QByteArray raw;     // the reply as received (empty on timeout)
    QString error;      // Failed: names the role and shows the raw text or the link's reason

    bool isValue() const { return status == Status::Value; }
};

class ScpiInstrument : public QObject {
    Q_OBJECT
public:
    enum class State { Disconnected, Connecting, Ready, Lost };
    using MeasureHandler = std::function<void(const MeterValue &)>;
    using CommandHandler = std::function<void(bool ok, const QString &error)>;

    // Takes ownership of `link` (re-parented to this).
    ScpiInstrument(const QString &name, ScpiLink *link, QObject *parent = nullptr);

    QString name() const { return m_name; }
    ScpiLink *link() const { return m_link; }
    void setRoles(const QList<RoleConfig> &roles) { m_roles = roles; }
    const QList<RoleConfig> &roles() const { return m_roles; }
    const RoleConfig *roleConfig(MeterRole role) const; // nullptr if not served
    void setResetOnConnect(bool reset) { m_resetOnConnect = reset; }
    void setExtraConfigureCommands(const QStringList &commands) { m_extraConfigure = commands; }
    void setReconnectIntervalMs(int ms) { m_reconnect.setInterval(ms); }
    void setMaxConsecutiveTimeouts(int count) { m_maxTimeouts = count; }

    void connectInstrument();    // emits ready() or connectFailed()
    void disconnectInstrument(); // closes the link and stops reconnecting
    State state() const { return m_state; }
    bool isReady() const { return m_state == State::Ready; }
    const ScpiIdentity &identity() const { return m_identity; }
    QString identityText() const { return QString::fromStdString(m_identity.text()); }
    QStringList errorLog() const { return m_errorLog; } // every instrument error seen, oldest first

    // Reads one role with its query command.
    void measure(MeterRole role, QObject *context, MeasureHandler handler);
    // Sends a command, then SYSTem:ERRor? once to learn whether the instrument accepted it.
    void command(const QByteArray &command, QObject *context, CommandHandler handler);

signals:
    void ready(const QString &identity);
    void connectFailed(const QString &message);
    void instrumentError(const QString &message); // "secondary voltmeter (…): -113,"Undefined header""
    void lost(const QString &message);
    void restored(const QString &identity);

private:
    void handleOpened();
    void handleOpenFailed(const QString &message);
    void handleLost(const QString &message);
    void runSequence(QStringList commands);
    void drainErrors(int remaining, std::function<void()> done);
    void finishConnect();
    void failConnect(const QString &message);
    void noteReply(const LinkReply &reply);
    QString label() const;

    QString m_name;
    ScpiLink *m_link;
    QList<RoleConfig> m_roles;
    QStringList m_extraConfigure;
    bool m_resetOnConnect = false;
    State m_state = State::Disconnected;
    bool m_everReady = false;
    ScpiIdentity m_identity;
    QStringList m_errorLog;
    QTimer m_reconnect;
    int m_consecutiveTimeouts = 0;
    int m_maxTimeouts = 3;
    int m_generation = 0; // bumps on every (re)connect so stale callbacks are ignored
};

} // namespace sagline
