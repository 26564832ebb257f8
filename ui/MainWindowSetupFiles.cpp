// MainWindow: setup files (open, save, recent) in the CLI's setup format, and nameplate
// presets kept in the user's settings.
#include "MainWindow.h"

#include "NearestFolder.h"
#include "OutputExtension.h"
#include "OutputFile.h"
#include "SetupForm.h"
#include "SetupJson.h"
#include "SweepWorkspace.h"

#include <QFile>
#include <QFileDialog>
#include <QFileInfo>
#include <QJsonDocument>
#include <QJsonObject>
#include <QMenu>
#include <QMessageBox>
#include <QSettings>

namespace sagline {

namespace {
constexpr int maxRecentSetups = 8;
const QString setupFilter = QStringLiteral("Setup files (*.json)");
const QString presetGroup = QStringLiteral("presets/nameplates");

QString fileText(const std::string &text) { return QFile::decodeName(QByteArray::fromStdString(text)); }
} // namespace

QString MainWindow::openSetupFile(const QString &path)
{
    const SetupParse parsed = loadSetupFile(QFile::encodeName(path).toStdString());
    if (!parsed.setup) {
        QStringList problems;
        for (const FieldError &error : parsed.errors)
            problems << m_setupForm->spokenError(error);
        const QString message = tr("%1 was not loaded: %2").arg(path, problems.join(QStringLiteral("; ")));
        showMessage(message, true);
        return message;
    }
    if (m_workspace->store()) {
        // The form of an open session shows that session; a setup goes into a new one.
        if (m_workspace->isRunning()
            && !m_confirmPrompt(tr("Open a setup"), tr("A sweep is running. Stop it and start a new session from this "
                                                       "setup? Every recorded point stays in its session file.")))
            return tr("%1 was not loaded: the running sweep goes on").arg(path);
        if (m_workspace->isRunning())
            m_workspace->stop();
        m_workspace->openSession(QString());
    }
    m_setupForm->loadSetup(*parsed.setup);
    m_recentSetups.removeAll(QFileInfo(path).absoluteFilePath());
    m_recentSetups.prepend(QFileInfo(path).absoluteFilePath());
    while (m_recentSetups.size() > maxRecentSetups)
        m_recentSetups.removeLast();
    rebuildSetupMenus();
    showMessage(tr("Setup loaded from %1").arg(path));
    return {};
}

QString MainWindow::saveSetupFile(const QString &requestedPath)
{
    const OutputName name = outputNameFor(QFile::encodeName(requestedPath).toStdString(), "setup (JSON)", {"json"});
    if (!name.ok())
        return fileText(name.error);
    // Written as core reads it back (numbers in SI units), so the CLI plans the same sweep.
    const SetupParse parsed = parseSetupJson(m_setupForm->setupJson().toStdString());
    if (!parsed.setup) {
        QStringList problems;
        for (const FieldError &error : parsed.errors)
            problems << m_setupForm->spokenError(error);
        return tr("The setup was not saved: %1").arg(problems.join(QStringLiteral("; ")));
    }
    const QString path = fileText(name.path);
    if (const QString problem = writeOutputFile(path, QByteArray::fromStdString(setupToJson(*parsed.setup)));
        !problem.isEmpty())
        return problem;
    m_recentSetups.removeAll(QFileInfo(path).absoluteFilePath());
    m_recentSetups.prepend(QFileInfo(path).absoluteFilePath());
    rebuildSetupMenus();
    showMessage(tr("Setup saved to %1").arg(path));
    return {};
}

void MainWindow::openSetupDialog()
{
    const QString path = QFileDialog::getOpenFileName(this, tr("Open a setup"), nearestExistingFolder(m_sessionFolder),
                                                      setupFilter);
    if (!path.isEmpty())
        openSetupFile(path);
}

void MainWindow::saveSetupDialog()
{
    const QString path = m_savePathPrompt(tr("Save the setup"),
                                          nearestExistingFolder(m_sessionFolder) + QStringLiteral("/setup.json"), setupFilter);
    if (path.isEmpty())
        return;
    if (const QString problem = saveSetupFile(path); !problem.isEmpty())
        showMessage(problem, true);
}

QString MainWindow::saveNameplatePreset(const QString &name)
{
    const QString trimmed = name.trimmed();
    if (trimmed.isEmpty())
        return tr("Preset name: a name is required");
    if (trimmed.contains(QLatin1Char('/')) || trimmed.contains(QLatin1Char('\\')))
        return tr("Preset name: may not contain / or \\");
    QSettings settings;
    settings.setValue(presetGroup + QLatin1Char('/') + trimmed,
                      QString::fromUtf8(QJsonDocument(m_setupForm->nameplateValues()).toJson(QJsonDocument::Compact)));
    rebuildSetupMenus();
    showMessage(tr("Nameplate preset \"%1\" saved").arg(trimmed));
    return {};
}

bool MainWindow::applyNameplatePreset(const QString &name)
{
    if (m_workspace->store()) {
        showMessage(tr("A session is open: its nameplate stays. Start a new session (Ctrl+N) to use a preset."), true);
        return false;
    }
    QSettings settings;
    const QJsonDocument document = QJsonDocument::fromJson(settings.value(presetGroup + QLatin1Char('/') + name).toString().toUtf8());
    if (!document.isObject()) {
        showMessage(tr("Nameplate preset \"%1\" is missing or unreadable").arg(name), true);
        return false;
    }
    m_setupForm->applyNameplate(document.object());
    showMessage(tr("Nameplate preset \"%1\" applied").arg(name));
    return true;
}

QStringList MainWindow::nameplatePresets() const
{
    QSettings settings;
    settings.beginGroup(presetGroup);
    QStringList names = settings.childKeys();
    names.sort(Qt::CaseInsensitive);
    return names;
}

void MainWindow::savePresetDialog()
{
    const auto name = m_textPrompt(tr("Save the nameplate as a preset"), tr("Preset name (e.g. the unit's part number):"));
    if (!name)
        return;
    if (const QString problem = saveNameplatePreset(*name); !problem.isEmpty())
        showMessage(problem, true);
}

void MainWindow::rebuildSetupMenus()
{
    m_recentSetups.removeIf([](const QString &path) { return !QFileInfo::exists(path); });
    if (m_recentSetupsMenu) {
        m_recentSetupsMenu->clear();
        for (const QString &path : std::as_const(m_recentSetups))
            m_recentSetupsMenu->addAction(QFileInfo(path).fileName(), this, [this, path] { openSetupFile(path); })->setToolTip(path);
        m_recentSetupsMenu->setEnabled(!m_recentSetups.isEmpty());
    }
    if (m_presetsMenu) {
        m_presetsMenu->clear();
        m_presetsMenu->addAction(tr("Save the nameplate as a preset…"), this, &MainWindow::savePresetDialog);
        const QStringList names = nameplatePresets();
        if (!names.isEmpty())
            m_presetsMenu->addSeparator();
        for (const QString &name : names)
            m_presetsMenu->addAction(name, this, [this, name] { applyNameplatePreset(name); });
    }
}

} // namespace sagline
