// A student's supervised session from a lab sheet: the plan the sheet fixes, step by step,
// readings typed in by hand. Each reading passes the same checks as at the bench (the
// instruments layer's parseManualValue for the text, core's checkSafety for rated VA and the
// rheostat) and the sheet's own load limit (core's checkReadingAgainstSheet). A refused
// reading is not recorded as a reading; a refusal by the sheet is recorded as a limit-hit note,
// a safety trip as a safety stop that ends the session. Widget-free so tests drive it directly.
#pragma once

#include "LabSheet.h"
#include "Planner.h"
#include "SafetyLimits.h"
#include "SessionStore.h"
#include "SupervisedRecords.h"

#include <QString>

#include <memory>

namespace sagline {

class SupervisedSession {
public:
    explicit SupervisedSession(LabSheet sheet);

    const LabSheet &sheet() const { return m_sheet; }
    const Plan &plan() const { return m_plan; }
    bool hasPlan() const { return m_planOk; }
    QString planProblem() const { return m_planProblem; }

    // Creates the session file with the lab sheet stamp and the ticked checklist. Refuses an
    // incomplete checklist, a missing name or serial, an existing file. "" when started.
    QString start(const QString &path, const QString &student, const QString &unitSerial,
                  const SafetyChecklist &checklist);
    bool isStarted() const { return m_store != nullptr; }
    bool isFinished() const { return m_finished; }
    int stepIndex() const { return m_stepIndex; }            // index into plan().steps
    int stepCount() const { return static_cast<int>(m_plan.steps.size()); }
    QString instruction() const;                             // what to set and what to expect now

    struct Outcome {
        bool recorded = false;
        bool limitHit = false;   // refused by the lab sheet (recorded as a note)
        bool safetyStop = false; // a hard limit tripped (recorded; the session ends)
        QString message;         // why it was refused, or what was recorded
    };
    Outcome submit(const QString &voltageText, const QString &currentText);

    const SessionStore *store() const { return m_store.get(); }
    QString path() const { return m_path; }

private:
    void recordLimitHit(const LimitCheck &check, double currentA);

    LabSheet m_sheet;
    Plan m_plan;
    bool m_planOk = false;
    QString m_planProblem;
    SafetyLimits m_limits;
    std::unique_ptr<SessionStore> m_store;
    QString m_path;
    int m_stepIndex = 0;
    bool m_finished = false;
};

} // namespace sagline
