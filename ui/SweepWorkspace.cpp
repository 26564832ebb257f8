#include "SweepWorkspace.h"

#include <algorithm>

#include "BuildInfo.h"
#include "ManualEntry.h"
#include "PlanJson.h"
#include "SessionChanges.h"
#include "SessionSchema.h"
#include "SessionStore.h"
#include "TypedReadingCheck.h"
#include "SetupJson.h"
#include "SweepRun.h"
#include "TypedValue.h"
#include "Units.h"

#include <QDateTime>
#include <QDir>
#include <QFile>
#include <QRegularExpression>
#include <QTimer>

namespace sagline {

namespace {

// Above this many points the full summary (O(n), with the quadratic check) is refreshed at
// most once a second; the live fit, the band and the results stay current on every point.
constexpr std::size_t summaryEveryPointUpTo = 5000;
constexpr qint64 summaryIntervalMs = 1000;

bool entersFit(const Reading &reading)
{
    return !reading.excluded && (reading.flags & (flagOverload | flagNotANumber)) == 0;
}

} // namespace

SweepWorkspace::SweepWorkspace(QObject *parent) : QObject(parent), m_backgroundFit(new BackgroundFit(this))
{
    connect(m_backgroundFit, &BackgroundFit::finished, this, &SweepWorkspace::backgroundSummaryArrived);
    m_summaryDue.setSingleShot(true);
    connect(&m_summaryDue, &QTimer::timeout, this, &SweepWorkspace::fitChanged); // the views call summary()
}

SweepWorkspace::~SweepWorkspace() = default;

void SweepWorkspace::setSetupJson(const QString &json)
{
    m_limitChoice = {}; // a truncation or an override was for the plan it was chosen for
    m_errors.clear();
    m_plan.reset();
    auto parsed = parseSetupJson(json.toStdString());
    m_setup = parsed.setup;
    if (!parsed.errors.empty()) {
        m_errors = parsed.errors;
    } else if (m_setup) {
        auto planned = makePlan(*m_setup);
        m_plan = planned.plan;
        m_errors = planned.errors;
    }
    emit planChanged();
}

QString SweepWorkspace::startSweep(const SessionDetails &details, const QString &sessionFolder, const SourceChoice &source)
{
    if (const QString refusal = acceptRefusal(); !refusal.isEmpty())
        return refusal;
    if (isRunning())
        return tr("sweep: one is already running");
    if (m_store && !m_readings.empty())
        return tr("session: this session already holds readings; start a new session (File, New session)");
    if (const std::string error = personError(m_person.toStdString()); !error.empty())
        return QString::fromStdString(error);
    QString error;
    const auto ambient = typedQuantity(details.ambientTemperature, Unit::Celsius, QStringLiteral("session.ambient_temperature_c"), &error);
    const auto winding = typedQuantity(details.windingTemperature, Unit::Celsius, QStringLiteral("session.winding_temperature_c"), &error);
    if (!error.isEmpty())
        return error;
    if (!QDir().mkpath(sessionFolder))
        return tr("session folder: cannot create %1").arg(sessionFolder);
    QString serial = details.unitSerial;
    serial.replace(QRegularExpression(QStringLiteral("[^A-Za-z0-9_.-]+")), QStringLiteral("_"));
    const QString stamp = QDateTime::currentDateTimeUtc().toString(QStringLiteral("yyyyMMdd-HHmmss-zzz"));
    const QString path = QDir(sessionFolder).filePath(!m_nextFileName.isEmpty() ? m_nextFileName
                                                      : (serial.isEmpty() ? QStringLiteral("unit") : serial)
                                                            + QLatin1Char('-') + stamp + QStringLiteral(".sagline"));
    m_nextFileName.clear();
    // A plan cut to its safe steps is the plan of this session.
    const Plan plan = m_limitChoice.kind == LimitChoice::Truncate ? truncatedToSafe(*m_plan) : *m_plan;
    // Meters connected: their own accuracy rules are the session's meters (core/FitBudget.h).
    Setup recorded = *m_setup;
    if (auto specs = SweepRun::meterSpecsFor(*m_setup, plan, source))
        recorded.meters = specs;
    NewSession session;
    session.setupJson = setupToJson(recorded);
    session.planJson = planToJson(plan);
    session.operatorName = details.operatorName.toStdString();
    session.unitSerial = details.unitSerial.toStdString();
    session.ambientTemperatureC = ambient;
    session.windingTemperatureC = winding;
    session.softwareVersion = std::string("sagline ") + buildinfo::version;
    session.createdBy = {m_person.toStdString(), ""};
    auto created = SessionStore::create(path.toStdString(), session);
    if (!created.ok())
        return QString::fromStdString(created.message);
    m_run.reset();
    m_store = std::move(created.value);
    m_setup = recorded; // the results panel judges with the meters recorded, as the report will
    m_recordedSettings.reset();
    m_details = details;
    resetReadings();
    recordGateChoice();
    m_plan = plan;
    m_records = {};
    loadRecords();
    emit sessionChanged();
    return startRun(source, {});
}

QString SweepWorkspace::startRun(const SourceChoice &source, const SweepOptionsOverride &overrides)
{
    m_source = source;
    auto run = std::make_unique<SweepRun>(this, *m_setup, *m_plan, source, m_simulatedTime, overrides);
    if (const QString refused = run->errorString(); !refused.isEmpty()) {
        run.reset();
        discardUnusedSession();
        return refused;
    }
    m_run = std::move(run);
    m_paused = false;
    connect(m_run.get(), &SweepRun::connected, this,
            [this](const QString &identities) { emit instrumentStatus(tr("connected\n%1").arg(identities)); });
    connect(m_run.get(), &SweepRun::connectFailed, this, [this](const QString &message) {
        emit instrumentStatus(tr("cannot connect: %1").arg(message));
        emit notice(tr("Cannot connect the instruments: %1").arg(message));
        // The run is the sender: it goes once this signal has returned.
        QTimer::singleShot(0, this, [this] {
            m_run.reset();
            discardUnusedSession();
            emit runningChanged(false);
        });
    });
    connect(m_run.get(), &SweepRun::instrumentError, this, &SweepWorkspace::notice);
    if (source.source != ReadingSource::TypedIn)
        emit instrumentStatus(tr("connecting…"));
    emit runningChanged(true);
    m_run->start();
    return {};
}

TypedOutcome SweepWorkspace::submitTyped(const QString &currentText, const QString &voltageText, bool confirmed)
{
    TypedOutcome outcome;
    if (!m_run || !m_run->controller()) {
        outcome.refusal = tr("reading: no sweep is running; accept the plan first");
        return outcome;
    }
    // Checked per field first so each refusal lands under its own field.
    const ManualValue current = parseManualValue(MeterRole::SecondaryCurrent, currentText);
    if (!current.ok) {
        outcome.refusal = QStringLiteral("reading.current_a: ") + current.error;
        return outcome;
    }
    const ManualValue voltage = parseManualValue(MeterRole::SecondaryVoltage, voltageText);
    if (!voltage.ok) {
        outcome.refusal = QStringLiteral("reading.voltage_v: ") + voltage.error;
        return outcome;
    }
    SweepController *controller = m_run->controller();
    std::string confirmedWhat;
    if (controller->state() == SweepState::WaitingForEntry) {
        // A second look before anything is recorded (core/TypedReadingCheck).
        const int step = controller->currentStep();
        TypedExpectation expected;
        expected.step = step;
        expected.ratedCurrentA = m_plan ? m_plan->ratedSecondaryCurrentA : 0.0;
        for (const PlanStep &planned : controller->plan().steps) {
            if (planned.index == step) {
                expected.currentA = planned.currentA;
                expected.predictedVoltageV = planned.predictedVoltageV;
            }
        }
        constexpr std::size_t minPointsForInterval = 4; // as the controller's own prediction check
        if (m_fit.count() >= minPointsForInterval) {
            const LinePrediction prediction = m_fit.predict(current.value, 0.99);
            if (prediction.prediction)
                expected.voltageInterval = std::pair{prediction.prediction->low, prediction.prediction->high};
        }
        const TypedCheck check = checkTypedReading(expected, current.value, voltage.value);
        if (check.needsConfirmation && !confirmed) {
            outcome.confirmField = QString::fromStdString(check.field);
            outcome.question = QString::fromStdString(check.message);
            return outcome;
        }
        if (check.needsConfirmation)
            confirmedWhat = check.message;
    }
    const int step = controller->currentStep();
    const QString refusal = controller->submitManualReading(voltageText, currentText, !confirmedWhat.empty());
    if (!refusal.isEmpty()) {
        outcome.refusal = QStringLiteral("reading: ") + refusal;
    } else if (!confirmedWhat.empty() && m_store) {
        // The reading carries the "confirmed" flag; the event says what was expected instead.
        const auto recorded = m_store->recordSweepEvent(SweepEventKind::ValueConfirmed, step, "confirmed by the person: " + confirmedWhat);
        if (!recorded.ok())
            emit notice(QString::fromStdString(recorded.message));
    }
    return outcome;
}

void SweepWorkspace::confirmLoadSet()
{
    if (m_run)
        m_run->controller()->confirmLoadSet();
}

void SweepWorkspace::pauseOrResume()
{
    if (!isRunning())
        return;
    SweepController *controller = m_run->controller();
    // A pause the controller made itself (no valid reading, a failed commit) is resumed by the
    // same button; a lost link is not: pausing then means the operator's pause on top of it.
    const bool resuming = controller->state() == SweepState::Paused && (m_paused || !controller->isLinkDown());
    m_paused = !resuming;
    if (m_paused) {
        controller->pause();
    } else {
        controller->resume();
        emit notice(tr("Resumed at step %1").arg(controller->currentStep()));
    }
    emit runningChanged(true);
}

void SweepWorkspace::stop()
{
    if (!isRunning())
        return;
    if (m_run->isConnecting()) {
        m_run.reset(); // nothing recorded yet; drops the half-open links
        discardUnusedSession();
        emit instrumentStatus(tr("not connected"));
        emit runningChanged(false);
        return;
    }
    m_run->controller()->stop();
}

bool SweepWorkspace::isRunning() const
{
    if (!m_run || !m_run->controller())
        return false;
    if (m_run->isConnecting())
        return true;
    const SweepState state = m_run->controller()->state();
    return state != SweepState::Idle && state != SweepState::Finished && state != SweepState::Stopped;
}

QString SweepWorkspace::openSession(const QString &path)
{
    // Everything of the session shown before goes, whatever happens next: one session at a time.
    m_run.reset();
    m_store.reset();
    m_recordedSettings.reset();
    m_records = {};
    m_details = {};
    m_person.clear();
    m_limitChoice = {};
    m_readOnlyReason.clear();
    resetReadings();
    m_paused = false;
    emit runningChanged(false);
    if (path.isEmpty()) {
        emit sessionChanged();
        return {};
    }
    const auto failed = [this](const std::string &message) {
        emit sessionChanged();
        return QString::fromStdString(message);
    };
    // Looked at first without writing: an older file stays as it is (opening never migrates
    // it; a copy saved from it is in the current format), and only a current one is taken for
    // writing. A file another program is writing, or a read-only one, is shown for review.
    auto opened = SessionStore::openForReview(path.toStdString());
    if (!opened.ok())
        return failed(opened.message);
    QString reviewOnly;
    if (opened.value->fileSchemaVersion() < sessionSchemaVersion) {
        reviewOnly = tr("%1: written by an older Sagline (schema %2); shown read-only, so opening it does not change it. "
                        "File, Save a copy as… writes it in the current format.")
                         .arg(path)
                         .arg(opened.value->fileSchemaVersion());
    } else if (opened.value->fileSchemaVersion() == sessionSchemaVersion) {
        auto writable = SessionStore::openForWriting(path.toStdString());
        if (writable.ok())
            opened = std::move(writable);
        else if (writable.code == StoreCode::Busy || writable.code == StoreCode::ReadOnly
                 || writable.code == StoreCode::CannotOpen)
            reviewOnly = tr("Shown read-only: %1").arg(QString::fromStdString(writable.message));
        else
            return failed(writable.message);
    }
    auto readings = opened.value->readings();
    if (!readings.ok())
        return failed(readings.message);
    m_store = std::move(opened.value);
    if (const QString problem = loadRecords(); !problem.isEmpty()) {
        m_store.reset();
        m_records = {};
        return failed(problem.toStdString());
    }
    m_records.fromFile = true;
    if (const auto notes = m_store->notes(); notes.ok()) {
        const RecordedAnalysisSettings recorded = latestAnalysisSettings(notes.value);
        m_recordedSettings = recorded.settings;
        for (const std::string &text : recorded.notices)
            emit notice(QString::fromStdString(text));
    }
    m_details = sessionDetailsFrom(m_records);
    setSetupJson(QString::fromStdString(m_records.info.setupJson));
    // A plan that was cut to its safe steps when the session started is that plan again.
    for (const SweepEventRecord &event : m_records.sweepEvents) {
        if (event.kind == SweepEventKind::Truncated && m_plan)
            m_plan = truncatedToSafe(*m_plan);
    }
    m_readings = std::move(readings.value);
    for (const auto &reading : m_readings) {
        if (entersFit(reading))
            m_fit.add(reading.currentA, reading.voltageV);
    }
    fitUpdated();
    if (m_store->isReadOnly())
        m_readOnlyReason = !reviewOnly.isEmpty() ? reviewOnly
                           : !m_store->notice().empty() ? QString::fromStdString(m_store->notice())
                                                        : tr("the file cannot be written");
    emit sessionChanged();
    if (!m_store->notice().empty())
        emit notice(QString::fromStdString(m_store->notice()));
    if (!reviewOnly.isEmpty())
        emit notice(reviewOnly);
    return {};
}

QString SweepWorkspace::sessionPath() const { return m_store ? QString::fromStdString(m_store->path()) : QString(); }

QString SweepWorkspace::exclude(int row, const QString &reason)
{
    if (!m_store || row < 0 || row >= static_cast<int>(m_readings.size()))
        return tr("exclude: no such reading");
    Reading &reading = m_readings[static_cast<std::size_t>(row)];
    // core's rules, shared with sagline-cli exclude: the person, a reason, not superseded, sealed.
    const auto result = excludeReadingAs(*m_store, reading, row + 1, reason.toStdString());
    if (!result.ok())
        return QString::fromStdString(result.message);
    const bool wasInFit = entersFit(reading);
    reading.excluded = true;
    if (wasInFit)
        m_fit.remove(reading.currentA, reading.voltageV);
    loadRecords();
    fitUpdated();
    emit readingChanged(row);
    emit fitChanged();
    return {};
}

QString SweepWorkspace::restore(int row, const QString &reason)
{
    if (!m_store || row < 0 || row >= static_cast<int>(m_readings.size()))
        return tr("restore: no such reading");
    Reading &reading = m_readings[static_cast<std::size_t>(row)];
    const auto result = restoreReadingAs(*m_store, reading, row + 1, reason.toStdString());
    if (!result.ok())
        return QString::fromStdString(result.message);
    reading.excluded = false;
    if (entersFit(reading))
        m_fit.add(reading.currentA, reading.voltageV);
    loadRecords();
    fitUpdated();
    emit readingChanged(row);
    emit fitChanged();
    return {};
}

QString SweepWorkspace::addNote(const QString &text)
{
    if (!m_store)
        return tr("note: no session is open");
    const auto result = addPersonNote(*m_store, text.toStdString());
    return result.ok() ? QString() : QString::fromStdString(result.message);
}

QString SweepWorkspace::recordTemperature(TemperatureKind kind, double celsius, const QString &source)
{
    if (!m_store)
        return tr("temperature: no session is open");
    const auto result = recordPersonTemperature(*m_store, kind, celsius, source.toStdString());
    if (!result.ok())
        return QString::fromStdString(result.message);
    return loadRecords();
}

QString SweepWorkspace::recordAnalysisSettings(const VerdictSettings &verdict)
{
    if (!isChangeable())
        return {}; // read-only or signed off: judged as recorded
    AnalysisSettings settings;
    settings.rule = verdict.rule;
    settings.temperatureConstant = verdict.constant;
    // Read by core's parser, as the results panel reads them; what does not read is not stored.
    QString problem;
    const auto limit = typedRegulationLimit(verdict.regulationLimit, {}, &problem);
    if (!problem.isEmpty())
        return QStringLiteral("verdict.regulation_limit_percent: not stored in the session, ") + problem;
    if (limit && limit->kind == RegulationLimitChoice::Kind::Nameplate)
        settings.regulationLimitNameplate = true;
    else if (limit)
        settings.regulationLimitPercent = limit->percent;
    settings.referenceTemperatureC = typedQuantity(verdict.referenceTemperature, Unit::Celsius, {}, &problem);
    if (!problem.isEmpty())
        return QStringLiteral("verdict.reference_temperature_c: not stored in the session, ") + problem;
    if (m_recordedSettings == settings)
        return {};
    // Only what a reader will accept is stored (e.g. a limit above zero).
    const std::string text = analysisSettingsNoteText(settings);
    if (const AnalysisSettingsParse check = parseAnalysisSettings(text); !check.settings)
        return QStringLiteral("verdict.") + QString::fromStdString(check.errors.front().message())
               + QStringLiteral(" (not stored in the session)");
    const auto result = m_store->addNote(analysisSettingsNoteAuthor, text);
    if (!result.ok())
        return QString::fromStdString(result.message);
    m_recordedSettings = settings;
    return {};
}

void SweepWorkspace::acceptRecorded(const Reading &reading)
{
    m_readings.push_back(reading);
    if (entersFit(reading))
        m_fit.add(reading.currentA, reading.voltageV);
    std::optional<int> superseded;
    if (m_retakeRow && *m_retakeRow < static_cast<int>(m_readings.size()) - 1
        && m_readings[static_cast<std::size_t>(*m_retakeRow)].step == reading.step && !(reading.flags & (flagOverload | flagNotANumber))) {
        // The retake is in: the reading it replaces leaves the fit (it stays in the file, superseded).
        Reading &old = m_readings[static_cast<std::size_t>(*m_retakeRow)];
        if (entersFit(old))
            m_fit.remove(old.currentA, old.voltageV);
        old.superseded = true;
        old.excluded = true;
        superseded = m_retakeRow;
        m_retakeRow.reset();
        loadRecords();
    }
    fitUpdated();
    emit readingRecorded(static_cast<int>(m_readings.size()) - 1);
    if (superseded)
        emit readingChanged(*superseded);
    emit fitChanged();
}

const FitSummary &SweepWorkspace::summary()
{
    if (!m_summaryStale)
        return m_summary;
    if (m_readings.size() <= summaryEveryPointUpTo) {
        m_summary = fitReadings(m_readings, FitMethod::Ols);
        m_summaryStale = false;
        return m_summary;
    }
    const bool due = !m_summaryClock.isValid() || m_summaryClock.elapsed() >= summaryIntervalMs;
    if (due && !m_backgroundFit->isRunning()) {
        m_backgroundFit->start(columnsToFit(m_readings, FitVoltages::Raw, 0.0), m_fitChanges);
        m_summaryClock.start();
    } else if (!m_backgroundFit->isRunning() && !m_summaryDue.isActive()) {
        // Not yet due: come back when it is, even if no further point arrives.
        m_summaryDue.start(static_cast<int>(summaryIntervalMs - m_summaryClock.elapsed()));
    }
    return m_summary;
}

const SweepWorkspace::PrimarySideView &SweepWorkspace::primarySide()
{
    if (m_primaryAt == m_fitChanges)
        return m_primary;
    m_primaryAt = m_fitChanges;
    m_primary = {};
    const bool anyPrimary = std::any_of(m_readings.begin(), m_readings.end(), [](const Reading &r) { return r.primary.hasAny(); });
    if (!m_setup || !anyPrimary)
        return m_primary;
    const double ratedV1 = m_setup->nameplate.primaryVoltageV;
    m_primary.supply = assessSupply(m_readings, ratedV1, FitVoltages::Referred, defaultSupplyDriftTolerancePercent,
                                    primaryVoltmeterOf(m_setup->meters));
    m_primary.fit = fitReadings(columnsToFit(m_readings, m_primary.supply.fitVoltages, ratedV1), FitMethod::Ols,
                                fitOptionsFor(m_setup->meters));
    AnalysisInput analysisInput = analysisInputFor(*m_setup);
    analysisInput.referralGainUPercent = m_primary.supply.referralGainUPercent;
    m_primary.result = analysePrimarySide(m_readings, m_primary.fit.ok() ? &m_primary.fit : nullptr, &analysisInput,
                                          primarySideInputFor(m_setup->nameplate));
    return m_primary;
}

void SweepWorkspace::backgroundSummaryArrived(std::uint64_t fitChange, const FitSummary &summary)
{
    if (fitChange < m_readingsReplacedAt)
        return; // fitted the readings of a session no longer shown
    m_summary = summary;
    m_summaryStale = fitChange != m_fitChanges;
    emit fitChanged(); // the views ask again; a still-stale summary is then started or scheduled
}

double SweepWorkspace::residualOf(double currentA, double voltageV) const
{
    return voltageV - m_line.intercept - m_line.slope * currentA;
}

void SweepWorkspace::discardUnusedSession()
{
    // Only the file a start just created, before anything was recorded into it: it holds the
    // setup alone, and a retry creates a new one.
    if (!m_store || !m_readings.empty() || m_run)
        return;
    const QString path = sessionPath();
    m_store.reset();
    QFile::remove(path);
    emit sessionDiscarded();
}

void SweepWorkspace::resetReadings()
{
    m_readings.clear();
    m_fit.clear();
    m_summary = {};
    m_nextCurrentA.reset();
    fitUpdated();
    m_readingsReplacedAt = m_fitChanges;
}

void SweepWorkspace::fitUpdated()
{
    ++m_fitChanges;
    m_summaryStale = true;
    const LineFitResult result = m_fit.result();
    m_line = result.ok() ? Line{result.slope, result.intercept} : Line{};
}

void SweepWorkspace::setNextStep(int step)
{
    m_nextCurrentA.reset();
    if (m_plan) {
        for (const auto &planned : m_plan->steps) {
            if (planned.index == step)
                m_nextCurrentA = planned.currentA;
        }
    }
    emit fitChanged();
}

} // namespace sagline
