// The setup form's meters and specification groups: the meters' accuracy (for a sweep typed in
// or imported; connected meters bring their own) and the limits the unit is judged against.
// Fields are named by their setup-file path, so core's messages land under them.
#include "SetupForm.h"

#include "QuantityField.h"
#include "UiFormat.h"

#include <QFormLayout>
#include <QGroupBox>
#include <QLineEdit>
#include <QVBoxLayout>

namespace sagline {

namespace {

QString text(const std::optional<double> &value, Unit unit)
{
    return value ? QString::number(*value, 'g', 10) + QLatin1Char(' ') + unitText(unit) : QString();
}

} // namespace

void SetupForm::addMetersAndSpecification(QVBoxLayout *layout)
{
    auto *metersBox = new QGroupBox(tr("Meters (accuracy, for the uncertainty)"));
    metersBox->setToolTip(tr("The data sheet's ±(% of reading + counts): the % is the gain, the counts times one count "
                             "the offset. Both are the same for every reading, so each is counted once per result. "
                             "Connected meters and the virtual bench bring their own."));
    auto *meters = new QFormLayout(metersBox);
    addQuantity(meters, tr("Voltmeter gain"), QStringLiteral("meters.voltmeter.gain_percent_of_reading"), Unit::Percent,
                tr("e.g. 0.5 %; blank: no meters known"));
    addQuantity(meters, tr("Voltmeter offset"), QStringLiteral("meters.voltmeter.offset_v"), Unit::Volt, tr("e.g. 3 mV"));
    addQuantity(meters, tr("Voltmeter resolution"), QStringLiteral("meters.voltmeter.resolution_v"), Unit::Volt,
                tr("one count, e.g. 1 mV"));
    addQuantity(meters, tr("Ammeter gain"), QStringLiteral("meters.ammeter.gain_percent_of_reading"), Unit::Percent,
                tr("e.g. 1 %"));
    addQuantity(meters, tr("Ammeter offset"), QStringLiteral("meters.ammeter.offset_a"), Unit::Ampere, tr("e.g. 3 mA"));
    addQuantity(meters, tr("Ammeter resolution"), QStringLiteral("meters.ammeter.resolution_a"), Unit::Ampere,
                tr("one count, e.g. 1 mA"));
    addQuantity(meters, tr("Winding temperature, u"), QStringLiteral("meters.winding_temperature_u_c"), Unit::Celsius,
                tr("default 2 °C"));
    layout->addWidget(metersBox);

    auto *specBox = new QGroupBox(tr("Specification (limits judged)"));
    specBox->setToolTip(tr("Each limit given is judged; with none the verdict is \"not judged\"."));
    auto *spec = new QFormLayout(specBox);
    addQuantity(spec, tr("Regulation at most"), QStringLiteral("specification.regulation_max_percent"), Unit::Percent,
                tr("blank: not judged"));
    addQuantity(spec, tr("Full-load voltage from"), QStringLiteral("specification.full_load_voltage_v.min"), Unit::Volt,
                QString());
    addQuantity(spec, tr("Full-load voltage to"), QStringLiteral("specification.full_load_voltage_v.max"), Unit::Volt,
                QString());
    addQuantity(spec, tr("No-load voltage from"), QStringLiteral("specification.no_load_voltage_v.min"), Unit::Volt,
                QString());
    addQuantity(spec, tr("No-load voltage to"), QStringLiteral("specification.no_load_voltage_v.max"), Unit::Volt,
                QString());
    addQuantity(spec, tr("Series resistance at most"), QStringLiteral("specification.series_resistance_max_ohm"),
                Unit::Ohm, QString());
    m_specificationSource->setAccessibleName(QStringLiteral("specification.source"));
    m_specificationSource->setPlaceholderText(tr("drawing, data sheet or standard clause"));
    spec->addRow(tr("Source of the limits"), m_specificationSource);
    connect(m_specificationSource, &QLineEdit::textEdited, this, &SetupForm::changed);
    layout->addWidget(specBox);
}

void SetupForm::loadMetersAndSpecification(const Setup &setup)
{
    const auto set = [this](const char *field, const QString &value) { m_fields.value(QLatin1String(field))->setText(value); };
    const std::optional<MeterSpecs> &m = setup.meters;
    set("meters.voltmeter.gain_percent_of_reading", m ? text(m->voltmeter.gainPercentOfReading, Unit::Percent) : QString());
    set("meters.voltmeter.offset_v", m ? text(m->voltmeter.offset, Unit::Volt) : QString());
    set("meters.voltmeter.resolution_v", m ? text(m->voltmeter.resolution, Unit::Volt) : QString());
    set("meters.ammeter.gain_percent_of_reading", m ? text(m->ammeter.gainPercentOfReading, Unit::Percent) : QString());
    set("meters.ammeter.offset_a", m ? text(m->ammeter.offset, Unit::Ampere) : QString());
    set("meters.ammeter.resolution_a", m ? text(m->ammeter.resolution, Unit::Ampere) : QString());
    set("meters.winding_temperature_u_c", m ? text(m->windingTemperatureUncertaintyC, Unit::Celsius) : QString());
    const std::optional<Specification> &s = setup.specification;
    const auto end = [&](const std::optional<ToleranceRange> &range, bool upper) {
        if (!range)
            return QString();
        return text(upper ? range->max : range->min, Unit::Volt);
    };
    set("specification.regulation_max_percent", s ? text(s->regulationMaxPercent, Unit::Percent) : QString());
    set("specification.full_load_voltage_v.min", s ? end(s->fullLoadVoltageV, false) : QString());
    set("specification.full_load_voltage_v.max", s ? end(s->fullLoadVoltageV, true) : QString());
    set("specification.no_load_voltage_v.min", s ? end(s->noLoadVoltageV, false) : QString());
    set("specification.no_load_voltage_v.max", s ? end(s->noLoadVoltageV, true) : QString());
    set("specification.series_resistance_max_ohm", s ? text(s->seriesResistanceMaxOhm, Unit::Ohm) : QString());
    m_specificationSource->setText(s ? QString::fromStdString(s->source) : QString());
}

} // namespace sagline
