// A start the window cannot complete: the LAN source pointed at a loopback port nobody
// listens on, so the connection is refused at once. Used by the tests of what a failed start
// leaves behind (no empty session file, nothing locked, nothing listed).
#pragma once

#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "PlanPanel.h"

#include <QComboBox>
#include <QPushButton>
#include <QTcpServer>

namespace sagline::test {

// A loopback port that was free a moment ago (the probe listened on it, then closed).
inline quint16 refusedLocalPort()
{
    QTcpServer probe;
    if (!probe.listen(QHostAddress::LocalHost, 0))
        return 0;
    return probe.serverPort();
}

// Fills in the session, picks the LAN source at the refused port and clicks Accept.
inline void startOnRefusedLanPort(MainWindow &window, const QString &operatorName, const QString &unitSerial)
{
    window.setupForm()->setSessionDetails({operatorName, unitSerial, {}, {}});
    InstrumentsPanel *panel = window.instrumentsPanel();
    panel->sourceBox()->setCurrentIndex(panel->sourceBox()->findData(int(ReadingSource::Lan)));
    typeInto(panel->addressEdit(), QStringLiteral("127.0.0.1:%1").arg(refusedLocalPort()));
    QTest::mouseClick(window.planPanel()->acceptButton(), Qt::LeftButton);
}

} // namespace sagline::test
