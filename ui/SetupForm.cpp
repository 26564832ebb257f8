#include "SetupForm.h"

#include "AnalysisSettingsRecord.h"
#include "QuantityField.h"
#include "ReadOnlyLook.h"
#include "UiFormat.h"

#include <QCheckBox>
#include <QComboBox>
#include <QFormLayout>
#include <QGroupBox>
#include <QJsonDocument>
#include <QJsonObject>
#include <QLabel>
#include <QLineEdit>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString plain(double value) { return QString::number(value, 'g', 10); }
QString plain(double value, Unit unit) { return plain(value) + QLatin1Char(' ') + unitText(unit); }

// Puts `value` at the dotted `path` of `root`, creating objects on the way.
void insertAt(QJsonObject &root, const QStringList &path, const QJsonValue &value)
{
    if (path.size() == 1) {
        root.insert(path.front(), value);
        return;
    }
    QJsonObject child = root.value(path.front()).toObject();
    insertAt(child, path.mid(1), value);
    root.insert(path.front(), child);
}

} // namespace

SetupForm::SetupForm(QWidget *parent)
    : QWidget(parent), m_construction(new QComboBox), m_material(new QComboBox), m_fuseType(new QComboBox),
      m_decisionRule(new QComboBox), m_temperatureConstant(new QComboBox),
      m_allowOverload(new QCheckBox(tr("Allow overload"))), m_operator(new QLineEdit),
      m_serial(new QLineEdit), m_specificationSource(new QLineEdit), m_otherErrors(new QLabel)
{
    auto *layout = new QVBoxLayout(this);
    m_otherErrors->setWordWrap(true);
    m_otherErrors->setStyleSheet(QStringLiteral("QLabel { color: #d55e00; font-weight: bold; }"));
    m_otherErrors->hide();
    layout->addWidget(m_otherErrors);

    auto *nameplateBox = new QGroupBox(tr("Nameplate"));
    auto *nameplate = new QFormLayout(nameplateBox);
    addQuantity(nameplate, tr("Rated power"), QStringLiteral("nameplate.rated_power_va"), Unit::VoltAmpere, tr("e.g. 50 VA"));
    addQuantity(nameplate, tr("Primary voltage"), QStringLiteral("nameplate.primary_voltage_v"), Unit::Volt, tr("e.g. 120 V"));
    addQuantity(nameplate, tr("Frequency"), QStringLiteral("nameplate.frequency_hz"), Unit::Hertz, tr("e.g. 60 Hz"));
    addQuantity(nameplate, tr("Secondary V, full load"), QStringLiteral("nameplate.secondary_voltage_v"), Unit::Volt, tr("e.g. 24 V"));
    addQuantity(nameplate, tr("Secondary V, no load"), QStringLiteral("nameplate.secondary_no_load_voltage_v"), Unit::Volt, tr("or give regulation"));
    addQuantity(nameplate, tr("Regulation"), QStringLiteral("nameplate.regulation_percent"), Unit::Percent, tr("or give no-load V"));
    m_construction->addItem(tr("Laminated (E-I core)"), QStringLiteral("laminated"));
    m_construction->addItem(tr("Toroidal"), QStringLiteral("toroidal"));
    m_construction->addItem(tr("Other"), QStringLiteral("other"));
    m_construction->setAccessibleName(QStringLiteral("nameplate.construction"));
    nameplate->addRow(tr("Construction"), m_construction);
    m_labels.insert(QStringLiteral("nameplate.construction"), tr("Construction"));
    m_material->addItem(tr("Copper"), QStringLiteral("copper"));
    m_material->addItem(tr("Aluminium"), QStringLiteral("aluminium"));
    m_material->setAccessibleName(QStringLiteral("nameplate.winding_material"));
    nameplate->addRow(tr("Winding material"), m_material);
    m_labels.insert(QStringLiteral("nameplate.winding_material"), tr("Winding material"));
    layout->addWidget(nameplateBox);

    auto *benchBox = new QGroupBox(tr("Bench and sweep"));
    auto *bench = new QFormLayout(benchBox);
    addQuantity(bench, tr("Load steps"), QStringLiteral("bench.steps"), Unit::None, tr("e.g. 10"));
    addQuantity(bench, tr("Top step (× rated I2)"), QStringLiteral("bench.top_fraction"), Unit::None, tr("default 1.1"));
    addQuantity(bench, tr("Hard stop at (× rated VA)"), QStringLiteral("bench.overload_factor"), Unit::None, tr("default 1.1"));
    bench->addRow(QString(), m_allowOverload);
    addQuantity(bench, tr("Rheostat track"), QStringLiteral("bench.rheostat.total_resistance_ohm"), Unit::Ohm, tr("blank: not checked"));
    addQuantity(bench, tr("Rheostat rating"), QStringLiteral("bench.rheostat.power_rating_w"), Unit::Watt, tr("whole track"));
    addQuantity(bench, tr("Primary fuse fitted"), QStringLiteral("bench.fuse.rating_a"), Unit::Ampere, tr("blank: none known"));
    m_fuseType->addItem(tr("Time-lag (T)"), QStringLiteral("time-lag"));
    m_fuseType->addItem(tr("Quick-acting (F)"), QStringLiteral("quick-acting"));
    m_fuseType->setAccessibleName(QStringLiteral("bench.fuse.type"));
    bench->addRow(tr("Fuse type"), m_fuseType);
    m_labels.insert(QStringLiteral("bench.fuse.type"), tr("Fuse type"));
    m_labels.insert(QStringLiteral("bench.fuse"), tr("Primary fuse fitted"));
    m_labels.insert(QStringLiteral("bench.rheostat"), tr("Rheostat"));
    m_labels.insert(QStringLiteral("bench.allow_overload"), tr("Allow overload"));
    m_labels.insert(QStringLiteral("nameplate"), tr("Nameplate"));
    addQuantity(bench, tr("Fuse factor (× rated I1)"), QStringLiteral("bench.fuse_factor"), Unit::None, tr("default: per construction"));
    addQuantity(bench, tr("Magnetizing I (× rated I1)"), QStringLiteral("bench.magnetizing_fraction"), Unit::None, tr("default: per construction"));
    addQuantity(bench, tr("Dwell per step"), QStringLiteral("bench.dwell_s"), Unit::Second, tr("e.g. 10 s"));
    layout->addWidget(benchBox);

    auto *sessionBox = new QGroupBox(tr("Session"));
    auto *session = new QFormLayout(sessionBox);
    m_operator->setAccessibleName(QStringLiteral("session.operator"));
    m_serial->setAccessibleName(QStringLiteral("session.unit_serial"));
    session->addRow(tr("Operator"), m_operator);
    session->addRow(tr("Unit serial number"), m_serial);
    m_labels.insert(QStringLiteral("session.operator"), tr("Operator"));
    m_labels.insert(QStringLiteral("session.unit_serial"), tr("Unit serial number"));
    addQuantity(session, tr("Ambient temperature"), QStringLiteral("session.ambient_temperature_c"), Unit::Celsius, tr("e.g. 23 °C"));
    addQuantity(session, tr("Winding temperature"), QStringLiteral("session.winding_temperature_c"), Unit::Celsius, tr("blank: ambient"));
    layout->addWidget(sessionBox);

    addMetersAndSpecification(layout);

    auto *verdictBox = new QGroupBox(tr("Results and verdict"));
    auto *verdict = new QFormLayout(verdictBox);
    addQuantity(verdict, tr("Regulation limit"), QStringLiteral("verdict.regulation_limit_percent"), Unit::Percent,
                tr("blank: the specification's; or \"nameplate\""));
    m_decisionRule->addItem(tr("Non-binary: pass, conditional, fail (w = U)"), int(DecisionRule::NonBinary));
    m_decisionRule->addItem(tr("Guarded, binary (w = U)"), int(DecisionRule::Guarded));
    m_decisionRule->addItem(tr("Simple acceptance (w = 0)"), int(DecisionRule::Simple));
    m_decisionRule->setToolTip(tr("ILAC-G8:09/2019 decision rules: §4.2.3 non-binary, §4.2.2 binary with guard band, "
                                  "§4.2.1 simple acceptance"));
    m_decisionRule->setAccessibleName(QStringLiteral("verdict.decision_rule"));
    verdict->addRow(tr("Decision rule"), m_decisionRule);
    addQuantity(verdict, tr("Reference temperature"), QStringLiteral("verdict.reference_temperature_c"), Unit::Celsius,
                tr("e.g. 75 °C; blank: none"));
    m_temperatureConstant->addItem(tr("Per winding material"), -1);
    for (auto constant : {TemperatureConstant::CopperIeee, TemperatureConstant::CopperIec, TemperatureConstant::Aluminium})
        m_temperatureConstant->addItem(QString::fromStdString(describe(constant)), int(constant));
    m_temperatureConstant->setAccessibleName(QStringLiteral("verdict.temperature_constant"));
    for (auto *combo : {m_construction, m_material, m_fuseType, m_decisionRule, m_temperatureConstant}) {
        // Long entries must not widen the form beyond its column.
        combo->setSizeAdjustPolicy(QComboBox::AdjustToMinimumContentsLengthWithIcon);
        combo->setMinimumContentsLength(14);
    }
    verdict->addRow(tr("Temperature constant"), m_temperatureConstant);
    layout->addWidget(verdictBox);
    layout->addStretch(1);
    for (auto *combo : {m_decisionRule, m_temperatureConstant})
        connect(combo, &QComboBox::currentIndexChanged, this, &SetupForm::verdictChanged);

    for (auto *combo : {m_construction, m_material, m_fuseType})
        connect(combo, &QComboBox::currentIndexChanged, this, &SetupForm::changed);
    connect(m_allowOverload, &QCheckBox::toggled, this, &SetupForm::changed);
}

QuantityField *SetupForm::addQuantity(QFormLayout *form, const QString &label, const QString &field, Unit unit,
                                      const QString &placeholder)
{
    auto *quantity = new QuantityField(field, unit, placeholder);
    const QString suffix = unitText(unit);
    form->addRow(suffix.isEmpty() ? label : label + QStringLiteral(" (") + suffix + QLatin1Char(')'), quantity);
    m_fields.insert(field, quantity);
    m_labels.insert(field, label);
    if (field.startsWith(QLatin1String("verdict.")) || field.endsWith(QLatin1String("temperature_c")))
        connect(quantity, &QuantityField::edited, this, &SetupForm::verdictChanged);
    else if (!field.startsWith(QLatin1String("session.")))
        connect(quantity, &QuantityField::edited, this, &SetupForm::changed);
    return quantity;
}

QuantityField *SetupForm::quantityField(const QString &field) const { return m_fields.value(field); }

QString SetupForm::labelFor(const QString &field) const { return m_labels.value(field); }

QString SetupForm::spokenError(const FieldError &error) const
{
    const QString label = labelFor(QString::fromStdString(error.field));
    if (label.isEmpty())
        return QString::fromStdString(error.message());
    // message() made the text printable; take its rule part (after the field it starts with).
    const QString message = QString::fromStdString(error.message());
    const QString field = QString::fromStdString(error.field) + QStringLiteral(": ");
    return label + QStringLiteral(": ") + (message.startsWith(field) ? message.mid(field.size()) : QString::fromStdString(error.rule));
}

QJsonObject SetupForm::nameplateValues() const
{
    QJsonObject nameplate;
    for (auto it = m_fields.cbegin(); it != m_fields.cend(); ++it) {
        if (it.key().startsWith(QLatin1String("nameplate.")) && !it.value()->isBlank())
            nameplate.insert(it.key().mid(10), it.value()->text().trimmed());
    }
    nameplate.insert(QStringLiteral("construction"), m_construction->currentData().toString());
    nameplate.insert(QStringLiteral("winding_material"), m_material->currentData().toString());
    return nameplate;
}

void SetupForm::applyNameplate(const QJsonObject &nameplate)
{
    for (auto it = m_fields.cbegin(); it != m_fields.cend(); ++it) {
        if (!it.key().startsWith(QLatin1String("nameplate.")))
            continue;
        const QJsonValue value = nameplate.value(it.key().mid(10));
        it.value()->setText(value.isDouble() ? plain(value.toDouble()) : value.toString());
    }
    const int construction = m_construction->findData(nameplate.value(QStringLiteral("construction")).toString());
    const int material = m_material->findData(nameplate.value(QStringLiteral("winding_material")).toString());
    {
        const QSignalBlocker blockConstruction(m_construction);
        const QSignalBlocker blockMaterial(m_material);
        m_construction->setCurrentIndex(std::max(0, construction));
        m_material->setCurrentIndex(std::max(0, material));
    }
    emit changed();
}

QString SetupForm::setupJson() const
{
    QJsonObject root;
    for (auto it = m_fields.cbegin(); it != m_fields.cend(); ++it) {
        if (it.key().startsWith(QLatin1String("session.")) || it.key().startsWith(QLatin1String("verdict."))
            || it.value()->isBlank())
            continue;
        const QString text = it.value()->text().trimmed();
        QJsonValue value(text);
        bool isInteger = false;
        const int asInteger = text.toInt(&isInteger);
        if (it.key() == QLatin1String("bench.steps") && isInteger)
            value = asInteger;
        insertAt(root, it.key().split(QLatin1Char('.')), value);
    }
    insertAt(root, {QStringLiteral("nameplate"), QStringLiteral("construction")}, m_construction->currentData().toString());
    insertAt(root, {QStringLiteral("nameplate"), QStringLiteral("winding_material")}, m_material->currentData().toString());
    insertAt(root, {QStringLiteral("bench"), QStringLiteral("allow_overload")}, m_allowOverload->isChecked());
    if (!m_fields.value(QStringLiteral("bench.fuse.rating_a"))->isBlank())
        insertAt(root, {QStringLiteral("bench"), QStringLiteral("fuse"), QStringLiteral("type")}, m_fuseType->currentData().toString());
    if (!m_specificationSource->text().trimmed().isEmpty())
        insertAt(root, {QStringLiteral("specification"), QStringLiteral("source")}, m_specificationSource->text().trimmed());
    return QString::fromUtf8(QJsonDocument(root).toJson(QJsonDocument::Compact));
}

void SetupForm::loadSetup(const Setup &setup)
{
    const auto set = [this](const char *field, const QString &text) { m_fields.value(QLatin1String(field))->setText(text); };
    const auto &n = setup.nameplate;
    set("nameplate.rated_power_va", plain(n.ratedPowerVa, Unit::VoltAmpere));
    set("nameplate.primary_voltage_v", plain(n.primaryVoltageV, Unit::Volt));
    set("nameplate.frequency_hz", plain(n.frequencyHz, Unit::Hertz));
    set("nameplate.secondary_voltage_v", plain(n.secondaryVoltageV, Unit::Volt));
    set("nameplate.secondary_no_load_voltage_v", n.secondaryNoLoadVoltageV ? plain(*n.secondaryNoLoadVoltageV, Unit::Volt) : QString());
    set("nameplate.regulation_percent", n.regulationPercent ? plain(*n.regulationPercent, Unit::Percent) : QString());
    m_construction->setCurrentIndex(m_construction->findData(QString::fromStdString(toString(n.construction))));
    m_material->setCurrentIndex(m_material->findData(QString::fromStdString(toString(n.windingMaterial))));
    const auto &b = setup.bench;
    set("bench.steps", QString::number(b.steps));
    set("bench.top_fraction", plain(b.topFraction));
    set("bench.overload_factor", plain(b.overloadFactor));
    m_allowOverload->setChecked(b.allowOverload);
    set("bench.rheostat.total_resistance_ohm", b.rheostat ? plain(b.rheostat->totalResistanceOhm, Unit::Ohm) : QString());
    set("bench.rheostat.power_rating_w", b.rheostat ? plain(b.rheostat->powerRatingW, Unit::Watt) : QString());
    set("bench.fuse.rating_a", b.fuse ? plain(b.fuse->ratingA, Unit::Ampere) : QString());
    if (b.fuse)
        m_fuseType->setCurrentIndex(m_fuseType->findData(QString::fromStdString(toString(b.fuse->type))));
    set("bench.fuse_factor", b.fuseFactor ? plain(*b.fuseFactor) : QString());
    set("bench.magnetizing_fraction", b.magnetizingFraction ? plain(*b.magnetizingFraction) : QString());
    set("bench.dwell_s", plain(b.dwellS, Unit::Second));
    loadMetersAndSpecification(setup);
    emit changed();
}

void SetupForm::clearSetup()
{
    for (auto *field : std::as_const(m_fields)) {
        if (field->field().startsWith(QLatin1String("nameplate.")) || field->field().startsWith(QLatin1String("bench.")))
            field->setText(QString());
    }
    for (auto *combo : {m_construction, m_material, m_fuseType})
        combo->setCurrentIndex(0);
    m_allowOverload->setChecked(false);
    emit changed();
}

SessionDetails SetupForm::sessionDetails() const
{
    return {m_operator->text().trimmed(), m_serial->text().trimmed(),
            m_fields.value(QStringLiteral("session.ambient_temperature_c"))->text().trimmed(),
            m_fields.value(QStringLiteral("session.winding_temperature_c"))->text().trimmed()};
}

VerdictSettings SetupForm::verdictSettings() const
{
    VerdictSettings settings;
    settings.regulationLimit = m_fields.value(QStringLiteral("verdict.regulation_limit_percent"))->text().trimmed();
    settings.rule = static_cast<DecisionRule>(m_decisionRule->currentData().toInt());
    settings.referenceTemperature = m_fields.value(QStringLiteral("verdict.reference_temperature_c"))->text().trimmed();
    const int constant = m_temperatureConstant->currentData().toInt();
    if (constant >= 0)
        settings.constant = static_cast<TemperatureConstant>(constant);
    return settings;
}

VerdictSettings verdictSettingsFrom(const AnalysisSettings &settings)
{
    const auto text = [](const std::optional<double> &value) {
        return value ? QString::number(*value, 'g', 12) : QString();
    };
    return {settings.regulationLimitNameplate ? QStringLiteral("nameplate") : text(settings.regulationLimitPercent),
            settings.rule, text(settings.referenceTemperatureC), settings.temperatureConstant};
}

void SetupForm::setVerdictSettings(const VerdictSettings &settings)
{
    const QSignalBlocker blockRule(m_decisionRule);
    const QSignalBlocker blockConstant(m_temperatureConstant);
    m_fields.value(QStringLiteral("verdict.regulation_limit_percent"))->setText(settings.regulationLimit);
    m_fields.value(QStringLiteral("verdict.reference_temperature_c"))->setText(settings.referenceTemperature);
    m_decisionRule->setCurrentIndex(m_decisionRule->findData(int(settings.rule)));
    m_temperatureConstant->setCurrentIndex(
        m_temperatureConstant->findData(settings.constant ? int(*settings.constant) : -1));
}

void SetupForm::setSessionDetails(const SessionDetails &details)
{
    m_operator->setText(details.operatorName);
    m_serial->setText(details.unitSerial);
    m_fields.value(QStringLiteral("session.ambient_temperature_c"))->setText(details.ambientTemperature);
    m_fields.value(QStringLiteral("session.winding_temperature_c"))->setText(details.windingTemperature);
}

void SetupForm::showErrors(const FieldErrors &errors)
{
    for (auto *field : std::as_const(m_fields))
        field->setError(QString());
    QStringList other;
    for (const auto &error : errors) {
        const QString name = QString::fromStdString(error.field);
        const QString rule = QString::fromStdString(error.rule);
        // A rule about a group ("bench.rheostat") goes under its first field.
        QuantityField *target = m_fields.value(name);
        if (!target) {
            for (auto it = m_fields.cbegin(); it != m_fields.cend() && !target; ++it) {
                if (it.key().startsWith(name + QLatin1Char('.')))
                    target = it.value();
            }
        }
        if (target && target->error().isEmpty())
            target->setError(rule);
        else
            other << spokenError(error);
    }
    m_otherErrors->setText(other.isEmpty() ? QString() : QStringLiteral("✖ ") + other.join(QStringLiteral("\n✖ ")));
    m_otherErrors->setVisible(!other.isEmpty());
}

QStringList SetupForm::shownErrors() const
{
    QStringList shown;
    for (auto it = m_fields.cbegin(); it != m_fields.cend(); ++it) {
        if (!it.value()->error().isEmpty())
            shown << it.key() + QStringLiteral(": ") + it.value()->error();
    }
    if (!m_otherErrors->isHidden())
        shown << m_otherErrors->text();
    return shown;
}

void SetupForm::setLocked(bool locked)
{
    for (auto *field : std::as_const(m_fields)) {
        if (!field->field().startsWith(QLatin1String("session.")) && !field->field().startsWith(QLatin1String("verdict.")))
            field->setReadOnly(locked);
    }
    for (auto *combo : {m_construction, m_material, m_fuseType})
        combo->setEnabled(!locked);
    m_allowOverload->setEnabled(!locked);
    setReadOnlyShown(m_specificationSource, locked);
}

void SetupForm::setRecordLocked(bool locked)
{
    for (auto *field : std::as_const(m_fields)) {
        if (field->field().startsWith(QLatin1String("session.")) || field->field().startsWith(QLatin1String("verdict.")))
            field->setReadOnly(locked);
    }
    setReadOnlyShown(m_operator, locked);
    setReadOnlyShown(m_serial, locked);
    m_decisionRule->setEnabled(!locked);
    m_temperatureConstant->setEnabled(!locked);
}

namespace {

void lockShown(QLineEdit *edit) { setReadOnlyShown(edit, true); }
void lockShown(QuantityField *field) { field->setReadOnly(true); } // shown read-only by QuantityField

} // namespace

void SetupForm::setDetailsLocked(bool locked)
{
    // Unlocking is setRecordLocked's (it also knows a signed session); here only the reason goes.
    const QString why = tr("Recorded in the session file when the session started; read-only while it is open.");
    const auto lock = [&](auto *widget) {
        if (locked) {
            lockShown(widget);
            widget->setToolTip(why);
        } else if (widget->toolTip() == why) {
            widget->setToolTip(QString());
        }
    };
    lock(m_operator);
    lock(m_serial);
    for (auto *field : std::as_const(m_fields))
        if (field->field().startsWith(QLatin1String("session.")))
            lock(field);
}

} // namespace sagline
