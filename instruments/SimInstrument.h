// One SCPI instrument of the virtual bench: answers IEEE 488.2 common commands, keeps a
// SCPI error queue, measures through the bench, sets the bench's load, and injects link
// faults on request: dropped replies, garbage bytes, slow replies, overload or not-a-number
// values, an endless line without terminator, and the link vanishing and coming back.
// Transports (pty, TCP, in-process) pass it complete lines and write back what it returns.
#pragma once

#include <QByteArray>
#include <QObject>
#include <QString>

#include <deque>
#include <functional>
#include <optional>
#include <random>

namespace sagline {

class VirtualBench;

// PowerMeter: secondary V and I on one instrument; PrimaryMeter: primary V and I (mains side).
enum class SimInstrumentKind { Voltmeter, Ammeter, PowerMeter, Load, PrimaryMeter };
QString toString(SimInstrumentKind kind); // "voltmeter", "ammeter", "power-meter", "load", "primary-meter"

enum class SimFault { Drop, Garbage, Slow, Overload, NotANumber, EndlessLine, Vanish };
QString toString(SimFault fault);
std::optional<SimFault> simFaultFromString(const QString &name);

// Random faults, each a probability per reply (0 = never).
struct SimFaultRates {
    double drop = 0.0;
    double garbage = 0.0;
    double slow = 0.0;
    double overload = 0.0; // measurement replies only
    int slowDelayMs = 3000;
    int vanishMs = 3000;   // how long a vanished link stays away
};

class SimInstrument : public QObject {
    Q_OBJECT
public:
    SimInstrument(SimInstrumentKind kind, VirtualBench *bench, std::uint64_t seed, QObject *parent = nullptr);

    SimInstrumentKind kind() const { return m_kind; }
    QString identity() const;
    QString serialNumber() const { return m_serial; }
    void setSerialNumber(const QString &serial) { m_serial = serial; }

    // One complete line (without terminator) from a client. `reply` gets the bytes to send
    // back (terminator included), possibly later and possibly never (faults).
    using ReplyFn = std::function<void(const QByteArray &)>;
    void handleLine(const QByteArray &line, ReplyFn reply);

    void setFaultRates(const SimFaultRates &rates) { m_rates = rates; }
    const SimFaultRates &faultRates() const { return m_rates; }
    void injectFault(SimFault fault, int count = 1); // the next `count` replies get it
    void clearInjectedFaults() { m_injected.clear(); } // the meter is put right
    void vanish(int durationMs);                     // the link goes away; back after durationMs (<0: stays away)
    void returnNow();
    bool isVanished() const { return m_vanished; }
    int queryCount() const { return m_queries; }

signals:
    void vanished();
    void returned();

private:
    QByteArray execute(const QString &header, const QString &parameters, bool *isMeasurement);
    QByteArray measure(bool voltage);
    void pushError(int code, const QString &text);
    void deliver(QByteArray reply, bool isMeasurement, ReplyFn reply_fn);
    bool roll(double probability);

    SimInstrumentKind m_kind;
    VirtualBench *m_bench;
    std::mt19937_64 m_random;
    QString m_serial;
    std::deque<std::pair<int, QString>> m_errors;
    bool m_measureVoltage = true; // configured function (READ?)
    double m_pendingOhm = 1000.0; // load setting, applied while the input is on
    bool m_inputOn = false;
    SimFaultRates m_rates;
    std::deque<SimFault> m_injected;
    bool m_vanished = false;
    int m_queries = 0;
};

} // namespace sagline
