// Helpers shared by the UI tests: a main window on the demo setup with its sessions in a
// temporary folder, and typing into fields the way a person does.
#pragma once

#include "EventLoopWait.h"
#include "MainWindow.h"
#include "QuantityField.h"
#include "SetupForm.h"
#include "SetupJson.h"
#include "Units.h"

#include <QLineEdit>
#include <QTemporaryDir>
#include <QTest>

#include <functional>
#include <limits>
#include <memory>

namespace sagline::test {

// Runs the event loop until `done()` or `timeoutMs` of wall time; returns done().
inline bool waitUntil(const std::function<bool()> &done, int timeoutMs = 10000)
{
    return runEventsUntil(done, timeoutMs);
}

inline void typeInto(QLineEdit *edit, const QString &text)
{
    edit->setFocus();
    edit->selectAll();
    QTest::keyClick(edit, Qt::Key_Backspace);
    QTest::keyClicks(edit, text);
}

inline void typeInto(QuantityField *field, const QString &text) { typeInto(field->lineEdit(), text); }

inline QString text(QuantityField *field) { return field->text(); }

// A window showing the repository's demo setup, sessions going to `folder`.
inline std::unique_ptr<MainWindow> demoWindow(const QString &folder)
{
    auto window = std::make_unique<MainWindow>();
    window->setSessionFolder(folder);
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    if (parsed.setup)
        window->loadSetup(*parsed.setup);
    window->resize(1400, 900);
    return window;
}

// The value of a shown result such as "521.0 mΩ ± 3.5 mΩ", in SI units (read by core's parser).
inline double shownValue(const QString &shown, Unit unit)
{
    const auto parsed = parseQuantity(shown.section(QStringLiteral(" ± "), 0, 0).toStdString(), unit);
    return parsed.ok ? parsed.value : std::numeric_limits<double>::quiet_NaN();
}

} // namespace sagline::test
