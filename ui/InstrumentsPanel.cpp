#include "InstrumentsPanel.h"

#include <QComboBox>
#include <QFormLayout>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QSerialPortInfo>
#include <QStackedWidget>
#include <QVBoxLayout>

namespace sagline {

InstrumentsPanel::InstrumentsPanel(QWidget *parent)
    : QWidget(parent), m_source(new QComboBox), m_details(new QStackedWidget), m_port(new QComboBox),
      m_address(new QLineEdit), m_ammeterRow(new QWidget), m_ammeter(new QLineEdit), m_status(new QLabel)
{
    auto *layout = new QVBoxLayout(this);
    auto *form = new QFormLayout;
    m_source->addItem(tr("Virtual bench (simulated transformer and meters)"), int(ReadingSource::VirtualBench));
    m_source->addItem(tr("SCPI meter on a serial port"), int(ReadingSource::SerialPort));
    m_source->addItem(tr("SCPI meter on the LAN (raw socket)"), int(ReadingSource::Lan));
    m_source->addItem(tr("Readings typed in by hand"), int(ReadingSource::TypedIn));
    m_source->setAccessibleName(tr("Reading source"));
    form->addRow(tr("Readings from"), m_source);
    layout->addLayout(form);

    auto *none = new QLabel(tr("No connection needed."));
    auto *serial = new QWidget;
    auto *serialForm = new QFormLayout(serial);
    m_port->setEditable(true);
    // Enter in the field must not add the typed path as a list entry (one without a port behind it).
    m_port->setInsertPolicy(QComboBox::NoInsert);
    m_port->setAccessibleName(tr("Serial port"));
    m_port->lineEdit()->setPlaceholderText(tr("pick a port or type a path, e.g. /dev/ttyUSB0"));
    auto *rescan = new QPushButton(tr("Rescan ports"));
    serialForm->addRow(tr("Meter port"), m_port);
    serialForm->addRow(QString(), rescan);
    auto *lan = new QWidget;
    auto *lanForm = new QFormLayout(lan);
    m_address->setPlaceholderText(tr("host or address, port 5025 unless given: 192.168.1.20:5025"));
    m_address->setAccessibleName(tr("LAN address"));
    lanForm->addRow(tr("Meter address"), m_address);
    auto *typed = new QLabel(tr("Type each reading into the current and voltage fields of the next-step strip; "
                                "values are checked as an instrument's would be."));
    typed->setWordWrap(true);
    m_details->addWidget(none);
    m_details->addWidget(serial);
    m_details->addWidget(lan);
    m_details->addWidget(typed);
    layout->addWidget(m_details);
    // A bench often has two meters: then the one above is the voltmeter and this the ammeter,
    // on a serial port or the LAN alike.
    auto *ammeterForm = new QFormLayout(m_ammeterRow); // default margins, like the pages above
    m_ammeter->setPlaceholderText(tr("optional: 192.168.1.21:5025 or /dev/ttyUSB1"));
    m_ammeter->setAccessibleName(tr("Separate ammeter address"));
    m_ammeter->setToolTip(tr("Leave empty when one meter reads V and I. With a separate ammeter (serial port or LAN "
                             "address), the meter above is the voltmeter."));
    ammeterForm->addRow(tr("Separate ammeter"), m_ammeter);
    layout->addWidget(m_ammeterRow);

    auto *roles = new QLabel(tr("<b>Meter roles</b><br>Secondary voltmeter: AC V RMS (MEASure:VOLTage:AC?)<br>"
                                "Secondary ammeter: AC A RMS (MEASure:CURRent:AC?)<br>"
                                "Accuracy: ±(% of reading + counts); standard uncertainty a/√3 (GUM 4.3.7)."));
    roles->setWordWrap(true);
    layout->addWidget(roles);
    m_status->setWordWrap(true);
    m_status->setTextInteractionFlags(Qt::TextSelectableByMouse);
    layout->addWidget(m_status);
    layout->addStretch(1);

    connect(m_source, &QComboBox::currentIndexChanged, this, [this](int index) {
        m_details->setCurrentIndex(index);
        showAmmeterRow();
        emit choiceChanged();
    });
    connect(rescan, &QPushButton::clicked, this, &InstrumentsPanel::refreshPorts);
    refreshPorts();
    showAmmeterRow();
    setStatus(tr("Not connected."));
}

void InstrumentsPanel::showAmmeterRow()
{
    const auto source = static_cast<ReadingSource>(m_source->currentData().toInt());
    m_ammeterRow->setVisible(source == ReadingSource::SerialPort || source == ReadingSource::Lan);
}

void InstrumentsPanel::refreshPorts()
{
    const QString typed = m_port->currentText();
    m_port->clear();
    for (const auto &info : QSerialPortInfo::availablePorts())
        m_port->addItem(info.systemLocation() + QStringLiteral("  ") + info.description(), info.systemLocation());
    m_port->setEditText(typed);
}

SourceChoice InstrumentsPanel::choice() const
{
    SourceChoice c;
    c.source = static_cast<ReadingSource>(m_source->currentData().toInt());
    // A listed port carries its path as data; anything else is the path as typed.
    const int index = m_port->findText(m_port->currentText());
    const QString listed = index >= 0 ? m_port->itemData(index).toString() : QString();
    c.serialPort = listed.isEmpty() ? m_port->currentText().trimmed() : listed;
    c.lanAddress = m_address->text().trimmed();
    c.ammeterAddress = m_ammeter->text().trimmed();
    return c;
}

void InstrumentsPanel::setChoice(const SourceChoice &choice)
{
    m_source->setCurrentIndex(m_source->findData(int(choice.source)));
    m_port->setEditText(choice.serialPort);
    m_address->setText(choice.lanAddress);
    m_ammeter->setText(choice.ammeterAddress);
}

void InstrumentsPanel::setStatus(const QString &status) { m_status->setText(tr("Status: %1").arg(status)); }

QString InstrumentsPanel::statusText() const { return m_status->text(); }

void InstrumentsPanel::setLocked(bool locked)
{
    m_source->setEnabled(!locked);
    m_details->setEnabled(!locked);
    m_ammeterRow->setEnabled(!locked);
}

} // namespace sagline
