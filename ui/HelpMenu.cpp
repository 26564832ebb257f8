#include "HelpMenu.h"

#include "BuildInfo.h"

#include <QAction>
#include <QDialog>
#include <QDialogButtonBox>
#include <QMainWindow>
#include <QMenu>
#include <QMenuBar>
#include <QTextBrowser>
#include <QVBoxLayout>

#include <map>

namespace sagline {

namespace {

void showHtml(QWidget *parent, const QString &objectName, const QString &title, const QString &html)
{
    auto *dialog = new QDialog(parent);
    dialog->setAttribute(Qt::WA_DeleteOnClose);
    dialog->setObjectName(objectName);
    dialog->setWindowTitle(title);
    auto *layout = new QVBoxLayout(dialog);
    auto *browser = new QTextBrowser;
    browser->setOpenExternalLinks(false);
    browser->setHtml(html);
    layout->addWidget(browser);
    auto *buttons = new QDialogButtonBox(QDialogButtonBox::Close);
    QObject::connect(buttons, &QDialogButtonBox::rejected, dialog, &QDialog::reject);
    layout->addWidget(buttons);
    dialog->resize(640, 560);
    dialog->show();
}

QString plainText(QString menuText)
{
    menuText.remove(QLatin1Char('&'));
    return menuText.toHtmlEscaped();
}

} // namespace

QString userGuideHtml()
{
    return QObject::tr(
        "<h2>Sagline in short</h2>"
        "<h3>Cautions first</h3>"
        "<p><b>The primary side is at mains voltage, which can kill.</b> Work on a fused, isolated supply and switch it "
        "off before touching a connection. Use meters and leads rated for the measurement category of the circuit. "
        "Never exceed the transformer's rated VA or the rheostat's rating: Sagline stops a sweep at its limits, but it "
        "cannot see a wrong connection. Its fuse figures are planning aids; local codes, the maker's data and licensed "
        "practice decide.</p>"
        "<h3>Run a sweep</h3>"
        "<ol><li><b>Setup</b> tab: type the nameplate (units as you like: \"500 mA\", \"19,6 V\"), the rheostat, the "
        "fuse fitted and the dwell. <i>File &gt; Open setup</i> loads a setup file, <i>Save setup as</i> writes one "
        "(the same JSON as <tt>sagline-cli plan</tt> reads); <i>Nameplate presets</i> keeps nameplates you use "
        "often.</li>"
        "<li><b>Plan</b> tab: check each step's load, expected voltage, VA margin and fuse outlook. Unsafe steps keep "
        "Accept disabled until you use only the safe ones or override them with a reason.</li>"
        "<li><b>Instruments</b> tab: pick the virtual bench, a SCPI meter on a serial port (with its baud rate, data "
        "bits, parity, stop bits and flow control) or on the LAN, or typed-in readings. <i>Connect and test</i> "
        "shows each meter's identity, its function and one live reading before you start.</li>"
        "<li><b>Accept plan and start</b> (Ctrl+Shift+A). For each step the strip at the top says what to set and "
        "what to expect. Set the load, then <b>Record</b> (Ctrl+Enter). During the dwell the strip counts down and "
        "Record is disabled. A paused sweep turns the strip amber, a lost link red; every recorded point is "
        "kept.</li></ol>"
        "<h3>Type readings in</h3>"
        "<p>With <i>Readings typed in by hand</i>, type the current and voltage in the strip and press Enter in the "
        "voltage field. A value far from what the step expects is asked about before it is recorded.</p>"
        "<h3>Review</h3>"
        "<p>Select a reading in the table to exclude it (with a reason), restore it, add a note or take its step "
        "again; all are recorded with your name. Zoom the chart with the wheel or by dragging a rectangle, pan with "
        "the middle button or the arrow keys, and reset with the chart's menu or Home. The results column shows the "
        "fit, the uncertainty budgets and the verdict against your specification.</p>"
        "<h3>Make a lab sheet and a report</h3>"
        "<p><i>File &gt; Report to PDF</i> writes the test report; <i>Export readings to CSV</i> writes every reading "
        "with exclusions and who made them. <i>Review &gt; Supervised session</i> runs a sweep from a lab sheet a "
        "supervisor fixed; <tt>sagline-cli</tt> does all of this without a display.</p>");
}

QString shortcutsHtml(const QWidget *window)
{
    // Grouped by the menu an action sits in (the strip's and the panels' actions are in them too).
    std::multimap<QString, std::pair<QString, QString>> rows;
    const auto *mainWindow = qobject_cast<const QMainWindow *>(window);
    if (mainWindow) {
        for (QAction *menuAction : mainWindow->menuBar()->actions()) {
            QMenu *menu = menuAction->menu();
            if (!menu)
                continue;
            for (QAction *action : menu->actions()) {
                for (const QKeySequence &keys : action->shortcuts())
                    rows.emplace(plainText(menuAction->text()),
                                 std::pair(keys.toString(QKeySequence::NativeText), plainText(action->text())));
            }
        }
    }
    QString html = QObject::tr("<h2>Keyboard shortcuts</h2><table cellpadding=\"3\">");
    QString group;
    for (const auto &[menu, row] : rows) {
        if (menu != group) {
            html += QStringLiteral("<tr><td colspan=\"2\"><b>%1</b></td></tr>").arg(menu);
            group = menu;
        }
        html += QStringLiteral("<tr><td><tt>%1</tt></td><td>%2</td></tr>").arg(row.first.toHtmlEscaped(), row.second);
    }
    html += QObject::tr("</table><p>In the strip: Enter in the current field moves to the voltage; Enter in the voltage "
                        "field records. Stop has no shortcut and asks first.</p>");
    return html;
}

QString aboutHtml()
{
    return QObject::tr("<h2>Sagline %1</h2>"
                       "<p>Built from commit <tt>%2</tt>, running on Qt %3.</p>"
                       "<p>Plans, runs and reviews the load test of small mains transformers.</p>"
                       "<h3>Libraries used and their licences</h3><ul>"
                       "<li>Qt 6 (Core, Gui, Widgets, Charts, SerialPort, Network): GNU LGPL v3 (Charts: GNU GPL v3 in "
                       "its open-source edition)</li>"
                       "<li>Eigen 3: Mozilla Public License 2.0</li>"
                       "<li>SQLite 3: public domain</li>"
                       "<li>JSON for Modern C++ (nlohmann-json): MIT License</li>"
                       "</ul><p>The primary side under test is at mains voltage: see Help &gt; User guide for the "
                       "cautions. Local codes and licensed practice decide.</p>")
        .arg(QLatin1String(buildinfo::version), QLatin1String(buildinfo::gitCommit), QLatin1String(qVersion()));
}

void addHelpMenu(QMainWindow *window)
{
    QMenu *help = window->menuBar()->addMenu(QObject::tr("&Help"));
    QAction *guide = help->addAction(QObject::tr("&User guide"), window, [window] {
        showHtml(window, QStringLiteral("userGuide"), QObject::tr("Sagline user guide"), userGuideHtml());
    });
    guide->setShortcut(QKeySequence::HelpContents);
    help->addAction(QObject::tr("&Keyboard shortcuts"), window, [window] {
        showHtml(window, QStringLiteral("keyboardShortcuts"), QObject::tr("Keyboard shortcuts"), shortcutsHtml(window));
    });
    help->addSeparator();
    help->addAction(QObject::tr("&About Sagline"), window, [window] {
        showHtml(window, QStringLiteral("aboutSagline"), QObject::tr("About Sagline"), aboutHtml());
    });
}

} // namespace sagline
