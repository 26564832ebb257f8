#include "SimInstrument.h"

#include "BuildInfo.h"
#include "ScpiCommand.h"
#include "VirtualBench.h"

#include <QTimer>

#include <cmath>

namespace sagline {

namespace {
constexpr std::size_t maxErrorQueue = 20; // SCPI: the last entry becomes -350 Queue overflow
}

QString toString(SimInstrumentKind kind)
{
    switch (kind) {
    case SimInstrumentKind::Voltmeter: return QStringLiteral("voltmeter");
    case SimInstrumentKind::Ammeter: return QStringLiteral("ammeter");
    case SimInstrumentKind::PowerMeter: return QStringLiteral("power-meter");
    case SimInstrumentKind::Load: return QStringLiteral("load");
    case SimInstrumentKind::PrimaryMeter: return QStringLiteral("primary-meter");
    }
    return {};
}

QString toString(SimFault fault)
{
    switch (fault) {
    case SimFault::Drop: return QStringLiteral("drop");
    case SimFault::Garbage: return QStringLiteral("garbage");
    case SimFault::Slow: return QStringLiteral("slow");
    case SimFault::Overload: return QStringLiteral("overload");
    case SimFault::NotANumber: return QStringLiteral("nan");
    case SimFault::EndlessLine: return QStringLiteral("endless");
    case SimFault::Vanish: return QStringLiteral("vanish");
    }
    return {};
}

std::optional<SimFault> simFaultFromString(const QString &name)
{
    for (SimFault fault : {SimFault::Drop, SimFault::Garbage, SimFault::Slow, SimFault::Overload, SimFault::NotANumber,
                           SimFault::EndlessLine, SimFault::Vanish}) {
        if (toString(fault).compare(name.trimmed(), Qt::CaseInsensitive) == 0)
            return fault;
    }
    return std::nullopt;
}

SimInstrument::SimInstrument(SimInstrumentKind kind, VirtualBench *bench, std::uint64_t seed, QObject *parent)
    : QObject(parent), m_kind(kind), m_bench(bench), m_random(seed), m_serial(QStringLiteral("VB%1").arg(seed % 100000, 5, 10, QLatin1Char('0')))
{
    m_measureVoltage = kind != SimInstrumentKind::Ammeter;
}

QString SimInstrument::identity() const
{
    // An identity of our own: manufacturer, model, serial, firmware (IEEE 488.2 *IDN?).
    static const char *models[] = {"VB-V1 virtual voltmeter", "VB-A1 virtual ammeter", "VB-P2 virtual power meter",
                                   "VB-L1 virtual load", "VB-M1 virtual mains meter"};
    return QStringLiteral("Sagline Virtual Bench,%1,%2,%3")
        .arg(QLatin1String(models[static_cast<int>(m_kind)]), m_serial, QLatin1String(buildinfo::version));
}

bool SimInstrument::roll(double probability)
{
    if (probability <= 0.0)
        return false;
    return std::uniform_real_distribution<double>(0.0, 1.0)(m_random) < probability;
}

void SimInstrument::pushError(int code, const QString &text)
{
    if (m_errors.size() >= maxErrorQueue) {
        m_errors.back() = {-350, QStringLiteral("Queue overflow")};
        return;
    }
    m_errors.emplace_back(code, text);
}

void SimInstrument::injectFault(SimFault fault, int count)
{
    if (fault == SimFault::Vanish) {
        vanish(m_rates.vanishMs);
        return;
    }
    for (int i = 0; i < count; ++i)
        m_injected.push_back(fault);
}

void SimInstrument::vanish(int durationMs)
{
    if (m_vanished)
        return;
    m_vanished = true;
    emit vanished();
    if (durationMs >= 0)
        QTimer::singleShot(durationMs, this, &SimInstrument::returnNow);
}

void SimInstrument::returnNow()
{
    if (!m_vanished)
        return;
    m_vanished = false;
    emit returned();
}

void SimInstrument::handleLine(const QByteArray &line, ReplyFn reply)
{
    if (m_vanished)
        return;
    QByteArray response;
    bool anyMeasurement = false;
    for (const ScpiCommandUnit &unit : splitScpiMessage(line.toStdString())) {
        bool isMeasurement = false;
        const QByteArray part = execute(QString::fromStdString(unit.header), QString::fromStdString(unit.parameters),
                                        &isMeasurement);
        anyMeasurement = anyMeasurement || isMeasurement;
        if (part.isNull())
            continue;
        if (!response.isEmpty())
            response += ';'; // IEEE 488.2: replies to one message share a line
        response += part;
    }
    if (response.isEmpty())
        return;
    ++m_queries;
    deliver(response + '\n', anyMeasurement, std::move(reply));
}

void SimInstrument::deliver(QByteArray reply, bool isMeasurement, ReplyFn replyFn)
{
    std::optional<SimFault> fault;
    if (!m_injected.empty()) {
        fault = m_injected.front();
        m_injected.pop_front();
    } else if (roll(m_rates.drop)) {
        fault = SimFault::Drop;
    } else if (roll(m_rates.garbage)) {
        fault = SimFault::Garbage;
    } else if (roll(m_rates.slow)) {
        fault = SimFault::Slow;
    } else if (isMeasurement && roll(m_rates.overload)) {
        fault = SimFault::Overload;
    }
    if (!fault) {
        replyFn(reply);
        return;
    }
    switch (*fault) {
    case SimFault::Drop: return;
    case SimFault::Garbage: {
        QByteArray junk;
        const int length = std::uniform_int_distribution<int>(1, 24)(m_random);
        for (int i = 0; i < length; ++i) {
            char c = static_cast<char>(std::uniform_int_distribution<int>(0, 255)(m_random));
            junk += c == '\n' ? '\x7f' : c;
        }
        replyFn(junk + '\n');
        return;
    }
    case SimFault::Slow:
        QTimer::singleShot(m_rates.slowDelayMs, this, [replyFn, reply] { replyFn(reply); });
        return;
    case SimFault::Overload: replyFn(isMeasurement ? QByteArray("9.90000000E+37\n") : reply); return;
    case SimFault::NotANumber: replyFn(isMeasurement ? QByteArray("9.91000000E+37\n") : reply); return;
    case SimFault::EndlessLine: replyFn(QByteArray(64 * 1024, '7')); return; // no terminator, ever
    case SimFault::Vanish: vanish(m_rates.vanishMs); return;
    }
}

QByteArray SimInstrument::measure(bool voltage)
{
    const bool primary = m_kind == SimInstrumentKind::PrimaryMeter;
    const bool canVoltage = m_kind == SimInstrumentKind::Voltmeter || m_kind == SimInstrumentKind::PowerMeter || primary;
    const bool canCurrent = m_kind == SimInstrumentKind::Ammeter || m_kind == SimInstrumentKind::PowerMeter || primary;
    if ((voltage && !canVoltage) || (!voltage && !canCurrent)) {
        pushError(-241, QStringLiteral("Hardware missing; this %1 cannot measure %2")
                            .arg(toString(m_kind), voltage ? QStringLiteral("voltage") : QStringLiteral("current")));
        return QByteArray("9.91000000E+37");
    }
    const std::optional<double> value = primary ? (voltage ? m_bench->readPrimaryVoltage() : m_bench->readPrimaryCurrent())
                                                : (voltage ? m_bench->readVoltage() : m_bench->readCurrent());
    if (!value)
        return QByteArray("9.90000000E+37");
    return QByteArray::number(*value, 'E', 8);
}

QByteArray SimInstrument::execute(const QString &header, const QString &parameters, bool *isMeasurement)
{
    const std::string h = header.toStdString();
    auto is = [&h](const char *pattern) { return scpiHeaderMatches(pattern, h); };
    const bool isMeter = m_kind != SimInstrumentKind::Load;
    *isMeasurement = false;

    if (is("*IDN?"))
        return identity().toLatin1();
    if (is("*RST")) {
        m_measureVoltage = m_kind != SimInstrumentKind::Ammeter;
        if (m_kind == SimInstrumentKind::Load)
            m_bench->setLoad(std::nullopt);
        return {};
    }
    if (is("*CLS")) {
        m_errors.clear();
        return {};
    }
    if (is("*OPC?"))
        return "1";
    if (is("*ESR?") || is("*STB?"))
        return "0";
    if (is("SYSTem:ERRor[:NEXT]?")) {
        if (m_errors.empty())
            return "+0,\"No error\"";
        auto [code, text] = m_errors.front();
        m_errors.pop_front();
        return QStringLiteral("%1,\"%2\"").arg(code).arg(text).toLatin1();
    }
    if (isMeter && is("CONFigure[:VOLTage]:AC")) {
        m_measureVoltage = true;
        if (m_kind == SimInstrumentKind::Ammeter)
            pushError(-241, QStringLiteral("Hardware missing; an ammeter has no voltage function"));
        return {};
    }
    if (isMeter && is("CONFigure:CURRent:AC")) {
        m_measureVoltage = false;
        if (m_kind == SimInstrumentKind::Voltmeter)
            pushError(-241, QStringLiteral("Hardware missing; a voltmeter has no current function"));
        return {};
    }
    if (isMeter && is("MEASure[:VOLTage]:AC?")) {
        *isMeasurement = true;
        return measure(true);
    }
    if (isMeter && is("MEASure:CURRent:AC?")) {
        *isMeasurement = true;
        return measure(false);
    }
    if (isMeter && (is("MEASure:POWer:AC?") || is("MEASure:POWer:AC:REACtive?") || is("MEASure:POWer:AC:PFACtor?"))) {
        *isMeasurement = true;
        if (m_kind != SimInstrumentKind::PrimaryMeter) {
            pushError(-241, QStringLiteral("Hardware missing; this %1 cannot measure power").arg(toString(m_kind)));
            return QByteArray("9.91000000E+37");
        }
        const std::optional<double> value = is("MEASure:POWer:AC?")            ? m_bench->readPrimaryPower()
                                            : is("MEASure:POWer:AC:REACtive?") ? m_bench->readPrimaryReactivePower()
                                                                               : m_bench->readPrimaryPowerFactor();
        return value ? QByteArray::number(*value, 'E', 8) : QByteArray("9.90000000E+37");
    }
    if (isMeter && (is("READ?") || is("FETCh?"))) {
        *isMeasurement = true;
        return measure(m_measureVoltage);
    }
    if (!isMeter && is("[SOURce:]RESistance[:LEVel]")) {
        bool ok = false;
        const double ohms = parameters.toDouble(&ok);
        if (!ok || !std::isfinite(ohms)) {
            pushError(-224, QStringLiteral("Illegal parameter value; resistance in ohms expected"));
            return {};
        }
        if (ohms <= 0.0 || ohms > 1e6) {
            pushError(-222, QStringLiteral("Data out of range; 0 < R <= 1E6 ohm"));
            return {};
        }
        m_pendingOhm = ohms;
        if (m_inputOn)
            m_bench->setLoad(ohms);
        return {};
    }
    if (!isMeter && is("[SOURce:]RESistance[:LEVel]?"))
        return QByteArray::number(m_pendingOhm, 'E', 6);
    if (!isMeter && is("INPut[:STATe]")) {
        const QString p = parameters.trimmed().toUpper();
        if (p == QStringLiteral("ON") || p == QStringLiteral("1"))
            m_inputOn = true;
        else if (p == QStringLiteral("OFF") || p == QStringLiteral("0"))
            m_inputOn = false;
        else {
            pushError(-224, QStringLiteral("Illegal parameter value; ON or OFF expected"));
            return {};
        }
        m_bench->setLoad(m_inputOn ? std::optional<double>(m_pendingOhm) : std::nullopt);
        return {};
    }
    if (!isMeter && is("INPut[:STATe]?"))
        return m_inputOn ? "1" : "0";
    if (is("SIMulation:FAULt")) {
        // Our own extension for tests and demos: SIM:FAUL <name>[,<count>]
        const QStringList parts = parameters.split(QLatin1Char(','));
        const auto fault = simFaultFromString(parts.value(0));
        if (!fault) {
            pushError(-224, QStringLiteral("Illegal parameter value; fault drop|garbage|slow|overload|nan|endless|vanish"));
            return {};
        }
        injectFault(*fault, parts.size() > 1 ? std::max(1, parts[1].trimmed().toInt()) : 1);
        return {};
    }
    if (is("SIMulation:FUSE:REPLace")) {
        m_bench->replaceFuse();
        return {};
    }
    pushError(-113, QStringLiteral("Undefined header"));
    return {};
}

} // namespace sagline
