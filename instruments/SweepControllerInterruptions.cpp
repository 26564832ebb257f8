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
    m_linkReturnsThisStep = 0;
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
    // A link that keeps dropping and coming back (a meter that closes after *IDN?, a cable
    // that breaks contact) would resume and pause for ever: past a few returns in one step it
    // counts as lost, and the sweep waits for someone (or gives up).
    if (++m_linkReturnsThisStep > m_options.maxLinkReturnsPerStep) {
        m_operatorPaused = true; // resume() is needed now; a later restore does not resume
        m_pauseReason = tr("step %1: the link dropped and came back %2 times; counted as lost. Check the cable and "
                           "the meters, then resume")
                            .arg(m_step)
                            .arg(m_linkReturnsThisStep);
        event(m_pauseReason);
        emit paused(m_pauseReason);
        return;
    }
    if (retryHeldCommit())
        return;
    if (!hasProgrammableLoad())
        event(tr("step %1: waiting for the operator to confirm the load again").arg(m_step));
    beginStep();
}

// Nobody resolved the pause within options.giveUpAfterMs (a headless run): the sweep ends with
// the reason recorded, and a programmable load is switched off (loadSwitchedOff says whether
// it confirmed; where it cannot be, the caller tells the operator to do it by hand).
void SweepController::giveUp()
{
    if (m_state != SweepState::Paused)
        return;
    endPaused(tr("gave up at step %1 after waiting %2 s with nobody to resolve the pause: %3")
                  .arg(m_step)
                  .arg(static_cast<double>(m_options.giveUpAfterMs) / 1000.0)
                  .arg(m_pauseReason),
              SweepOutcome::GaveUp);
}

void SweepController::abandon(const QString &reason)
{
    if (m_state == SweepState::Paused)
        endPaused(reason, SweepOutcome::Failed);
}

void SweepController::endPaused(const QString &reason, SweepOutcome outcome)
{
    event(reason);
    if (m_sink)
        m_sink->recordSweepEvent(SweepEventKind::Stopped, m_step, reason);
    emit notice(reason);
    openLoad();
    finish(outcome);
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
