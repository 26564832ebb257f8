#include "SupervisedSession.h"

#include "BuildInfo.h"
#include "ManualEntry.h"
#include "NumberFormat.h"
#include "PlanJson.h"
#include "SetupJson.h"

#include <QObject>

namespace sagline {

SupervisedSession::SupervisedSession(LabSheet sheet) : m_sheet(std::move(sheet))
{
    const PlanResult result = makePlan(m_sheet.setup);
    if (result.plan) {
        m_plan = *result.plan;
        m_planOk = true;
        m_limits = safetyLimitsFor(m_plan);
        for (const PlanStep &step : m_plan.steps) {
            const LimitCheck check = checkStepAgainstSheet(m_sheet, step);
            if (!check.allowed) { // the sheet's parser prevents this; kept as a second lock
                m_planOk = false;
                m_planProblem = QString::fromStdString(check.message);
            }
        }
    } else {
        m_planProblem = QString::fromStdString(result.errors.empty() ? "no plan" : result.errors.front().message());
    }
}

QString SupervisedSession::start(const QString &path, const QString &student, const QString &unitSerial,
                                 const SafetyChecklist &checklist)
{
    if (!m_planOk)
        return QObject::tr("the lab sheet's plan cannot be made: %1").arg(m_planProblem);
    if (student.trimmed().isEmpty())
        return QObject::tr("student: your name is required");
    if (unitSerial.trimmed().isEmpty())
        return QObject::tr("unit serial: the transformer's serial number is required");
    if (!checklist.complete())
        return QObject::tr("safety checklist: tick every item before the first reading");
    NewSession session;
    session.setupJson = setupToJson(m_sheet.setup);
    session.planJson = planToJson(m_plan);
    session.operatorName = student.trimmed().toStdString();
    session.unitSerial = unitSerial.trimmed().toStdString();
    session.softwareVersion = std::string("sagline ") + buildinfo::version;
    auto created = SessionStore::create(path.toStdString(), session);
    if (!created.ok())
        return QString::fromStdString(created.message);
    auto &store = created.value;
    SafetyChecklist ticked = checklist;
    ticked.student = session.operatorName;
    for (const StoreStatus &status :
         {store->addNote(labSheetNoteAuthor, labSheetNoteText(labSheetStamp(m_sheet, session.operatorName))).status(),
          store->addNote(checklistNoteAuthor, checklistNoteText(ticked)).status(),
          store->recordInstrument("manual", "typed in by hand (supervised session)", "").status()}) {
        if (!status.ok())
            return QString::fromStdString(status.message);
    }
    m_store = std::move(store);
    m_path = path;
    m_stepIndex = 0;
    return {};
}

QString SupervisedSession::instruction() const
{
    if (!m_planOk)
        return m_planProblem;
    if (m_finished)
        return QObject::tr("Session complete: every step of the lab sheet's plan is recorded.");
    const PlanStep &step = m_plan.steps[static_cast<std::size_t>(m_stepIndex)];
    const QString load = step.loadResistanceOhm
                             ? QObject::tr("set the load to about %1").arg(QString::fromStdString(formatQuantity(*step.loadResistanceOhm, "Ω", 3)))
                             : QObject::tr("leave the secondary open (no load)");
    return QObject::tr("Step %1 of %2: %3; expect about %4 and %5.")
        .arg(m_stepIndex + 1)
        .arg(stepCount())
        .arg(load, QString::fromStdString(formatQuantity(step.currentA, "A", 3)),
             QString::fromStdString(formatQuantity(step.predictedVoltageV, "V", 3)));
}

void SupervisedSession::recordLimitHit(const LimitCheck &check, double currentA)
{
    LimitHit hit;
    hit.rule = check.rule;
    hit.message = check.message;
    hit.step = m_plan.steps[static_cast<std::size_t>(m_stepIndex)].index;
    hit.currentA = currentA;
    m_store->addNote(limitHitNoteAuthor, limitHitNoteText(hit));
}

SupervisedSession::Outcome SupervisedSession::submit(const QString &voltageText, const QString &currentText)
{
    Outcome outcome;
    if (!m_store || m_finished) {
        outcome.message = m_finished ? QObject::tr("the session is complete") : QObject::tr("start the session first");
        return outcome;
    }
    // The same parsing as typed-in readings at the bench: units checked per role.
    const ManualValue voltage = parseManualValue(MeterRole::SecondaryVoltage, voltageText);
    const ManualValue current = parseManualValue(MeterRole::SecondaryCurrent, currentText);
    if (!voltage.ok || !current.ok) {
        outcome.message = !voltage.ok ? voltage.error : current.error;
        return outcome;
    }
    const LimitCheck sheetCheck = checkReadingAgainstSheet(m_sheet, current.value);
    if (!sheetCheck.allowed) {
        recordLimitHit(sheetCheck, current.value);
        outcome.limitHit = true;
        outcome.message = QString::fromStdString(sheetCheck.message);
        return outcome;
    }
    const PlanStep &step = m_plan.steps[static_cast<std::size_t>(m_stepIndex)];
    Reading reading;
    reading.step = step.index;
    reading.currentA = current.value;
    reading.voltageV = voltage.value;
    reading.flags = flagManual;
    reading.rawText = QStringLiteral("V=%1; I=%2").arg(voltageText.trimmed(), currentText.trimmed()).toStdString();
    const auto trip = checkSafety(m_limits, {current.value, voltage.value, step.predictedVoltageV, {}});
    const auto id = m_store->appendReading(reading);
    if (!id.ok()) {
        outcome.message = QString::fromStdString(id.message);
        return outcome;
    }
    if (trip) {
        SafetyStopRecord stop;
        stop.step = step.index;
        stop.rule = toString(trip->limit);
        stop.message = trip->message;
        stop.measured = trip->measured;
        stop.limitValue = trip->limitValue;
        m_store->recordSafetyStop(stop);
        m_store->excludeReading(id.value, "tripped a safety limit: " + trip->message, "sagline");
        m_finished = true;
        outcome.safetyStop = true;
        outcome.message = QObject::tr("Safety stop: %1. Switch the supply off and call your supervisor.")
                              .arg(QString::fromStdString(trip->message));
        return outcome;
    }
    outcome.recorded = true;
    outcome.message = QObject::tr("Recorded step %1: %2, %3.")
                          .arg(m_stepIndex + 1)
                          .arg(QString::fromStdString(formatQuantity(voltage.value, "V")),
                               QString::fromStdString(formatQuantity(current.value, "A")));
    if (++m_stepIndex >= stepCount())
        m_finished = true;
    return outcome;
}

} // namespace sagline
