#include "InstrumentsPanel.h"

#include <QComboBox>
#include <QFormLayout>
#include <QIntValidator>
#include <QLabel>
#include <QLineEdit>
#include <QPushButton>
#include <QSerialPortInfo>
#include <QStackedWidget>
#include <QVBoxLayout>

namespace sagline {

InstrumentsPanel::InstrumentsPanel(QWidget *parent)
    : QWidget(parent), m_source(new QComboBox), m_details(new QStackedWidget), m_port(new QComboBox),
      m_address(new QLineEdit), m_ammeterRow(new QWidget), m_ammeter(new QLineEdit), m_load(new QLineEdit),
      m_baud(new QComboBox), m_dataBits(new QComboBox), m_parity(new QComboBox), m_stopBits(new QComboBox),
      m_flow(new QComboBox), m_test(new QPushButton(tr("Connect and test the meters"))), m_testResult(new QLabel),
      m_status(new QLabel)
{
    auto *layout = new QVBoxLayout(this);
    auto *form = new QFormLayout;
    form->setRowWrapPolicy(QFormLayout::WrapLongRows); // a narrow panel puts the label above the list, never hides it
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
    // The meter's remote-interface settings, as set on its front panel (9600 8N1 is common).
    for (int baud : {1200, 2400, 4800, 9600, 19200, 38400, 57600, 115200})
        m_baud->addItem(QString::number(baud), baud);
    m_baud->setCurrentIndex(m_baud->findData(9600));
    m_baud->setEditable(true); // a meter may use a rate not listed
    m_baud->setInsertPolicy(QComboBox::NoInsert);
    m_baud->setValidator(new QIntValidator(1, 4000000, m_baud));
    m_baud->setAccessibleName(tr("Baud rate"));
    for (int bits : {8, 7, 6, 5})
        m_dataBits->addItem(QString::number(bits), bits);
    m_dataBits->setAccessibleName(tr("Data bits"));
    m_parity->addItem(tr("None"), QStringLiteral("N"));
    m_parity->addItem(tr("Even"), QStringLiteral("E"));
    m_parity->addItem(tr("Odd"), QStringLiteral("O"));
    m_parity->addItem(tr("Mark"), QStringLiteral("M"));
    m_parity->addItem(tr("Space"), QStringLiteral("S"));
    m_parity->setAccessibleName(tr("Parity"));
    for (const char *stop : {"1", "1.5", "2"})
        m_stopBits->addItem(QLatin1String(stop), QLatin1String(stop));
    m_stopBits->setAccessibleName(tr("Stop bits"));
    m_flow->addItem(tr("None"), QStringLiteral("none"));
    m_flow->addItem(tr("Hardware (RTS/CTS)"), QStringLiteral("rtscts"));
    m_flow->addItem(tr("Software (XON/XOFF)"), QStringLiteral("xonxoff"));
    m_flow->setAccessibleName(tr("Flow control"));
    serialForm->addRow(tr("Baud rate"), m_baud);
    serialForm->addRow(tr("Data bits"), m_dataBits);
    serialForm->addRow(tr("Parity"), m_parity);
    serialForm->addRow(tr("Stop bits"), m_stopBits);
    serialForm->addRow(tr("Flow control"), m_flow);
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
    m_load->setPlaceholderText(tr("optional: /dev/ttyUSB2 or 192.168.1.22:5025"));
    m_load->setAccessibleName(tr("Programmable load address"));
    m_load->setToolTip(tr("A programmable load (SCPI) sets each step's resistance itself; leave empty for a "
                          "rheostat set by hand."));
    ammeterForm->addRow(tr("Programmable load"), m_load);
    layout->addWidget(m_ammeterRow);
    m_testResult->setWordWrap(true);
    m_testResult->setTextInteractionFlags(Qt::TextSelectableByMouse);
    m_testResult->setObjectName(QStringLiteral("meterTestResult"));
    m_testResult->hide();
    m_test->setToolTip(tr("Connect to the meters, ask each for *IDN? and take one reading of each function; "
                          "nothing is recorded"));
    layout->addWidget(m_test);
    layout->addWidget(m_testResult);

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
        // What was connected belongs to the old source.
        setStatus(tr("not connected"));
        setTestResult(QString(), true);
        emit choiceChanged();
    });
    connect(m_test, &QPushButton::clicked, this, &InstrumentsPanel::testRequested);
    connect(rescan, &QPushButton::clicked, this, &InstrumentsPanel::refreshPorts);
    refreshPorts();
    showAmmeterRow();
    setStatus(tr("Not connected."));
}

void InstrumentsPanel::showAmmeterRow()
{
    const auto source = static_cast<ReadingSource>(m_source->currentData().toInt());
    m_ammeterRow->setVisible(source == ReadingSource::SerialPort || source == ReadingSource::Lan);
    m_test->setEnabled(source != ReadingSource::TypedIn);
}

QString InstrumentsPanel::serialFormat() const
{
    return QStringLiteral("%1,%2%3%4,%5")
        .arg(m_baud->currentText().trimmed(), m_dataBits->currentData().toString(), m_parity->currentData().toString(),
             m_stopBits->currentData().toString(), m_flow->currentData().toString());
}

void InstrumentsPanel::setTestResult(const QString &text, bool ok)
{
    m_testResult->setText(text);
    m_testResult->setStyleSheet(ok ? QString() : QStringLiteral("QLabel { color: #d55e00; }"));
    m_testResult->setVisible(!text.isEmpty());
}

QString InstrumentsPanel::testResultText() const { return m_testResult->isHidden() ? QString() : m_testResult->text(); }

void InstrumentsPanel::setTesting(bool testing)
{
    m_test->setText(testing ? tr("Testing…") : tr("Connect and test the meters"));
    m_test->setEnabled(!testing && static_cast<ReadingSource>(m_source->currentData().toInt()) != ReadingSource::TypedIn);
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
    c.serialFormat = serialFormat();
    c.loadAddress = m_load->text().trimmed();
    return c;
}

void InstrumentsPanel::setChoice(const SourceChoice &choice)
{
    m_source->setCurrentIndex(m_source->findData(int(choice.source)));
    m_port->setEditText(choice.serialPort);
    m_address->setText(choice.lanAddress);
    m_ammeter->setText(choice.ammeterAddress);
    m_load->setText(choice.loadAddress);
    // "BAUD,8N1,FLOW": each part back into its box (unknown parts leave the box as it is).
    const QStringList parts = choice.serialFormat.split(QLatin1Char(','));
    if (parts.size() == 3 && parts[1].size() >= 3) {
        m_baud->setEditText(parts[0]);
        m_dataBits->setCurrentIndex(std::max(0, m_dataBits->findData(parts[1].left(1).toInt())));
        m_parity->setCurrentIndex(std::max(0, m_parity->findData(parts[1].mid(1, 1))));
        m_stopBits->setCurrentIndex(std::max(0, m_stopBits->findData(parts[1].mid(2))));
        m_flow->setCurrentIndex(std::max(0, m_flow->findData(parts[2])));
    }
}

void InstrumentsPanel::setStatus(const QString &status) { m_status->setText(tr("Status: %1").arg(status)); }

QString InstrumentsPanel::statusText() const { return m_status->text(); }

void InstrumentsPanel::setLocked(bool locked)
{
    m_source->setEnabled(!locked);
    m_details->setEnabled(!locked);
    m_ammeterRow->setEnabled(!locked);
    m_test->setEnabled(!locked && static_cast<ReadingSource>(m_source->currentData().toInt()) != ReadingSource::TypedIn);
}

} // namespace sagline
