// SweepController, measuring a step: reads the meters repeatedly, pairs voltage and current,
// checks every reading against the hard limits, and accepts the point once the readings agree
// (or flags it unstable at the maximum time), checked against the live fit's prediction.
#include "SweepController.h"

#include "InstrumentRig.h"
#include "ScpiInstrument.h"

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <functional>
#include <map>
#include <memory>

namespace sagline {

namespace {

// Below this many points the scatter estimate is too rough to call a reading an outlier.
constexpr int minPointsForPredictionCheck = 4;

} // namespace

struct SweepController::PendingRead {
    std::map<MeterRole, std::pair<MeterValue, std::int64_t>> values; // role -> (value, time read)
    std::size_t expected = 0;
};

void SweepController::startMeasuring()
{
    setState(SweepState::Measuring);
    if (m_state != SweepState::Measuring)
        return; // a stateChanged handler paused or stopped the sweep
    m_tracker.start(static_cast<double>(m_clock->nowMs()) / 1000.0);
    m_lastPair.reset();
    m_lastRaw.clear();
    m_pendingPrimary = {};
    readPair();
}

void SweepController::readPair()
{
    const int serial = ++m_readSerial;
    // The secondary pair, plus the optional primary meters when the rig has them. Instruments
    // read in parallel; the roles of one instrument one after the other.
    // In the order of the roles (the secondary voltmeter's instrument first), never by address:
    // an order that followed the heap would let the virtual bench's meters draw their noise in a
    // different order from run to run, and a seeded sweep would not be the same sweep.
    std::vector<std::pair<ScpiInstrument *, std::vector<MeterRole>>> byInstrument;
    auto pending = std::make_shared<PendingRead>();
    for (MeterRole role : allMeterRoles()) {
        if (ScpiInstrument *instrument = m_rig->instrumentFor(role)) {
            auto entry = std::find_if(byInstrument.begin(), byInstrument.end(),
                                      [instrument](const auto &e) { return e.first == instrument; });
            if (entry == byInstrument.end())
                entry = byInstrument.insert(byInstrument.end(), {instrument, {}});
            entry->second.push_back(role);
            ++pending->expected;
        }
    }
    auto readChain = std::make_shared<std::function<void(ScpiInstrument *, std::vector<MeterRole>, std::size_t)>>();
    std::weak_ptr<std::function<void(ScpiInstrument *, std::vector<MeterRole>, std::size_t)>> weakChain = readChain;
    *readChain = [this, serial, pending, weakChain](ScpiInstrument *instrument, std::vector<MeterRole> roles,
                                                    std::size_t index) {
        instrument->measure(roles[index], this, [this, serial, pending, weakChain, instrument, roles, index](const MeterValue &value) {
            if (serial != m_readSerial)
                return;
            pending->values[value.role] = {value, m_clock->nowMs()};
            if (index + 1 < roles.size()) {
                if (auto chain = weakChain.lock())
                    (*chain)(instrument, roles, index + 1);
            } else if (pending->values.size() == pending->expected) {
                handleValues(pending->values);
            }
        });
    };
    m_readChain = readChain; // kept alive until the next read
    for (auto &[instrument, roles] : byInstrument)
        (*readChain)(instrument, roles, 0);
}

void SweepController::handleValues(const std::map<MeterRole, std::pair<MeterValue, std::int64_t>> &values)
{
    const auto &[voltage, voltageMs] = values.at(MeterRole::SecondaryVoltage);
    const auto &[current, currentMs] = values.at(MeterRole::SecondaryCurrent);
    QString raw = QStringLiteral("V: %1; I: %2").arg(QString::fromLatin1(voltage.raw), QString::fromLatin1(current.raw));
    m_pendingPrimary = {};
    for (MeterRole role : primaryMeterRoles()) {
        auto it = values.find(role);
        if (it == values.end())
            continue;
        const MeterValue &v = it->second.first;
        raw += QStringLiteral("; %1: %2").arg(primaryRawLabel(role), v.status == MeterValue::Status::Failed
                                                                          ? QStringLiteral("(no reading)")
                                                                          : QString::fromLatin1(v.raw));
        if (v.isValue())
            setPrimaryValue(role, v.value);
        if (v.status == MeterValue::Status::Overload) {
            SafetyPoint point;
            point.overloadedRole = roleName(role).toStdString();
            Reading reading = makeReading(current.isValue() ? current.value : 0.0, voltage.isValue() ? voltage.value : 0.0);
            reading.rawText = raw.toStdString();
            tripSafety(*checkSafety(m_options.limits, point), reading);
            return;
        }
        if (v.status == MeterValue::Status::Failed)
            emit notice(v.error); // an optional meter: noted, the secondary pair still counts
    }
    handlePair(voltage, voltageMs, current, currentMs, raw);
}

void SweepController::handlePair(const MeterValue &voltage, std::int64_t voltageMs, const MeterValue &current,
                                 std::int64_t currentMs, const QString &raw)
{
    if (m_state != SweepState::Measuring)
        return;
    for (const MeterValue *value : {&voltage, &current}) {
        if (value->status == MeterValue::Status::Overload) {
            SafetyPoint point;
            point.overloadedRole = roleName(value->role).toStdString();
            Reading reading = makeReading(current.isValue() ? current.value : 0.0, voltage.isValue() ? voltage.value : 0.0);
            reading.flags |= flagOverload;
            reading.rawText = raw.toStdString();
            tripSafety(*checkSafety(m_options.limits, point), reading);
            return;
        }
    }
    for (const MeterValue *value : {&voltage, &current}) {
        // Every failed read is kept with the session (a reply that does not parse, a timeout):
        // whoever reviews it sees what the meters did, not only what was recorded.
        if (value->status == MeterValue::Status::Failed) {
            event(tr("step %1: %2").arg(m_step).arg(value->error));
            emit notice(value->error);
            scheduleRead();
            return;
        }
        if (value->status == MeterValue::Status::NotANumber) {
            event(tr("step %1: %2 reports not-a-number").arg(m_step).arg(roleName(value->role)));
            emit notice(tr("%1 reports not-a-number (%2); reading again").arg(roleName(value->role), QString::fromLatin1(value->raw)));
            scheduleRead();
            return;
        }
    }
    if (std::llabs(voltageMs - currentMs) > m_options.pairWindowMs) {
        emit notice(tr("voltage and current were read %1 ms apart (window %2 ms); reading again")
                        .arg(std::llabs(voltageMs - currentMs))
                        .arg(m_options.pairWindowMs));
        scheduleRead();
        return;
    }
    SafetyPoint point;
    point.currentA = current.value;
    point.voltageV = voltage.value;
    point.expectedVoltageV = expectedVoltage();
    if (auto trip = checkSafety(m_options.limits, point)) {
        Reading reading = makeReading(current.value, voltage.value);
        reading.rawText = raw.toStdString();
        tripSafety(*trip, reading);
        return;
    }
    m_lastPair = std::make_pair(voltage.value, current.value);
    m_lastRaw = raw;
    m_lastPrimary = m_pendingPrimary;
    m_tracker.add(voltage.value, current.value);
    if (m_tracker.isStable()) {
        Reading reading = makeReading(current.value, voltage.value);
        reading.rawText = raw.toStdString();
        acceptPoint(reading);
        return;
    }
    scheduleRead();
}

void SweepController::scheduleRead()
{
    if (m_tracker.isTimedOut(static_cast<double>(m_clock->nowMs()) / 1000.0)) {
        if (m_lastPair) {
            Reading reading = makeReading(m_lastPair->second, m_lastPair->first);
            reading.flags |= flagUnstable;
            reading.rawText = m_lastRaw.toStdString();
            reading.primary = m_lastPrimary;
            emit notice(tr("step %1: readings did not settle within %2 s; recording the last one as unstable")
                            .arg(m_step)
                            .arg(m_options.stability.maxTimeS));
            acceptPoint(reading);
            return;
        }
        m_pauseReason = tr("step %1: no valid reading within %2 s; check the meters, then resume to retry the step")
                            .arg(m_step)
                            .arg(m_options.stability.maxTimeS);
        markLoadInDoubtUntilResumed(); // checking the meters means hands on the bench
        ++m_readSerial;
        setState(SweepState::Paused);
        event(m_pauseReason);
        emit paused(m_pauseReason);
        return;
    }
    m_timer = m_clock->callAfter(m_options.readIntervalMs, this, [this] {
        m_timer = 0;
        if (m_state == SweepState::Measuring)
            readPair();
    });
}

QString SweepController::primaryRawLabel(MeterRole role)
{
    switch (role) {
    case MeterRole::PrimaryVoltage: return QStringLiteral("V1");
    case MeterRole::PrimaryCurrent: return QStringLiteral("I1");
    case MeterRole::PrimaryPower: return QStringLiteral("P1");
    case MeterRole::PrimaryPowerFactor: return QStringLiteral("PF1");
    case MeterRole::PrimaryReactivePower: return QStringLiteral("Q1");
    default: return roleKey(role);
    }
}

// A primary value as data, with its standard uncertainty from the role's accuracy rule (the
// primary side has no fit to carry a systematic budget, so each reading keeps its own u).
void SweepController::setPrimaryValue(MeterRole role, double value)
{
    const RoleConfig *config = m_rig ? m_rig->roleConfig(role) : nullptr;
    const std::optional<double> u = config ? std::optional<double>(config->standardUncertainty(value)) : std::nullopt;
    const double magnitude = std::fabs(value); // RMS values and power drawn; a meter may sign them
    PrimaryReading &p = m_pendingPrimary;
    switch (role) {
    case MeterRole::PrimaryVoltage: p.voltageV = magnitude, p.uVoltageV = u; break;
    case MeterRole::PrimaryCurrent: p.currentA = magnitude, p.uCurrentA = u; break;
    case MeterRole::PrimaryPower: p.powerW = magnitude, p.uPowerW = u; break;
    case MeterRole::PrimaryPowerFactor: p.powerFactor = std::min(1.0, magnitude), p.uPowerFactor = u; break;
    case MeterRole::PrimaryReactivePower: p.reactivePowerVar = magnitude, p.uReactivePowerVar = u; break;
    default: break;
    }
}

Reading SweepController::makeReading(double currentA, double voltageV) const
{
    Reading reading;
    reading.primary = m_pendingPrimary;
    reading.step = m_step;
    reading.currentA = currentA;
    reading.voltageV = voltageV;
    reading.timeUtc = m_clock->utcNowIso().toStdString();
    // No per-reading u: a meter's accuracy rule is a gain and an offset common to all its
    // readings (systematic), recorded once in the session's setup, not a random part of each.
    if (!m_rig)
        reading.flags |= flagManual;
    if (m_options.simulated)
        reading.flags |= flagSimulated;
    return reading;
}

double SweepController::expectedVoltage() const
{
    return m_plan.steps[m_stepIndex].predictedVoltageV;
}

void SweepController::acceptPoint(Reading reading)
{
    cancelTimers();
    ++m_readSerial;
    if (m_fit && m_fit->snapshot().pointCount >= minPointsForPredictionCheck) {
        if (auto band = m_fit->predict(reading.currentA, m_options.predictionLevel)) {
            // The fit's interval knows the scatter so far; the new reading also carries its own
            // meter uncertainty (resolution, accuracy), which a few points cannot reveal.
            const double half = (band->highV - band->lowV) / 2.0;
            const RoleConfig *voltmeter = m_rig ? m_rig->roleConfig(MeterRole::SecondaryVoltage) : nullptr;
            const double meter = 3.0 * (reading.uVoltageV ? *reading.uVoltageV
                                        : voltmeter       ? voltmeter->standardUncertainty(reading.voltageV)
                                                          : 0.0);
            const double widened = std::sqrt(half * half + meter * meter);
            const double low = band->predictedV - widened;
            const double high = band->predictedV + widened;
            if (reading.voltageV < low || reading.voltageV > high) {
                reading.flags |= flagOutsidePrediction;
                emit notice(tr("step %1: %2 V is far outside the expected %3 .. %4 V (wrong range, loose lead?)")
                                .arg(m_step)
                                .arg(reading.voltageV, 0, 'f', 4)
                                .arg(low, 0, 'f', 4)
                                .arg(high, 0, 'f', 4));
            }
        }
    }
    if (commitAndReport(reading))
        nextStep();
}

} // namespace sagline
