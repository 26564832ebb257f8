#include "SweepRun.h"

#include "InstrumentRig.h"
#include "SessionStore.h"
#include "SweepWorkspace.h"

#include <cmath>

namespace sagline {

namespace {

CommitResult fromStore(const StoreResult<std::int64_t> &result)
{
    CommitResult commit;
    commit.ok = result.ok();
    commit.id = result.value;
    commit.error = QString::fromStdString(result.message);
    return commit;
}

} // namespace

CommitResult StoreSink::commitReading(const Reading &reading) { return fromStore(m_store->appendReading(reading)); }

CommitResult StoreSink::recordSafetyStop(const SafetyTrip &trip, std::int64_t, int step, const QString &)
{
    SafetyStopRecord stop;
    stop.step = step;
    stop.rule = toString(trip.limit);
    stop.message = trip.message;
    stop.measured = trip.measured;
    stop.limitValue = trip.limitValue;
    return fromStore(m_store->recordSafetyStop(stop));
}

CommitResult StoreSink::recordInstrument(const InstrumentIdentityRecord &instrument)
{
    return fromStore(m_store->recordInstrument(instrument.roleKeys.toStdString(),
                                               (instrument.identity + QStringLiteral(" @ ") + instrument.address).toStdString(),
                                               instrument.accuracyText.toStdString()));
}

CommitResult StoreSink::excludeReading(std::int64_t readingId, const QString &reason)
{
    return fromStore(m_store->excludeReading(readingId, reason.toStdString(), "sweep controller"));
}

CommitResult StoreSink::recordEvent(const QString &, const QString &text)
{
    return fromStore(m_store->addNote("sweep controller", text.toStdString()));
}

LiveFitSnapshot WorkspaceLiveFit::snapshot() const
{
    const LineFitResult fit = m_workspace->liveFit().result();
    LiveFitSnapshot snap;
    snap.valid = fit.ok();
    snap.pointCount = static_cast<int>(fit.n);
    snap.seriesResistanceOhm = fit.seriesResistanceOhm();
    snap.seriesResistanceSeOhm = fit.slopeSe.value_or(0.0);
    snap.noLoadVoltageV = fit.noLoadVoltageV();
    snap.noLoadVoltageSeV = fit.interceptSe.value_or(0.0);
    snap.residualSdV = fit.residualSd.value_or(0.0);
    snap.status = QString::fromStdString(fit.message);
    return snap;
}

std::optional<PredictionBand> WorkspaceLiveFit::predict(double currentA, double level) const
{
    const LinePrediction p = m_workspace->liveFit().predict(currentA, level);
    if (!p.prediction)
        return std::nullopt;
    return PredictionBand{p.value, p.prediction->low, p.prediction->high};
}

SweepRun::SweepRun(SweepWorkspace *workspace, const Setup &setup, const Plan &plan, const SourceChoice &source)
    : m_workspace(workspace), m_clock(std::make_unique<SystemClock>()), m_sink(workspace->store()), m_fit(workspace)
{
    SweepOptions options = sweepOptionsFor(setup, plan);
    switch (source.source) {
    case ReadingSource::TypedIn:
        break;
    case ReadingSource::VirtualBench:
    case ReadingSource::SerialPort:
    case ReadingSource::Lan:
        m_error = tr("instruments: this source is not available in this build yet; choose typed-in readings");
        return;
    }
    m_controller = std::make_unique<SweepController>(plan, options, m_rig.get(), &m_sink, &m_fit, m_clock.get());
    SweepController *controller = m_controller.get();
    connect(controller, &SweepController::stepStarted, workspace, [workspace](int step, const QString &instruction) {
        workspace->setNextStep(step);
        emit workspace->stepChanged(step, instruction);
    });
    connect(controller, &SweepController::pointRecorded, workspace,
            [workspace](const Reading &reading, const LiveFitSnapshot &) { workspace->acceptRecorded(reading); });
    connect(controller, &SweepController::safetyStop, workspace, [workspace](const SafetyTrip &trip, const Reading &reading) {
        // The reading that tripped is kept in the session, left out of the fit.
        if (reading.id != 0) {
            Reading kept = reading;
            kept.excluded = true;
            workspace->acceptRecorded(kept);
        }
        emit workspace->safetyStopped(QString::fromStdString(trip.message));
    });
    connect(controller, &SweepController::notice, workspace, &SweepWorkspace::notice);
    connect(controller, &SweepController::paused, workspace,
            [workspace](const QString &reason) { emit workspace->notice(tr("Paused: %1").arg(reason)); });
    connect(controller, &SweepController::linkLost, workspace,
            [workspace](const QString &message) { emit workspace->notice(tr("Link lost: %1").arg(message)); });
    connect(controller, &SweepController::linkRestored, workspace,
            [workspace](const QString &message) { emit workspace->notice(tr("Link restored: %1").arg(message)); });
    connect(controller, &SweepController::finished, workspace, [workspace](SweepOutcome outcome) {
        workspace->setNextStep(-1); // no next step: the prediction marker goes
        emit workspace->notice(tr("Sweep ended: %1").arg(toString(outcome)));
        emit workspace->runningChanged(false);
    });
}

SweepRun::~SweepRun()
{
    // The controller refers to the rig, the sink and the clock: it goes first.
    m_controller.reset();
    m_rig.reset();
}

void SweepRun::start()
{
    if (m_controller)
        m_controller->start();
}

} // namespace sagline
