#include "TemperatureDialog.h"

#include "RecordDialogLayout.h"
#include "SessionChanges.h"
#include "TypedValue.h"

#include <QComboBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>

namespace sagline {

TemperatureDialog::TemperatureDialog(QWidget *parent)
    : QDialog(parent), m_kind(new QComboBox), m_value(new QLineEdit), m_source(new QLineEdit), m_problem(new QLabel)
{
    setWindowTitle(tr("Record a temperature"));
    m_kind->addItem(tr("Winding"), static_cast<int>(TemperatureKind::Winding));
    m_kind->addItem(tr("Ambient"), static_cast<int>(TemperatureKind::Ambient));
    m_value->setPlaceholderText(tr("e.g. 41.5 °C"));
    m_source->setPlaceholderText(tr("e.g. thermocouple on the outer layer, 2 min after the last step"));
    auto *form = new QFormLayout;
    form->addRow(tr("Temperature of the"), m_kind);
    form->addRow(tr("Measured value"), m_value);
    form->addRow(tr("How it was measured"), m_source);
    m_record = layOutRecordDialog(this, form,
                                  tr("Added to the session as a new record with your name and the UTC time. The latest "
                                     "winding temperature is the one the resistance at the reference temperature is "
                                     "worked out from; earlier values stay in the record."),
                                  m_problem, tr("Record"));
    connect(m_kind, &QComboBox::currentIndexChanged, this, &TemperatureDialog::check);
    connect(m_value, &QLineEdit::textChanged, this, &TemperatureDialog::check);
    connect(m_source, &QLineEdit::textChanged, this, &TemperatureDialog::check);
    setMinimumWidth(fontMetrics().averageCharWidth() * 70);
    check();
}

QString TemperatureDialog::problem() const
{
    const auto kind = static_cast<TemperatureKind>(m_kind->currentData().toInt());
    QString error;
    const auto value = typedQuantity(m_value->text(), Unit::Celsius, tr("Measured value"), &error);
    if (!error.isEmpty())
        return error;
    if (!value)
        return tr("Measured value: type the temperature, e.g. 41.5 °C");
    const TemperatureRange range = plausibleTemperatureRange(kind);
    if (*value < range.lowC || *value > range.highC)
        return tr("Measured value: a %1 temperature is from %2 to %3 °C; %4 °C is not one (a slip of the decimal point?)")
            .arg(kind == TemperatureKind::Winding ? tr("winding") : tr("ambient"))
            .arg(range.lowC)
            .arg(range.highC)
            .arg(*value);
    if (m_source->text().trimmed().isEmpty())
        return tr("How it was measured: required (the instrument and where and when it was read)");
    return {};
}

std::optional<TemperatureEntry> TemperatureDialog::entry() const
{
    if (!problem().isEmpty())
        return std::nullopt;
    const auto value = typedQuantity(m_value->text(), Unit::Celsius);
    return TemperatureEntry{static_cast<TemperatureKind>(m_kind->currentData().toInt()), *value,
                            m_source->text().trimmed()};
}

void TemperatureDialog::check()
{
    const QString text = problem();
    m_problem->setText(text);
    m_record->setEnabled(text.isEmpty());
}

} // namespace sagline
