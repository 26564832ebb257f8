// One running sweep: the instruments layer's SweepController with its clock, its instruments
// (the virtual bench, SCPI meters, or none for typed-in readings), the session-store sink
// that commits every reading before it is reported, and a live-fit view onto the workspace's
// fit. Owned by SweepWorkspace; gone when the session closes.
#pragma once

#include "LiveFit.h"
#include "SessionStoreSink.h"
#include "SweepController.h"

#include <QObject>

#include <memory>

namespace sagline {

class InstrumentRig;
class SweepWorkspace;
class VirtualBench;
class VirtualClock;
struct SourceChoice;
struct SweepOptionsOverride;

// The controller's view of the fit: it reads the workspace's LineFit (which the workspace
// feeds with every recorded, non-excluded point), so exclusions show in its predictions too.
class WorkspaceLiveFit : public LiveFit {
public:
    explicit WorkspaceLiveFit(const SweepWorkspace *workspace) : m_workspace(workspace) {}
    void addPoint(double, double) override {} // the workspace adds on pointRecorded
    LiveFitSnapshot snapshot() const override;
    std::optional<PredictionBand> predict(double currentA, double level) const override;

private:
    const SweepWorkspace *m_workspace;
};

class SweepRun : public QObject {
    Q_OBJECT
public:
    // Builds the instruments for `source`; errorString() says why when it cannot.
    // `simulatedTime`: the virtual bench runs on a clock that jumps ahead (tests, demos).
    SweepRun(SweepWorkspace *workspace, const Setup &setup, const Plan &plan, const SourceChoice &source,
             bool simulatedTime,
             const SweepOptionsOverride &overrides);
    // The secondary meters' accuracy rules the run's instruments will have, as the setup's
    // `meters` section (the virtual bench's meters, or the SCPI roles' defaults); nothing for
    // readings typed in (the setup's own section stands). Known before the session is made.
    static std::optional<MeterSpecs> meterSpecsFor(const Setup &setup, const Plan &plan, const SourceChoice &source);
    ~SweepRun() override;
    QString errorString() const { return m_error; }
    void start();                        // connects the instruments first, if any
    bool isConnecting() const { return m_connecting; }
    SweepController *controller() const { return m_controller.get(); }
    InstrumentRig *rig() const { return m_rig.get(); }
    VirtualBench *bench() const { return m_bench.get(); }

signals:
    void connected(const QString &identities); // one line per instrument
    void connectFailed(const QString &message);
    void instrumentError(const QString &message);

private:
    void wireController(SweepWorkspace *workspace);

    std::unique_ptr<Clock> m_clock;
    VirtualClock *m_virtualClock = nullptr;
    std::unique_ptr<VirtualBench> m_bench;
    std::unique_ptr<InstrumentRig> m_rig;
    std::unique_ptr<SessionStoreSink> m_sink;
    WorkspaceLiveFit m_fit;
    std::unique_ptr<SweepController> m_controller;
    QString m_error;
    bool m_connecting = false;
};

} // namespace sagline
