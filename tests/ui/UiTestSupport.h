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

#include <QStringList>

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

// The person the UI tests name when the window asks who makes the changes.
inline const QString testPerson = QStringLiteral("U. Tester");

// Answers the window's questions as a person would: the name when asked who makes changes,
// `reasons` in turn for anything else (nothing when they run out: the dialog is cancelled).
// A typed value far from the step's expectation is confirmed only when `confirm` says so;
// stopping the sweep is always confirmed (the person clicked Stop meaning it).
inline void answerPrompts(MainWindow &window, QStringList reasons = {}, bool confirm = false,
                          QStringList *asked = nullptr)
{
    auto queue = std::make_shared<QStringList>(std::move(reasons));
    window.setTextPrompt([queue, asked](const QString &title, const QString &label) -> std::optional<QString> {
        if (asked)
            asked->append(title + QStringLiteral(": ") + label);
        if (title.startsWith(QLatin1String("Who is making changes")))
            return testPerson;
        if (queue->isEmpty())
            return std::nullopt;
        return queue->takeFirst();
    });
    window.setConfirmPrompt([confirm, asked](const QString &title, const QString &text) {
        if (asked)
            asked->append(title + QStringLiteral(": ") + text);
        if (title == QLatin1String("Stop the sweep"))
            return true;
        return confirm;
    });
}

// A window showing the repository's demo setup, sessions going to `folder`.
inline std::unique_ptr<MainWindow> demoWindow(const QString &folder)
{
    auto window = std::make_unique<MainWindow>();
    answerPrompts(*window);
    window->setSessionFolder(folder);
    const auto parsed = loadSetupFile(std::string(SAGLINE_SOURCE_DIR) + "/resources/demo-setup.json");
    if (parsed.setup) {
        window->setDefaultSetup(*parsed.setup);
        window->loadSetup(*parsed.setup);
    }
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
