// SweepController, interruptions: the operator's pause and resume, and a lost and restored
// instrument link. Recorded points are always kept; the interrupted step starts again, and its
// load is confirmed again (or set again, when programmable) since it may have been changed.
#include "SweepController.h"

namespace sagline {

void SweepController::pause()
{
    if (m_state == SweepState::Idle || m_state == SweepState::Finished || m_state == SweepState::Stopped)
        return;
    m_operatorPaused = true;
    markLoadInDoubtUntilResumed();
    cancelTimers();
    ++m_readSerial;
    m_pauseReason = tr("paused by the operator");
    setState(SweepState::Paused);
    event(tr("paused by the operator at step %1").arg(m_step));
    emit paused(m_pauseReason);
}

// Anyone may change the load while the sweep is paused (by the operator, or to check the
// meters): resume() has it confirmed (or set, when programmable) again before reading.
void SweepController::markLoadInDoubtUntilResumed()
{
    if (m_rig && !m_pauseInDoubt) {
        m_pauseInDoubt = true;
        m_confirmedBeforePause = m_loadConfirmed;
    }
}

void SweepController::resume()
{
    if (m_state != SweepState::Paused)
        return;
    if (m_linkDown) {
        emit notice(tr("still waiting for the instruments: %1").arg(m_pauseReason));
        return;
    }
    m_operatorPaused = false;
    if (retryHeldCommit())
        return;
    event(tr("resumed at step %1").arg(m_step));
    if (m_pauseInDoubt && !m_loadInDoubt) {
        m_loadConfirmed = false;
        if (!hasProgrammableLoad())
            event(tr("step %1: waiting for the operator to confirm the load again").arg(m_step));
    }
    beginStep();
}

void SweepController::handleRigLost(const QString &message)
{
    if (m_state == SweepState::Idle || m_state == SweepState::Finished || m_state == SweepState::Stopped) {
        emit notice(message);
        return;
    }
    m_linkDown = true;
    cancelTimers();
    ++m_readSerial;
    // Nobody can tell from here whether the load was moved while the meters were away: the
    // step's load is confirmed (or set by the programmable load) again before it is read.
    if (!m_loadInDoubt)
        m_confirmedBeforeLoss = m_loadConfirmed || (m_pauseInDoubt && m_confirmedBeforePause);
    m_loadInDoubt = true;
    m_loadConfirmed = false;
    m_pauseReason = hasProgrammableLoad()
                        ? tr("link lost at step %1: %2. Recorded points are kept; when the link is back the load is "
                             "set again and the sweep resumes at this step")
                              .arg(m_step)
                              .arg(message)
                        : tr("link lost at step %1: %2. Recorded points are kept; when the link is back, confirm the "
                             "load of this step again and the sweep resumes at this step")
                              .arg(m_step)
                              .arg(message);
    setState(SweepState::Paused);
    event(m_pauseReason);
    emit linkLost(m_pauseReason);
    emit paused(m_pauseReason);
}

void SweepController::handleRigRestored(const QString &message)
{
    if (!m_linkDown)
        return;
    m_linkDown = false;
    event(tr("link restored: %1").arg(message));
    emit linkRestored(message);
    if (m_state != SweepState::Paused || m_operatorPaused)
        return;
    if (retryHeldCommit())
        return;
    if (!hasProgrammableLoad())
        event(tr("step %1: waiting for the operator to confirm the load again").arg(m_step));
    beginStep();
}

// A reading whose commit failed is committed again before anything else: the step was already
// measured. True when there was one (whatever the commit's result).
bool SweepController::retryHeldCommit()
{
    if (!m_uncommitted)
        return false;
    setState(SweepState::Measuring);
    Reading reading = *m_uncommitted;
    if (commitAndReport(reading))
        nextStep();
    return true;
}

} // namespace sagline
