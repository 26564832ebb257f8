// A whole typed-in sweep with the keyboard alone: every key goes to the widget that has the
// focus, as it would for a person without a mouse. Tab reaches the fields, the menu
// shortcuts switch tabs and start the sweep, Enter records, and a point is excluded with its
// reason from the readings table.
#include "UiTestSupport.h"

#include "InstrumentsPanel.h"
#include "NextStepStrip.h"
#include "PlanPanel.h"
#include "ReadingsTableModel.h"
#include "ResultsPanel.h"
#include "SweepWorkspace.h"

#include <gtest/gtest.h>

#include <QApplication>
#include <QComboBox>
#include <QInputDialog>
#include <QPushButton>
#include <QTableView>

using namespace sagline;
using namespace sagline::test;

namespace {

QWidget *focused() { return QApplication::focusWidget(); }

QLineEdit *editNamed(QWidget *parent, const QString &accessibleName)
{
    for (auto *edit : parent->findChildren<QLineEdit *>()) {
        if (edit->accessibleName() == accessibleName)
            return edit;
    }
    return nullptr;
}

void press(QWidget *window, int key, Qt::KeyboardModifiers modifiers = Qt::NoModifier)
{
    QTest::keyClick(focused() ? focused() : window, static_cast<Qt::Key>(key), modifiers);
}

void type(const QString &text) { QTest::keyClicks(focused(), text); }

// Presses Tab until `target` has the focus; false if it never comes round.
bool tabTo(QWidget *window, QWidget *target, int maxPresses = 120)
{
    for (int i = 0; i < maxPresses && focused() != target; ++i)
        press(window, Qt::Key_Tab);
    return focused() == target;
}

// Replaces the text of the focused line edit, by keys only.
void retype(const QString &text)
{
    press(nullptr, Qt::Key_A, Qt::ControlModifier);
    press(nullptr, Qt::Key_Backspace);
    type(text);
}

// Invented readings of a made-up 60 VA unit (demo data): V = 19.62 V − 0.50 Ω · I plus a few mV.
constexpr double noLoadV = 19.62;
constexpr double resistanceOhm = 0.50;
constexpr double noiseV[] = {0.004, -0.003, 0.005, -0.006, 0.002, -0.004, 0.006, -0.002, 0.003};

} // namespace

TEST(KeyboardSweep, WholeTypedInSweepWithoutTheMouse)
{
    QTemporaryDir folder;
    ASSERT_TRUE(folder.isValid());
    auto window = demoWindow(folder.path());
    window->show();
    QApplication::setActiveWindow(window.get());
    ASSERT_TRUE(QTest::qWaitForWindowActive(window.get()));
    SetupForm *form = window->setupForm();

    // Setup tab (Alt+1): Tab round to the operator and the unit serial, type them.
    press(window.get(), Qt::Key_1, Qt::AltModifier);
    auto *operatorEdit = editNamed(form, QStringLiteral("session.operator"));
    auto *serialEdit = editNamed(form, QStringLiteral("session.unit_serial"));
    ASSERT_NE(operatorEdit, nullptr);
    ASSERT_NE(serialEdit, nullptr);
    form->quantityField("nameplate.rated_power_va")->lineEdit()->setFocus(); // where a person clicks in first
    ASSERT_TRUE(tabTo(window.get(), operatorEdit));
    retype(QStringLiteral("Keyboard tester"));
    ASSERT_TRUE(tabTo(window.get(), serialEdit));
    retype(QStringLiteral("KB-0007"));
    // A nameplate field is reached by Tab too, and changing it replans.
    ASSERT_TRUE(tabTo(window.get(), form->quantityField("bench.steps")->lineEdit()));
    retype(QStringLiteral("8"));
    ASSERT_TRUE(window->workspace()->plan().has_value());
    EXPECT_EQ(window->workspace()->plan()->steps.size(), 9u);

    // Instruments tab (Alt+3): the source list takes arrow keys; pick the typed-in readings.
    press(window.get(), Qt::Key_3, Qt::AltModifier);
    QComboBox *source = window->instrumentsPanel()->sourceBox();
    ASSERT_TRUE(tabTo(window.get(), source));
    for (int i = 0; i < source->count() && source->currentData().toInt() != int(ReadingSource::TypedIn); ++i)
        press(window.get(), Qt::Key_Down);
    ASSERT_EQ(source->currentData().toInt(), int(ReadingSource::TypedIn));

    // Plan tab (Alt+2) to look at it, then accept and start (Ctrl+Shift+A).
    press(window.get(), Qt::Key_2, Qt::AltModifier);
    press(window.get(), Qt::Key_A, Qt::ControlModifier | Qt::ShiftModifier);
    ASSERT_TRUE(window->workspace()->isRunning()) << window->lastMessage().toStdString();
    NextStepStrip *strip = window->nextStep();
    EXPECT_EQ(focused(), strip->currentField()->lineEdit()) << "the current field takes the focus when the sweep starts";

    // Each step: the current, Enter, the voltage, Enter records.
    const auto &plan = *window->workspace()->plan();
    for (std::size_t k = 0; k < plan.steps.size(); ++k) {
        const double current = plan.steps[k].currentA;
        ASSERT_EQ(focused(), strip->currentField()->lineEdit()) << "step " << k;
        type(QString::number(current, 'f', 4) + QStringLiteral(" A"));
        press(window.get(), Qt::Key_Return);
        ASSERT_EQ(focused(), strip->voltageField()->lineEdit());
        type(QString::number(noLoadV - resistanceOhm * current + noiseV[k], 'f', 4) + QStringLiteral(" V"));
        press(window.get(), Qt::Key_Return);
        ASSERT_EQ(window->workspace()->readings().size(), k + 1) << window->lastMessage().toStdString();
    }
    EXPECT_FALSE(window->workspace()->isRunning());
    window->flushCharts();
    EXPECT_NEAR(shownValue(window->results()->value("series_resistance"), Unit::Ohm), resistanceOhm, 0.01);

    // Readings table (Alt+4): Down to the third reading, Ctrl+Delete, type the reason, Enter.
    press(window.get(), Qt::Key_4, Qt::AltModifier);
    QTableView *table = window->findChild<QTableView *>();
    ASSERT_NE(table, nullptr);
    ASSERT_EQ(focused(), table);
    press(window.get(), Qt::Key_Home, Qt::ControlModifier);
    press(window.get(), Qt::Key_Down);
    press(window.get(), Qt::Key_Down);
    ASSERT_EQ(table->currentIndex().row(), 2);
    // The reason dialog is the window's own (a real QInputDialog); the name was given at the start.
    window->setTextPrompt([w = window.get()](const QString &title, const QString &label) -> std::optional<QString> {
        if (title.startsWith(QLatin1String("Who is making changes")))
            return testPerson;
        bool ok = false;
        const QString text = QInputDialog::getText(w, title, label, QLineEdit::Normal, QString(), &ok);
        return ok ? std::optional<QString>(text) : std::nullopt;
    });
    // The reason dialog is modal: once it is up, type into its field and confirm with Enter.
    bool dialogSeen = false;
    QTimer answer;
    answer.setInterval(20);
    QObject::connect(&answer, &QTimer::timeout, [&] {
        auto *dialog = qobject_cast<QInputDialog *>(QApplication::activeModalWidget());
        auto *field = dialog ? dialog->findChild<QLineEdit *>() : nullptr;
        if (!field || !field->isVisible())
            return;
        answer.stop();
        dialogSeen = true;
        QTest::keyClicks(field, QStringLiteral("lead touched the terminal"));
        QTest::keyClick(field, Qt::Key_Return);
        if (dialog->isVisible())
            dialog->reject(); // never leave the test waiting on a modal dialog
    });
    answer.start();
    press(window.get(), Qt::Key_Delete, Qt::ControlModifier);
    EXPECT_TRUE(dialogSeen);
    ASSERT_TRUE(window->workspace()->readings()[2].excluded) << window->lastMessage().toStdString();
    EXPECT_EQ(window->readingsModel()->exclusionReason(2), QStringLiteral("lead touched the terminal"));
    window->flushCharts();
    EXPECT_EQ(window->results()->value("points"), QStringLiteral("8"));
}
