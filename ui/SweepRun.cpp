#include "SweepRun.h"

#include "InstrumentRig.h"
#include "LinkAddress.h"
#include "RigForSource.h"
#include "SessionStore.h"
#include "SweepWorkspace.h"
#include "VirtualBench.h"

#include <QDateTime>

#include <algorithm>

namespace sagline {

namespace {

// The virtual bench needs no settling time, so a live demo on wall time keeps each step short.
constexpr std::int64_t virtualBenchDwellMs = 1200;
constexpr std::int64_t virtualBenchReadIntervalMs = 200;
constexpr std::uint64_t virtualBenchSeed = 2026;

} // namespace

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

std::optional<MeterSpecs> SweepRun::meterSpecsFor(const Setup &setup, const Plan &plan, const SourceChoice &source)
{
    RoleConfig voltmeter = defaultRoleConfig(MeterRole::SecondaryVoltage);
    RoleConfig ammeter = defaultRoleConfig(MeterRole::SecondaryCurrent);
    std::optional<VirtualBenchOptions> benchOptions;
    switch (source.source) {
    case ReadingSource::TypedIn:
        return std::nullopt;
    case ReadingSource::VirtualBench: {
        // As makeVirtualBenchRig configures the bench's meters.
        const VirtualBenchOptions bench = virtualBenchOptionsFor(setup, plan, virtualBenchSeed);
        voltmeter.accuracy = bench.voltmeter.accuracy;
        voltmeter.resolution = bench.voltmeter.resolution;
        ammeter.accuracy = bench.ammeter.accuracy;
        ammeter.resolution = bench.ammeter.resolution;
        benchOptions = bench;
        break;
    }
    case ReadingSource::SerialPort:
    case ReadingSource::Lan:
        break; // makeRig gives every SCPI role its defaultRoleConfig
    }
    MeterSpecs specs = meterSpecsOf(voltmeter, ammeter);
    if (benchOptions) {
        // The window's virtual bench always has the mains-side analyser (SweepRun's rig).
        const RoleConfig v1 = virtualBenchPrimaryRoleConfig(*benchOptions, MeterRole::PrimaryVoltage);
        const RoleConfig i1 = virtualBenchPrimaryRoleConfig(*benchOptions, MeterRole::PrimaryCurrent);
        const RoleConfig p1 = virtualBenchPrimaryRoleConfig(*benchOptions, MeterRole::PrimaryPower);
        addPrimaryMeterSpecs(specs, &v1, &i1, &p1);
    }
    if (setup.meters)
        specs.windingTemperatureUncertaintyC = setup.meters->windingTemperatureUncertaintyC;
    return specs;
}

SweepRun::SweepRun(SweepWorkspace *workspace, const Setup &setup, const Plan &plan, const SourceChoice &source,
                   bool simulatedTime, const SweepOptionsOverride &overrides)
    : m_fit(workspace)
{
    if (simulatedTime) {
        auto clock = std::make_unique<VirtualClock>(QDateTime::currentMSecsSinceEpoch());
        m_virtualClock = clock.get();
        m_clock = std::move(clock);
    } else {
        m_clock = std::make_unique<SystemClock>();
    }
    SweepOptions options = sweepOptionsFor(setup, plan);
    options.resumed = overrides.resumed;
    options.recordedSteps = overrides.recordedSteps;
    options.firstStep = overrides.firstStep;
    QString error;
    switch (source.source) {
    case ReadingSource::TypedIn:
        break;
    case ReadingSource::VirtualBench:
        m_bench = std::make_unique<VirtualBench>(virtualBenchOptionsFor(setup, plan, virtualBenchSeed), m_clock.get());
        // The whole demo bench: the secondary meters and the mains-side analyser (losses, efficiency).
        m_rig.reset(makeVirtualBenchRig(m_bench.get(), false, nullptr, true));
        options.simulated = true;
        options.dwellMs = std::min(options.dwellMs, virtualBenchDwellMs);
        options.readIntervalMs = std::min(options.readIntervalMs, virtualBenchReadIntervalMs);
        break;
    case ReadingSource::SerialPort:
    case ReadingSource::Lan:
        m_rig.reset(rigForSource(source, &error));
        if (!m_rig) {
            m_error = error;
            return;
        }
        break;
    }
    if (m_rig) {
        if (const QString problem = m_rig->validate(); !problem.isEmpty()) {
            m_error = QStringLiteral("instruments: ") + problem;
            return;
        }
    }
    // Notes and the safety stop's exclusion carry the person at the keyboard (never the operator field).
    const QString author = workspace->person().isEmpty() ? QStringLiteral("sagline") : workspace->person();
    m_sink = std::make_unique<SessionStoreSink>(workspace->store(), author);
    m_controller = std::make_unique<SweepController>(plan, options, m_rig.get(), m_sink.get(), &m_fit, m_clock.get());
    wireController(workspace);
}

void SweepRun::wireController(SweepWorkspace *workspace)
{
    SweepController *controller = m_controller.get();
    connect(controller, &SweepController::stepStarted, workspace, [workspace](int step, const QString &instruction) {
        workspace->setNextStep(step);
        emit workspace->stepChanged(step, instruction);
    });
    connect(controller, &SweepController::pointRecorded, workspace,
            [workspace](const Reading &reading, const LiveFitSnapshot &) { workspace->acceptRecorded(reading); });
    connect(controller, &SweepController::safetyStop, workspace, [workspace](const SafetyTrip &trip, const Reading &reading) {
        workspace->loadRecords(); // the stop and the tripping reading's exclusion, as recorded
        // The reading that tripped is kept in the session (the controller excluded it there).
        if (reading.id != 0) {
            Reading kept = reading;
            kept.excluded = true;
            workspace->acceptRecorded(kept);
        }
        emit workspace->safetyStopped(QString::fromStdString(trip.message));
    });
    connect(controller, &SweepController::notice, workspace, &SweepWorkspace::notice);
    connect(controller, &SweepController::stateChanged, workspace, &SweepWorkspace::sweepStateChanged);
    connect(controller, &SweepController::paused, workspace,
            [workspace](const QString &reason) { emit workspace->notice(tr("Paused: %1").arg(reason)); });
    connect(controller, &SweepController::linkLost, workspace,
            [workspace](const QString &message) { emit workspace->instrumentStatus(message); }); // "link lost at step N: ..."
    connect(controller, &SweepController::linkRestored, workspace,
            [workspace](const QString &message) { emit workspace->instrumentStatus(tr("link restored: %1").arg(message)); });
    connect(controller, &SweepController::finished, workspace, [this, workspace](SweepOutcome outcome) {
        if (m_virtualClock)
            m_virtualClock->setAutoAdvance(false);
        workspace->setNextStep(-1); // no next step: the prediction marker goes
        workspace->loadRecords();   // how the sweep ended, as recorded
        emit workspace->notice(tr("Sweep ended: %1").arg(toString(outcome)));
        emit workspace->runningChanged(false);
    });
}

SweepRun::~SweepRun()
{
    if (m_virtualClock)
        m_virtualClock->setAutoAdvance(false);
    // The controller refers to the rig, the sink and the clock; the rig to the bench.
    m_controller.reset();
    if (m_rig)
        m_rig->disconnectAll();
    m_rig.reset();
    m_bench.reset();
}

void SweepRun::start()
{
    if (!m_controller)
        return;
    if (m_virtualClock)
        m_virtualClock->setAutoAdvance(true);
    if (!m_rig) {
        m_controller->start();
        return;
    }
    m_connecting = true;
    connect(m_rig.get(), &InstrumentRig::ready, this, [this] {
        m_connecting = false;
        QStringList identities;
        for (ScpiInstrument *instrument : m_rig->instruments())
            identities << instrument->name() + QStringLiteral(": ") + instrument->identityText();
        emit connected(identities.join(QLatin1Char('\n')));
        m_controller->start();
    });
    connect(m_rig.get(), &InstrumentRig::connectFailed, this, [this](const QString &message) {
        m_connecting = false;
        emit connectFailed(message);
    });
    connect(m_rig.get(), &InstrumentRig::instrumentError, this, &SweepRun::instrumentError);
    m_rig->connectAll();
}

} // namespace sagline
