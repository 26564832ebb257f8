// The virtual bench as a separate program (sagline-sim) for UI tests over real links: started
// on the demo setup with loopback TCP on free ports and its pty links in a test folder, its
// printed addresses and true series resistance read back, and its programmable load driven
// over TCP the way a person turns the rheostat.
#pragma once

#include <QByteArray>
#include <QElapsedTimer>
#include <QProcess>
#include <QRegularExpression>
#include <QStringList>
#include <QTcpSocket>

#include <map>
#include <optional>

namespace sagline::test {

struct SimEndpoint {
    QString ptyLink;  // stable symlink to the instrument's pty
    quint16 tcpPort = 0;
    QString identity; // what it answers to *IDN?
};

class SimProcess {
public:
    // `linkDir` must exist. Extra arguments go after the defaults.
    // May be called again after kill(): the same link folder gives the same pty paths.
    bool start(const QString &linkDir, const QStringList &extra, QString *error)
    {
        m_output.clear();
        m_endpoints.clear();
        m_load.abort();
        QStringList args{QStringLiteral(SAGLINE_SOURCE_DIR "/resources/demo-setup.json"), QStringLiteral("--tcp-port"),
                         QStringLiteral("0"), QStringLiteral("--link-dir"), linkDir};
        args << extra;
        m_process.start(QStringLiteral(SAGLINE_SIM_PATH), args);
        if (!m_process.waitForStarted(5000)) {
            *error = QStringLiteral("sagline-sim did not start: ") + m_process.errorString();
            return false;
        }
        QElapsedTimer elapsed;
        elapsed.start();
        while (!m_output.contains("Ctrl-C stops")) {
            if (elapsed.elapsed() > 10000 || m_process.state() == QProcess::NotRunning) {
                *error = QStringLiteral("sagline-sim printed no addresses: ") + QString::fromUtf8(m_output)
                         + QString::fromUtf8(m_process.readAllStandardError());
                return false;
            }
            m_process.waitForReadyRead(200);
            m_output += m_process.readAllStandardOutput();
        }
        parse();
        return true;
    }

    ~SimProcess() { kill(); }

    // SIGKILL to the process this object started (by its id), as a pulled plug does.
    void kill()
    {
        if (m_process.state() != QProcess::NotRunning) {
            m_process.kill();
            m_process.waitForFinished(5000);
        }
    }

    QString output() const { return QString::fromUtf8(m_output); }
    double seriesResistanceOhm() const { return m_seriesResistanceOhm; }
    std::optional<SimEndpoint> endpoint(const QString &instrument) const
    {
        const auto it = m_endpoints.find(instrument);
        return it == m_endpoints.end() ? std::nullopt : std::optional<SimEndpoint>(it->second);
    }

    // The operator's hand on the load: the load's SCPI over TCP, confirmed with *OPC?.
    // nullopt = open circuit (input off).
    bool setLoad(std::optional<double> ohms, QString *error)
    {
        if (m_load.state() != QAbstractSocket::ConnectedState) {
            const auto load = endpoint(QStringLiteral("load"));
            if (!load) {
                *error = QStringLiteral("the simulator printed no load address");
                return false;
            }
            m_load.connectToHost(QStringLiteral("127.0.0.1"), load->tcpPort);
            if (!m_load.waitForConnected(3000)) {
                *error = QStringLiteral("load: ") + m_load.errorString();
                return false;
            }
        }
        QByteArray commands = ohms ? QByteArray("RES ") + QByteArray::number(*ohms, 'g', 9) + "\nINP ON\n"
                                   : QByteArray("INP OFF\n");
        commands += "*OPC?\n";
        m_load.write(commands);
        QByteArray reply;
        QElapsedTimer elapsed;
        elapsed.start();
        while (!reply.contains('\n') && elapsed.elapsed() < 3000) {
            m_load.waitForReadyRead(100);
            reply += m_load.readAll();
        }
        if (reply.trimmed() != "1") {
            *error = QStringLiteral("load: *OPC? answered '%1'").arg(QString::fromLatin1(reply));
            return false;
        }
        return true;
    }

private:
    void parse()
    {
        const QString text = QString::fromUtf8(m_output);
        static const QRegularExpression r(QStringLiteral("R ([0-9.]+) ohm at"));
        if (const auto m = r.match(text); m.hasMatch())
            m_seriesResistanceOhm = m.captured(1).toDouble();
        // "  power-meter  pty /dir/power-meter (now /dev/pts/2)  tcp 127.0.0.1:44471"
        // "               *IDN? Sagline Virtual Bench,VB-P2 virtual power meter,VB00015,0.1.0"
        static const QRegularExpression line(
            QStringLiteral("^  (\\S+) +pty (\\S+) \\(now [^)]*\\)  tcp 127\\.0\\.0\\.1:(\\d+)\\n +\\*IDN\\? (.*)$"),
            QRegularExpression::MultilineOption);
        for (auto it = line.globalMatch(text); it.hasNext();) {
            const auto m = it.next();
            m_endpoints[m.captured(1)] = {m.captured(2), static_cast<quint16>(m.captured(3).toUInt()), m.captured(4)};
        }
    }

    QProcess m_process;
    QByteArray m_output;
    double m_seriesResistanceOhm = 0.0;
    std::map<QString, SimEndpoint> m_endpoints;
    QTcpSocket m_load;
};

} // namespace sagline::test
