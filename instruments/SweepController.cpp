#include "SweepController.h"

#include "InstrumentRig.h"
#include "ScpiInstrument.h"
#include "SweepInstructions.h"

#include <algorithm>
#include <cmath>

namespace sagline {

QString toString(SweepState state)
{
    switch (state) {
    case SweepState::Idle: return QStringLiteral("idle");
    case SweepState::SettingLoad: return QStringLiteral("setting the load");
    case SweepState::WaitingForLoad: return QStringLiteral("waiting for the load to be set");
    case SweepState::Settling: return QStringLiteral("settling");
    case SweepState::Measuring: return QStringLiteral("measuring");
    case SweepState::WaitingForEntry: return QStringLiteral("waiting for a typed-in reading");
    case SweepState::Paused: return QStringLiteral("paused");
    case SweepState::Finished: return QStringLiteral("finished");
    case SweepState::Stopped: return QStringLiteral("stopped");
    }
    return {};
}

QString toString(SweepOutcome outcome)
{
    switch (outcome) {
    case SweepOutcome::Completed: return QStringLiteral("completed");
    case SweepOutcome::SafetyStop: return QStringLiteral("safety stop");
    case SweepOutcome::StoppedByOperator: return QStringLiteral("stopped by the operator");
    case SweepOutcome::Failed: return QStringLiteral("failed");
    case SweepOutcome::GaveUp: return QStringLiteral("gave up waiting");
    }
    return {};
}

SweepOptions sweepOptionsFor(const Setup &setup, const Plan &plan)
{
    SweepOptions options;
    options.dwellMs = static_cast<std::int64_t>(std::llround(setup.bench.dwellS * 1000.0));
    options.limits = safetyLimitsFor(plan);
    return options;
}

SweepController::SweepController(const Plan &plan, const SweepOptions &options, InstrumentRig *rig, PointSink *sink,
                                 LiveFit *fit, Clock *clock, QObject *parent)
    : QObject(parent), m_plan(plan), m_options(options), m_rig(rig), m_sink(sink), m_fit(fit), m_clock(clock),
      m_tracker(options.stability)
{
    qRegisterMetaType<sagline::Reading>();
    qRegisterMetaType<sagline::LiveFitSnapshot>();
    qRegisterMetaType<sagline::SafetyTrip>();
    qRegisterMetaType<sagline::SweepState>();
    qRegisterMetaType<sagline::SweepOutcome>();
    if (m_rig) {
        // Readings quantized to one count cannot agree better than that: never ask for less
        // than two counts of spread.
        if (const RoleConfig *v = m_rig->roleConfig(MeterRole::SecondaryVoltage))
            m_options.stability.voltageFloorV = std::max(m_options.stability.voltageFloorV, 2.0 * v->resolution);
        if (const RoleConfig *i = m_rig->roleConfig(MeterRole::SecondaryCurrent))
            m_options.stability.currentFloorA = std::max(m_options.stability.currentFloorA, 2.0 * i->resolution);
        m_tracker = StabilityTracker(m_options.stability);
        connect(m_rig, &InstrumentRig::lost, this, &SweepController::handleRigLost);
        connect(m_rig, &InstrumentRig::restored, this, &SweepController::handleRigRestored);
        connect(m_rig, &InstrumentRig::instrumentError, this, [this](const QString &message) {
            event(message);
            emit notice(message);
        });
    }
    m_recordedSteps.insert(options.recordedSteps.begin(), options.recordedSteps.end());
    m_stepIndex = 0;
    for (int i = 0; i < static_cast<int>(m_plan.steps.size()); ++i) {
        if (m_plan.steps[i].index == options.firstStep)
            m_stepIndex = i;
    }
    if (!m_plan.steps.empty())
        m_step = m_plan.steps[m_stepIndex].index;
}

SweepController::~SweepController()
{
    cancelTimers();
}

int SweepController::stepCount() const
{
    return static_cast<int>(m_plan.steps.size());
}

bool SweepController::hasProgrammableLoad() const
{
    return m_rig && m_rig->load();
}

const PlanStep *SweepController::planStep(int step) const
{
    // Plans number their steps by position; look there first.
    if (step >= 0 && step < static_cast<int>(m_plan.steps.size()) && m_plan.steps[step].index == step)
        return &m_plan.steps[step];
    for (const PlanStep &s : m_plan.steps) {
        if (s.index == step)
            return &s;
    }
    return nullptr;
}

QString SweepController::instruction(int step) const
{
    const PlanStep *s = planStep(step);
    return s ? stepInstruction(*s) : QString();
}

QString SweepController::restoredInstruction(int step) const
{
    const PlanStep *s = planStep(step);
    return s ? recheckInstruction(*s, QStringLiteral("link restored"), hasProgrammableLoad()) : QString();
}

QString SweepController::resumedInstruction(int step) const
{
    const PlanStep *s = planStep(step);
    return s ? recheckInstruction(*s, QStringLiteral("resumed"), hasProgrammableLoad()) : QString();
}

void SweepController::setState(SweepState state)
{
    if (m_state == state)
        return;
    // A pause is timed from its start however its reason changes (see giveUp).
    if (state == SweepState::Paused) {
        m_pausedAtMs = m_clock->nowMs();
        if (m_options.giveUpAfterMs > 0 && m_giveUpTimer == 0)
            m_giveUpTimer = m_clock->callAfter(m_options.giveUpAfterMs, this, [this] {
                m_giveUpTimer = 0;
                giveUp();
            });
    } else if (m_state == SweepState::Paused) {
        m_pausedAtMs = -1;
        if (m_giveUpTimer) {
            m_clock->cancel(m_giveUpTimer);
            m_giveUpTimer = 0;
        }
    }
    m_state = state;
    emit stateChanged(state);
}

std::int64_t SweepController::pausedForMs() const
{
    return m_pausedAtMs < 0 ? -1 : m_clock->nowMs() - m_pausedAtMs;
}

std::int64_t SweepController::settlingRemainingMs() const
{
    if (m_state != SweepState::Settling || m_settleEndsMs < 0)
        return -1;
    return std::max<std::int64_t>(0, m_settleEndsMs - m_clock->nowMs());
}

void SweepController::event(const QString &text)
{
    if (m_sink)
        m_sink->recordEvent(m_clock->utcNowIso(), text);
}

void SweepController::cancelTimers()
{
    if (m_timer) {
        m_clock->cancel(m_timer);
        m_timer = 0;
    }
}

void SweepController::start()
{
    if (m_state != SweepState::Idle)
        return;
    if (m_plan.steps.empty()) {
        emit notice(tr("the plan has no steps"));
        finish(SweepOutcome::Failed);
        return;
    }
    if (m_rig && !m_rig->isReady()) {
        emit notice(tr("the instruments are not connected"));
        finish(SweepOutcome::Failed);
        return;
    }
    if (m_rig && m_sink) {
        for (const InstrumentIdentityRecord &record : m_rig->records()) {
            const CommitResult result = m_sink->recordInstrument(record);
            if (!result.ok)
                emit notice(tr("could not record the instrument %1: %2").arg(record.identity, result.error));
        }
    }
    if (m_rig) {
        for (ScpiInstrument *instrument : m_rig->instruments()) {
            for (const QString &message : instrument->errorLog())
                event(tr("reported while connecting: %1").arg(message));
        }
    }
    event(tr("sweep %1 at step %2 (%3)")
              .arg(m_options.resumed ? tr("resumed") : tr("started"))
              .arg(m_step)
              .arg(m_rig ? tr("instruments") : tr("typed-in readings")));
    if (m_sink)
        m_sink->recordSweepEvent(m_options.resumed ? SweepEventKind::Resumed : SweepEventKind::Started, m_step, {});
    if (m_options.resumed) {
        // The session stopped or was interrupted at this step: nobody knows where the load is
        // now, so it is checked again as after a pause (a programmable load is set again).
        m_pauseInDoubt = true;
        m_confirmedBeforePause = true;
    }
    beginStep();
}

void SweepController::beginStep()
{
    cancelTimers();
    const int serial = ++m_readSerial;
    m_step = m_plan.steps[m_stepIndex].index;
    QString text = instruction(m_step);
    if (m_retake)
        text = tr("retake: %1").arg(text);
    if (m_loadInDoubt) {
        // A load never confirmed before the loss is simply set now; one that was confirmed may
        // have been moved while the meters were away, so the operator checks it again.
        text = m_confirmedBeforeLoss || hasProgrammableLoad() ? restoredInstruction(m_step)
                                                              : QStringLiteral("link restored: ") + text;
    } else if (m_pauseInDoubt) {
        // The same after an operator's pause: the load may have been changed meanwhile.
        text = m_confirmedBeforePause || hasProgrammableLoad() ? resumedInstruction(m_step)
                                                               : QStringLiteral("resumed: ") + text;
    }
    emit stepStarted(m_step, text);
    if (serial != m_readSerial)
        return; // a handler paused or stopped the sweep, or the link dropped meanwhile
    if (!m_rig) {
        setState(SweepState::WaitingForEntry);
        return;
    }
    if (ProgrammableLoad *load = m_rig->load()) {
        setState(SweepState::SettingLoad);
        load->setLoad(m_plan.steps[m_stepIndex].loadResistanceOhm, this, [this, serial](bool ok, const QString &error) {
            if (serial != m_readSerial || m_state != SweepState::SettingLoad)
                return;
            if (!ok) {
                m_pauseReason = tr("could not set the load: %1").arg(error);
                setState(SweepState::Paused);
                event(m_pauseReason);
                emit paused(m_pauseReason);
                return;
            }
            loadReady();
        });
        return;
    }
    if (m_loadConfirmed)
        loadReady();
    else
        setState(SweepState::WaitingForLoad);
}

void SweepController::confirmLoadSet()
{
    if (m_state != SweepState::WaitingForLoad)
        return;
    m_loadConfirmed = true;
    loadReady();
}

void SweepController::loadReady()
{
    if (m_loadInDoubt) {
        event(hasProgrammableLoad() ? tr("step %1: load set again after the link was restored").arg(m_step)
                                    : tr("step %1: the operator confirmed the load again after the link was restored").arg(m_step));
        m_loadInDoubt = false;
        m_confirmedBeforeLoss = false;
    } else if (m_pauseInDoubt) {
        event(hasProgrammableLoad()    ? tr("step %1: load set again after the operator resumed").arg(m_step)
              : m_confirmedBeforePause ? tr("step %1: the operator confirmed the load again after resuming").arg(m_step)
                                       : tr("step %1: the operator confirmed the load after resuming").arg(m_step));
    }
    m_pauseInDoubt = false;
    m_confirmedBeforePause = false;
    setState(SweepState::Settling);
    if (m_state != SweepState::Settling)
        return; // a stateChanged handler paused or stopped the sweep
    m_settleEndsMs = m_clock->nowMs() + m_options.dwellMs;
    m_timer = m_clock->callAfter(m_options.dwellMs, this, [this] {
        m_timer = 0;
        startMeasuring();
    });
}

bool SweepController::commitAndReport(Reading reading)
{
    if (m_sink) {
        const CommitResult result = m_retake ? m_sink->commitRetake(reading, m_retake->supersededId, m_retake->reason)
                                             : m_sink->commitReading(reading);
        if (!result.ok) {
            m_uncommitted = reading;
            m_pauseReason = tr("could not record the point of step %1: %2. Every point recorded so far is kept; "
                               "resume to try again")
                                .arg(m_step)
                                .arg(result.error);
            setState(SweepState::Paused);
            emit paused(m_pauseReason);
            return false;
        }
        reading.id = result.id;
    }
    m_uncommitted.reset();
    m_retake.reset();
    m_recordedSteps.insert(reading.step);
    ++m_recorded;
    m_linkReturnsThisStep = 0;
    if (m_fit && !(reading.flags & (flagOverload | flagNotANumber)))
        m_fit->addPoint(reading.currentA, reading.voltageV);
    emit pointRecorded(reading, m_fit ? m_fit->snapshot() : LiveFitSnapshot{});
    return true;
}

void SweepController::tripSafety(const SafetyTrip &trip, Reading reading)
{
    cancelTimers();
    ++m_readSerial;
    std::int64_t id = 0;
    if (m_sink) {
        const CommitResult committed = m_sink->commitReading(reading);
        if (committed.ok) {
            id = committed.id;
            reading.id = id;
            m_sink->excludeReading(id, tr("reading that tripped the safety stop (%1)")
                                           .arg(QString::fromStdString(toString(trip.limit))));
        } else {
            emit notice(tr("could not record the reading that tripped the stop: %1").arg(committed.error));
        }
        const CommitResult stop = m_sink->recordSafetyStop(trip, id, m_step, QString::fromStdString(reading.timeUtc));
        if (!stop.ok)
            emit notice(tr("could not record the safety stop: %1").arg(stop.error));
    }
    openLoad();
    emit safetyStop(trip, reading);
    finish(SweepOutcome::SafetyStop);
}

void SweepController::nextStep()
{
    // A pointRecorded handler may have paused or stopped the sweep (or the link dropped).
    if (m_state == SweepState::Stopped || m_state == SweepState::Finished)
        return;
    m_loadConfirmed = false;
    m_loadInDoubt = false;
    m_confirmedBeforeLoss = false;
    m_pauseInDoubt = false;
    m_confirmedBeforePause = false;
    // The first step still without a reading: the next one in a plain sweep, the interrupted
    // one after a retake.
    // Steps only ever gain readings, so the search goes on from where it last stopped: a sweep of
    // n steps costs n look-ups in all, not n² (the soak test's 100 000 steps).
    int next = -1;
    for (int i = m_firstUnrecorded; i < static_cast<int>(m_plan.steps.size()) && next < 0; ++i) {
        if (!m_recordedSteps.count(m_plan.steps[i].index))
            next = i;
    }
    m_firstUnrecorded = next < 0 ? static_cast<int>(m_plan.steps.size()) : next;
    if (next < 0) {
        openLoad();
        finish(SweepOutcome::Completed);
        return;
    }
    m_stepIndex = next;
    m_step = m_plan.steps[m_stepIndex].index;
    if (m_state == SweepState::Paused)
        return; // resume() starts the new step
    beginStep();
}

void SweepController::openLoad()
{
    if (!m_rig || !m_rig->load())
        return;
    m_rig->load()->setLoad(std::nullopt, this, [this](bool ok, const QString &error) {
        if (!ok)
            emit notice(tr("could not switch the load off: %1; switch it off by hand").arg(error));
        emit loadSwitchedOff(ok, error);
    });
}

void SweepController::finish(SweepOutcome outcome)
{
    cancelTimers();
    ++m_readSerial;
    event(tr("sweep ended: %1 (%2 points recorded)").arg(toString(outcome)).arg(m_recorded));
    if (m_sink && outcome == SweepOutcome::Completed)
        m_sink->recordSweepEvent(SweepEventKind::Finished, m_step, {});
    setState(outcome == SweepOutcome::Completed ? SweepState::Finished : SweepState::Stopped);
    emit finished(outcome);
}

QString SweepController::retake(int step, std::int64_t supersededId, const QString &reason)
{
    if (m_state == SweepState::Finished || m_state == SweepState::Stopped)
        return tr("no sweep is running");
    if (m_state == SweepState::Paused)
        return tr("the sweep is paused: resume it first");
    if (reason.trimmed().isEmpty())
        return tr("retake: say why the step is taken again");
    int index = -1;
    for (int i = 0; i < static_cast<int>(m_plan.steps.size()); ++i) {
        if (m_plan.steps[i].index == step)
            index = i;
    }
    if (index < 0)
        return tr("step %1 is not in the plan").arg(step);
    m_retake = Retake{supersededId, reason.trimmed()};
    m_stepIndex = index;
    if (m_state == SweepState::Idle) {
        m_step = step; // start() begins with it
        return {};
    }
    cancelTimers();
    ++m_readSerial;
    event(tr("step %1 taken again: %2").arg(step).arg(reason.trimmed()));
    m_loadConfirmed = false;
    m_loadInDoubt = false;
    m_confirmedBeforeLoss = false;
    m_pauseInDoubt = false;
    m_confirmedBeforePause = false;
    beginStep();
    return {};
}

QString SweepController::submitManualReading(const QString &voltageText, const QString &currentText, bool confirmed)
{
    if (m_rig)
        return tr("this sweep reads its meters; typed-in readings are for sweeps without instruments");
    if (m_state != SweepState::WaitingForEntry)
        return tr("not waiting for a reading (the sweep is %1)").arg(toString(m_state));
    const ManualValue voltage = parseManualValue(MeterRole::SecondaryVoltage, voltageText);
    const ManualValue current = parseManualValue(MeterRole::SecondaryCurrent, currentText);
    QStringList errors;
    if (!voltage.ok)
        errors << voltage.error;
    if (!current.ok)
        errors << current.error;
    if (!errors.isEmpty())
        return errors.join(QStringLiteral("; "));
    Reading reading = makeReading(current.value, voltage.value);
    reading.rawText = QStringLiteral("typed: V '%1'; I '%2'").arg(voltageText.trimmed(), currentText.trimmed()).toStdString();
    if (confirmed)
        reading.flags |= flagConfirmed;
    SafetyPoint point;
    point.currentA = current.value;
    point.voltageV = voltage.value;
    point.expectedVoltageV = expectedVoltage();
    if (auto trip = checkSafety(m_options.limits, point)) {
        tripSafety(*trip, reading);
        return {};
    }
    acceptPoint(reading);
    return {};
}

void SweepController::stop()
{
    if (m_state == SweepState::Idle || m_state == SweepState::Finished || m_state == SweepState::Stopped)
        return;
    openLoad();
    event(tr("stopped by the operator at step %1").arg(m_step));
    if (m_sink)
        m_sink->recordSweepEvent(SweepEventKind::Stopped, m_step, {});
    finish(SweepOutcome::StoppedByOperator);
}

} // namespace sagline
