#include "ScpiInstrument.h"

namespace sagline {

namespace {
constexpr int maxErrorQueueEntries = 32; // SCPI queues hold far fewer; a device that never says 0 is broken
}

ScpiInstrument::ScpiInstrument(const QString &name, ScpiLink *link, QObject *parent)
    : QObject(parent), m_name(name), m_link(link)
{
    m_link->setParent(this);
    m_reconnect.setInterval(1000);
    m_reconnect.setSingleShot(true);
    connect(&m_reconnect, &QTimer::timeout, this, [this] {
        if (m_state == State::Lost)
            m_link->open();
    });
    connect(m_link, &ScpiLink::opened, this, &ScpiInstrument::handleOpened);
    connect(m_link, &ScpiLink::openFailed, this, &ScpiInstrument::handleOpenFailed);
    connect(m_link, &ScpiLink::lost, this, &ScpiInstrument::handleLost);
}

const RoleConfig *ScpiInstrument::roleConfig(MeterRole role) const
{
    for (const RoleConfig &config : m_roles) {
        if (config.role == role)
            return &config;
    }
    return nullptr;
}

QString ScpiInstrument::label() const
{
    return QStringLiteral("%1 (%2)").arg(m_name, m_link->description());
}

void ScpiInstrument::connectInstrument()
{
    m_reconnect.stop();
    m_state = State::Connecting;
    ++m_generation;
    if (m_link->isOpen())
        handleOpened();
    else
        m_link->open();
}

void ScpiInstrument::disconnectInstrument()
{
    m_reconnect.stop();
    ++m_generation;
    m_state = State::Disconnected;
    m_link->close();
}

void ScpiInstrument::handleOpened()
{
    if (m_state == State::Disconnected)
        return;
    const int generation = ++m_generation;
    m_consecutiveTimeouts = 0;
    m_link->query("*IDN?", this, [this, generation](const LinkReply &reply) {
        if (generation != m_generation)
            return;
        if (!reply.ok()) {
            failConnect(tr("%1: no identity: %2").arg(label(), reply.error));
            return;
        }
        ScpiIdentity identity = parseScpiIdentity(reply.line.toStdString());
        if (!identity.ok) {
            failConnect(tr("%1: the *IDN? reply '%2' is not an identity: %3")
                            .arg(label(), QString::fromStdString(printableReply(reply.line.toStdString())),
                                 QString::fromStdString(identity.error)));
            return;
        }
        if (m_everReady && identity.text() != m_identity.text()) {
            // Not the meter the sweep started with (its accuracy and calibration are on record):
            // it is not used; the link stays lost and keeps trying for the original one.
            const QString message = tr("%1: a different instrument answered after reconnecting and is not used: "
                                       "expected '%2', got '%3'")
                                        .arg(label(), identityText(), QString::fromStdString(identity.text()));
            if (m_errorLog.isEmpty() || m_errorLog.last() != message) {
                m_errorLog << message;
                emit instrumentError(message);
            }
            failConnect(message);
            return;
        }
        m_identity = identity;
        QStringList commands;
        if (m_resetOnConnect)
            commands << QStringLiteral("*RST");
        for (const RoleConfig &role : m_roles)
            commands << role.configureCommands;
        commands << m_extraConfigure;
        runSequence(commands);
    });
}

void ScpiInstrument::runSequence(QStringList commands)
{
    const int generation = m_generation;
    if (commands.isEmpty()) {
        drainErrors(maxErrorQueueEntries, [this, generation] {
            if (generation == m_generation)
                finishConnect();
        });
        return;
    }
    const QString next = commands.takeFirst();
    auto proceed = [this, generation, commands](const LinkReply &reply) {
        if (generation != m_generation)
            return;
        if (!reply.ok()) {
            failConnect(tr("%1: while configuring: %2").arg(label(), reply.error));
            return;
        }
        runSequence(commands);
    };
    if (next == QStringLiteral("*RST")) {
        // *OPC? answers once the reset has completed (IEEE 488.2).
        m_link->send("*RST", this);
        m_link->query("*OPC?", this, proceed);
    } else {
        m_link->send(next.toLatin1(), this, proceed);
    }
}

void ScpiInstrument::drainErrors(int remaining, std::function<void()> done)
{
    const int generation = m_generation;
    m_link->query("SYSTem:ERRor?", this, [this, generation, remaining, done](const LinkReply &reply) {
        if (generation != m_generation)
            return;
        if (!reply.ok()) {
            if (m_state == State::Connecting)
                failConnect(tr("%1: reading the error queue: %2").arg(label(), reply.error));
            else
                done();
            return;
        }
        const ScpiError entry = parseScpiError(reply.line.toStdString());
        if (!entry.ok) {
            const QString message = tr("%1: the SYSTem:ERRor? reply '%2' is not an error entry: %3")
                                        .arg(label(), QString::fromStdString(printableReply(reply.line.toStdString())),
                                             QString::fromStdString(entry.error));
            m_errorLog << message;
            emit instrumentError(message);
            done();
            return;
        }
        if (entry.isNoError()) {
            done();
            return;
        }
        const QString message = tr("%1: instrument error %2,\"%3\"")
                                    .arg(label())
                                    .arg(entry.code)
                                    .arg(QString::fromStdString(entry.message));
        m_errorLog << message;
        emit instrumentError(message);
        if (remaining <= 1) {
            const QString stuck = tr("%1: the error queue did not empty after %2 reads").arg(label()).arg(maxErrorQueueEntries);
            m_errorLog << stuck;
            emit instrumentError(stuck);
            done();
            return;
        }
        drainErrors(remaining - 1, done);
    });
}

void ScpiInstrument::finishConnect()
{
    const bool wasLost = m_everReady;
    m_state = State::Ready;
    m_everReady = true;
    m_consecutiveTimeouts = 0;
    if (wasLost)
        emit restored(identityText());
    else
        emit ready(identityText());
}

void ScpiInstrument::failConnect(const QString &message)
{
    if (m_everReady) {
        // Reconnecting: keep trying quietly; the sweep is already paused.
        m_link->close();
        m_state = State::Lost;
        m_reconnect.start();
        return;
    }
    m_state = State::Disconnected;
    m_link->close();
    emit connectFailed(message);
}

void ScpiInstrument::handleOpenFailed(const QString &message)
{
    if (m_state == State::Lost) {
        m_reconnect.start();
        return;
    }
    if (m_state == State::Connecting)
        failConnect(message);
}

void ScpiInstrument::handleLost(const QString &message)
{
    if (m_state == State::Disconnected)
        return;
    ++m_generation;
    const bool wasReady = m_state == State::Ready;
    if (!m_everReady) {
        failConnect(message);
        return;
    }
    m_state = State::Lost;
    m_reconnect.start();
    if (wasReady)
        emit lost(tr("%1: %2").arg(label(), message));
}

void ScpiInstrument::noteReply(const LinkReply &reply)
{
    if (reply.status != LinkReply::Status::Timeout) {
        if (reply.ok())
            m_consecutiveTimeouts = 0;
        return;
    }
    if (++m_consecutiveTimeouts < m_maxTimeouts || m_state != State::Ready)
        return;
    // A serial cable pulled from a plain RS-232 port shows only as silence.
    const QString message = tr("no reply to %1 queries in a row").arg(m_consecutiveTimeouts);
    m_link->close();
    handleLost(message);
}

void ScpiInstrument::measure(MeterRole role, QObject *context, MeasureHandler handler)
{
    const RoleConfig *config = roleConfig(role);
    MeterValue failed;
    failed.role = role;
    if (!config) {
        failed.error = tr("%1 does not serve the %2 role").arg(m_name, roleName(role));
        handler(failed);
        return;
    }
    if (m_state != State::Ready) {
        failed.error = tr("%1: %2 is not connected").arg(roleName(role), label());
        handler(failed);
        return;
    }
    QPointer<QObject> guard(context);
    m_link->query(config->queryCommand.toLatin1(), this, [this, role, guard, handler](const LinkReply &reply) {
        noteReply(reply);
        if (!guard)
            return;
        MeterValue value;
        value.role = role;
        value.raw = reply.line;
        if (!reply.ok()) {
            value.error = tr("%1: %2").arg(roleName(role), reply.error);
            handler(value);
            return;
        }
        const ScpiNumber number = parseScpiNumber(reply.line.toStdString());
        switch (number.kind) {
        case ScpiNumberKind::Value:
            value.status = MeterValue::Status::Value;
            value.value = number.value;
            break;
        case ScpiNumberKind::Overload: value.status = MeterValue::Status::Overload; break;
        case ScpiNumberKind::NotANumber: value.status = MeterValue::Status::NotANumber; break;
        case ScpiNumberKind::Invalid:
            value.error = tr("%1: reply '%2' is not a reading: %3")
                              .arg(roleName(role), QString::fromStdString(printableReply(reply.line.toStdString())),
                                   QString::fromStdString(number.error));
            break;
        }
        handler(value);
    });
}

void ScpiInstrument::command(const QByteArray &commandText, QObject *context, CommandHandler handler)
{
    if (m_state != State::Ready) {
        handler(false, tr("%1 is not connected").arg(label()));
        return;
    }
    QPointer<QObject> guard(context);
    m_link->send(commandText, this);
    m_link->query("SYSTem:ERRor?", this, [this, commandText, guard, handler](const LinkReply &reply) {
        noteReply(reply);
        if (!guard)
            return;
        if (!reply.ok()) {
            handler(false, tr("%1: '%2': %3").arg(label(), QString::fromLatin1(commandText), reply.error));
            return;
        }
        const ScpiError entry = parseScpiError(reply.line.toStdString());
        if (entry.isNoError()) {
            handler(true, {});
            return;
        }
        const QString message = entry.ok ? tr("%1 refused '%2': %3,\"%4\"")
                                               .arg(label(), QString::fromLatin1(commandText))
                                               .arg(entry.code)
                                               .arg(QString::fromStdString(entry.message))
                                         : tr("%1: after '%2' the error query gave '%3'")
                                               .arg(label(), QString::fromLatin1(commandText),
                                                    QString::fromStdString(printableReply(reply.line.toStdString())));
        m_errorLog << message;
        emit instrumentError(message);
        drainErrors(maxErrorQueueEntries, [] {});
        handler(false, message);
    });
}

} // namespace sagline
