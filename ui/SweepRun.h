// One running sweep: the instruments layer's SweepController with its clock, its instruments
// (the virtual bench, SCPI meters, or none for typed-in readings), a sink that commits every
// reading to the session store before it is reported, and a live-fit view onto the
// workspace's fit. Owned by SweepWorkspace; gone when the sweep ends or the session closes.
#pragma once

#include "LiveFit.h"
#include "PointSink.h"
#include "SweepController.h"

#include <QObject>

#include <memory>

namespace sagline {

class InstrumentRig;
class SessionStore;
class SweepWorkspace;
struct SourceChoice;

// Commits to the session store; a reading counts as recorded only after the commit returned.
class StoreSink : public PointSink {
public:
    explicit StoreSink(SessionStore *store) : m_store(store) {}
    CommitResult commitReading(const Reading &reading) override;
    CommitResult recordSafetyStop(const SafetyTrip &trip, std::int64_t readingId, int step, const QString &timeUtc) override;
    CommitResult recordInstrument(const InstrumentIdentityRecord &instrument) override;
    CommitResult excludeReading(std::int64_t readingId, const QString &reason) override;
    CommitResult recordEvent(const QString &timeUtc, const QString &text) override;

private:
    SessionStore *m_store;
};

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
    SweepRun(SweepWorkspace *workspace, const Setup &setup, const Plan &plan, const SourceChoice &source);
    ~SweepRun() override;
    QString errorString() const { return m_error; }
    void start();
    SweepController *controller() const { return m_controller.get(); }
    InstrumentRig *rig() const { return m_rig.get(); }

private:
    SweepWorkspace *m_workspace;
    std::unique_ptr<Clock> m_clock;
    std::unique_ptr<InstrumentRig> m_rig;
    std::unique_ptr<QObject> m_benchHost; // the virtual bench's simulated instruments, when used
    StoreSink m_sink;
    WorkspaceLiveFit m_fit;
    std::unique_ptr<SweepController> m_controller;
    QString m_error;
};

} // namespace sagline
