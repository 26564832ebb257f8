// Connect and test, before a sweep: the instruments of a reading source are connected, each
// answers *IDN?, and each role it serves is read once with its configured query. The report
// names every meter with its identity, function and one live reading, or what failed. The
// rig is disconnected afterwards; the sweep connects its own.
#pragma once

#include <QObject>
#include <QStringList>
#include <QTimer>

#include <memory>

namespace sagline {

class Clock;
class InstrumentRig;
class VirtualBench;
struct Plan;
struct Setup;
struct SourceChoice;

class MeterCheck : public QObject {
    Q_OBJECT
public:
    // The check for `source` (the virtual bench needs the setup and its plan), or null with
    // `error` naming what is missing. Typed-in readings have nothing to test.
    static MeterCheck *forSource(const SourceChoice &source, const Setup *setup, const Plan *plan, QString *error,
                                 QObject *parent = nullptr);
    ~MeterCheck() override;

    void start(int timeoutMs = 20000);
    bool isRunning() const { return m_running; }
    QString report() const { return m_lines.join(QLatin1Char('\n')); }

signals:
    void finished(bool ok, const QString &report);

private:
    MeterCheck(InstrumentRig *rig, std::unique_ptr<Clock> clock, std::unique_ptr<VirtualBench> bench, QObject *parent);
    void readNext();
    void finish(bool ok);

    std::unique_ptr<Clock> m_clock;          // the virtual bench's
    std::unique_ptr<VirtualBench> m_bench;   // the virtual bench, when that is the source
    std::unique_ptr<InstrumentRig> m_rig;
    struct Pending {
        int instrument;
        int role;
    };
    QList<Pending> m_queue;
    QStringList m_lines;
    QTimer m_timeout;
    bool m_running = false;
    bool m_failed = false;
};

} // namespace sagline
