// SweepWorkspace, the session as a whole: its records read from the file, its progress and
// seal, the person making changes, the gates before a sweep, resuming, retakes and reopening.
#include "SweepWorkspace.h"

#include "SessionChanges.h"
#include "SessionStore.h"
#include "SweepRun.h"
#include "UiFormat.h"

#include <set>

namespace sagline {

namespace {

template <typename T>
QString take(StoreResult<T> result, T &into)
{
    if (!result.ok())
        return QString::fromStdString(result.message);
    into = std::move(result.value);
    return {};
}

QString celsiusText(const std::vector<TemperatureRecord> &temperatures, TemperatureKind kind)
{
    for (auto it = temperatures.rbegin(); it != temperatures.rend(); ++it) {
        if (it->kind == kind)
            return QString::number(it->celsius, 'g', 6) + QStringLiteral(" °C");
    }
    return {};
}

} // namespace

SessionDetails sessionDetailsFrom(const SessionRecords &records)
{
    SessionDetails details;
    details.operatorName = QString::fromStdString(records.info.operatorName);
    details.unitSerial = QString::fromStdString(records.info.unitSerial);
    details.ambientTemperature = celsiusText(records.temperatures, TemperatureKind::Ambient);
    details.windingTemperature = celsiusText(records.temperatures, TemperatureKind::Winding);
    return details;
}

QString SweepWorkspace::loadRecords()
{
    if (!m_store)
        return {};
    SessionRecords records;
    records.fromFile = m_records.fromFile;
    const QString problems[] = {
        take(m_store->info(), records.info),
        take(m_store->temperatures(), records.temperatures),
        take(m_store->instruments(), records.instruments),
        take(m_store->exclusions(), records.exclusions),
        take(m_store->safetyStops(), records.safetyStops),
        take(m_store->sweepEvents(), records.sweepEvents),
        take(m_store->supersessions(), records.supersessions),
        take(checkSeal(*m_store), records.seal),
    };
    for (const QString &problem : problems) {
        if (!problem.isEmpty())
            return problem;
    }
    m_records = std::move(records);
    return {};
}

SessionProgress SweepWorkspace::progress() const
{
    std::vector<int> planned;
    if (m_plan) {
        for (const PlanStep &step : m_plan->steps)
            planned.push_back(step.index);
    }
    // A run that is starting (its controller not yet at its first step) is running too.
    const bool running = isRunning()
                         || (m_run && m_run->controller() && m_run->controller()->state() == SweepState::Idle);
    return sessionProgress(planned, m_readings, m_records.safetyStops, m_records.sweepEvents, running);
}

bool SweepWorkspace::isChangeable() const
{
    return m_store && !m_store->isReadOnly() && !m_store->isSealed();
}

QString SweepWorkspace::exclusionReason(std::int64_t readingId) const
{
    for (auto it = m_records.exclusions.rbegin(); it != m_records.exclusions.rend(); ++it) {
        if (it->readingId == readingId)
            return it->excluded ? QString::fromStdString(it->reason) : QString();
    }
    return {};
}

QString SweepWorkspace::supersededReason(std::int64_t readingId) const
{
    for (const SupersessionRecord &record : m_records.supersessions) {
        if (record.readingId == readingId)
            return QString::fromStdString(record.reason);
    }
    return {};
}

void SweepWorkspace::setPerson(const QString &person)
{
    m_person = person.trimmed();
    if (m_store)
        m_store->setActor({m_person.toStdString(), ""});
}

std::vector<UnsafeStep> SweepWorkspace::unsafeSteps() const
{
    return m_plan ? sagline::unsafeSteps(*m_plan) : std::vector<UnsafeStep>{};
}

QString SweepWorkspace::acceptRefusal() const
{
    if (!m_setup || !m_plan)
        return tr("plan: complete the setup first; the rule each field breaks is shown under it");
    const std::vector<UnsafeStep> unsafe = unsafeSteps();
    if (unsafe.empty() || m_limitChoice.kind == LimitChoice::Truncate)
        return {};
    if (m_limitChoice.kind == LimitChoice::Override && !m_limitChoice.reason.trimmed().isEmpty())
        return {};
    return tr("plan: the bench cannot take %1; use only the safe steps, fix the setup, or override with a reason")
        .arg(QString::fromStdString(describeUnsafeSteps(unsafe)));
}

void SweepWorkspace::recordGateChoice()
{
    if (!m_store || !m_plan)
        return;
    const std::vector<UnsafeStep> unsafe = sagline::unsafeSteps(*m_plan);
    if (unsafe.empty() || m_limitChoice.kind == LimitChoice::None)
        return;
    const std::string steps = describeUnsafeSteps(unsafe);
    const auto recorded = m_limitChoice.kind == LimitChoice::Truncate
                              ? m_store->recordSweepEvent(SweepEventKind::Truncated, -1, "removed " + steps)
                              : m_store->recordSweepEvent(SweepEventKind::LimitOverride, -1,
                                                          steps + "; reason: " + m_limitChoice.reason.trimmed().toStdString());
    if (!recorded.ok())
        emit notice(QString::fromStdString(recorded.message));
}

QString SweepWorkspace::resumeSweep(const SourceChoice &source)
{
    if (!m_store || !m_setup || !m_plan)
        return tr("resume: open a session first");
    if (isRunning())
        return tr("resume: the sweep is running");
    if (!isChangeable())
        return m_store->isSealed() ? tr("resume: the session is signed off; reopen it first")
                                   : tr("resume: the session is open read-only");
    if (const std::string error = personError(m_person.toStdString()); !error.empty())
        return QString::fromStdString(error);
    const SessionProgress now = progress();
    if (!now.nextStep)
        return tr("resume: every planned step is recorded");
    SweepOptionsOverride overrides;
    overrides.resumed = true;
    overrides.firstStep = *now.nextStep;
    std::set<int> recorded;
    for (const Reading &reading : m_readings) {
        if (!reading.superseded && reading.step >= 0 && !(reading.flags & (flagOverload | flagNotANumber)))
            recorded.insert(reading.step);
    }
    overrides.recordedSteps.assign(recorded.begin(), recorded.end());
    return startRun(source, overrides);
}

QString SweepWorkspace::retake(int row, const QString &reason, const SourceChoice &source)
{
    if (!m_store || row < 0 || row >= static_cast<int>(m_readings.size()))
        return tr("retake: no such reading");
    const Reading &reading = m_readings[static_cast<std::size_t>(row)];
    if (reason.trimmed().isEmpty())
        return tr("reason: say why the step is taken again");
    if (reading.superseded)
        return tr("retake: reading %1 was already taken again").arg(row + 1);
    if (reading.step < 0)
        return tr("retake: reading %1 belongs to no plan step").arg(row + 1);
    if (!isChangeable())
        return m_store->isSealed() ? tr("retake: the session is signed off; reopen it first")
                                   : tr("retake: the session is open read-only");
    if (const std::string error = personError(m_person.toStdString()); !error.empty())
        return QString::fromStdString(error);
    if (!isRunning()) {
        if (const QString refused = resumeSweep(source); !refused.isEmpty() && !refused.endsWith(tr("every planned step is recorded")))
            return refused;
        if (!isRunning()) {
            // Every step is recorded: a run just for this step.
            SweepOptionsOverride overrides;
            overrides.resumed = true;
            overrides.firstStep = reading.step;
            for (const Reading &other : m_readings) {
                if (!other.superseded && other.step >= 0)
                    overrides.recordedSteps.push_back(other.step);
            }
            if (const QString refused = startRun(source, overrides); !refused.isEmpty())
                return refused;
        }
    }
    const QString refused = m_run->controller()->retake(reading.step, reading.id, reason);
    if (refused.isEmpty())
        m_retakeRow = row;
    return refused;
}

QString SweepWorkspace::reopen(const QString &reason)
{
    if (!m_store)
        return tr("reopen: no session is open");
    if (m_store->isReadOnly())
        return tr("reopen: the session is open read-only");
    if (const std::string error = personError(m_person.toStdString()); !error.empty())
        return QString::fromStdString(error);
    const auto result = m_store->reopen(reason.toStdString());
    if (!result.ok())
        return QString::fromStdString(result.message);
    loadRecords();
    emit sessionChanged();
    return {};
}

} // namespace sagline
