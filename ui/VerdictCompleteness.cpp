#include "VerdictCompleteness.h"

#include <QObject>

namespace sagline {

void applyCompleteness(ResultsView &view, const SessionProgress &progress)
{
    if (view.state == VerdictState::None || progress.isComplete())
        return;
    const QString label = QString::fromStdString(progress.label());
    if (progress.state == Completeness::InProgress) {
        view.state = VerdictState::Provisional;
        view.verdictText = label.left(1).toUpper() + label.mid(1);
        view.verdictRule = QObject::tr("The verdict waits for every planned step; the results above are from the points "
                                       "recorded so far.");
    } else {
        view.state = VerdictState::Incomplete;
        view.verdictText = label.left(1).toUpper() + label.mid(1) + QObject::tr(": no verdict");
        view.verdictRule = QObject::tr("A sweep that ended before its last step is not judged; resume it to record the "
                                       "remaining steps.");
    }
}

} // namespace sagline
