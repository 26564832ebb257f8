#include "CsvReadings.h"

#include "AsciiText.h"
#include "CsvNumber.h"
#include "OutputText.h"
#include "PlainDecimal.h"
#include "TextFile.h"

#include <algorithm>
#include <charconv>
#include <cstring>
#include <cmath>
#include <optional>

namespace sagline {

namespace {

constexpr std::size_t maxErrors = 100;
// A physical bound on a reading (V or A): far above a small transformer's bench, far below
// where sums of squares overflow (a CSV of 1e300 A would make every fit "degenerate").
constexpr double maxReadingValue = 1e6;

enum class Column {
    Current, Voltage, UCurrent, UVoltage, Step, Time, Flags, Excluded, Provenance,
    // The primary side: values and their standard uncertainties, each optional per row.
    PrimaryVoltage, PrimaryCurrent, PrimaryPower, PrimaryPowerFactor, PrimaryReactivePower,
    UPrimaryVoltage, UPrimaryCurrent, UPrimaryPower, UPrimaryPowerFactor, UPrimaryReactivePower,
};

struct KnownColumn {
    std::string_view name;
    Column column;
};

constexpr KnownColumn knownColumns[] = {
    {"current_a", Column::Current}, {"voltage_v", Column::Voltage}, {"u_current_a", Column::UCurrent},
    {"u_voltage_v", Column::UVoltage}, {"step", Column::Step}, {"time_utc", Column::Time},
    {"flags", Column::Flags}, {"excluded", Column::Excluded},
    {"primary_voltage_v", Column::PrimaryVoltage}, {"primary_current_a", Column::PrimaryCurrent},
    {"primary_power_w", Column::PrimaryPower}, {"primary_power_factor", Column::PrimaryPowerFactor},
    {"primary_reactive_power_var", Column::PrimaryReactivePower},
    {"u_primary_voltage_v", Column::UPrimaryVoltage}, {"u_primary_current_a", Column::UPrimaryCurrent},
    {"u_primary_power_w", Column::UPrimaryPower}, {"u_primary_power_factor", Column::UPrimaryPowerFactor},
    {"u_primary_reactive_power_var", Column::UPrimaryReactivePower},
    // Who did what, as a session export writes it: kept in the session it came from, not imported.
    {"exclusion_reason", Column::Provenance}, {"excluded_by", Column::Provenance},
    {"superseded_reason", Column::Provenance}, {"recorded_by", Column::Provenance},
    {"recorded_account", Column::Provenance},
};

// Splits one line on the separator; a cell may be double-quoted ("" is a literal quote). Cells
// are trimmed of spaces unless quoted. Returns false for an unterminated quote.
bool splitQuotedCells(std::string_view line, char separator, std::vector<std::string> &cells)
{
    cells.clear();
    std::string cell;
    bool quoted = false;
    bool wasQuoted = false;
    for (std::size_t i = 0; i < line.size(); ++i) {
        const char c = line[i];
        if (quoted) {
            if (c == '"' && i + 1 < line.size() && line[i + 1] == '"') {
                cell += '"';
                ++i;
            } else if (c == '"') {
                quoted = false;
            } else {
                cell += c;
            }
        } else if (c == '"' && trimSpace(cell).empty() && !wasQuoted) {
            cell.clear();
            quoted = true;
            wasQuoted = true;
        } else if (c == separator) {
            cells.push_back(wasQuoted ? cell : std::string(trimSpace(cell)));
            cell.clear();
            wasQuoted = false;
        } else if (!wasQuoted || c != ' ') {
            cell += c;
        }
    }
    if (quoted)
        return false;
    cells.push_back(wasQuoted ? cell : std::string(trimSpace(cell)));
    return true;
}

// The same into views: of the line itself when it has no quote (the common case, no copy),
// else of `unquoted`, which holds the quoted line's cells until the next call.
bool splitCells(std::string_view line, char separator, std::vector<std::string_view> &cells,
                std::vector<std::string> &unquoted)
{
    cells.clear();
    if (line.find('"') != std::string_view::npos) {
        if (!splitQuotedCells(line, separator, unquoted))
            return false;
        cells.assign(unquoted.begin(), unquoted.end());
        return true;
    }
    while (true) {
        const std::size_t at = line.find(separator);
        cells.push_back(trimSpace(line.substr(0, at)));
        if (at == std::string_view::npos)
            return true;
        line.remove_prefix(at + 1);
    }
}

std::optional<std::uint32_t> parseFlags(std::string_view text)
{
    std::uint32_t flags = flagNone;
    while (!text.empty()) {
        const std::size_t bar = text.find('|');
        const std::string_view name = trimSpace(text.substr(0, bar));
        bool found = false;
        for (int bit = 0; bit < 32 && !found; ++bit) {
            const std::uint32_t value = 1u << bit;
            if (!name.empty() && flagsToString(value) == name) {
                flags |= value;
                found = true;
            }
        }
        if (!found)
            return std::nullopt;
        text = bar == std::string_view::npos ? std::string_view() : text.substr(bar + 1);
    }
    return flags;
}

std::optional<bool> parseBool(std::string_view text)
{
    if (text == "true" || text == "1" || text == "yes")
        return true;
    if (text == "false" || text == "0" || text == "no" || text.empty())
        return false;
    return std::nullopt;
}

class Parser {
public:
    // columns: keep each reading only as the fit's columns (m_columns), not as a Reading.
    explicit Parser(bool columns = false) : m_keepColumns(columns) {}
    ReadingsCsvParse run(std::string_view text);
    ReadingColumns takeColumns() { return std::move(m_fitColumns); }

private:
    void error(int line, std::string_view column, std::string rule)
    {
        if (m_result.errors.size() < maxErrors)
            m_result.errors.push_back({"line " + std::to_string(line) + (column.empty() ? "" : ", column " + std::string(column)),
                                       std::move(rule)});
    }
    bool parseHeader(int line, const std::vector<std::string_view> &cells);
    void parseRow(int line, const std::vector<std::string_view> &cells);
    bool parsePrimaryCell(int line, const std::string &name, Column column, std::string_view cell, PrimaryReading &primary);
    std::optional<double> readNumber(int line, const std::string &name, std::string_view cell);
    bool statementLine(int line, std::string_view text, bool haveHeader);
    bool settleDecimalMark(std::string_view rows, int firstLine);

    bool m_keepColumns = false;
    ReadingColumns m_fitColumns;
    ReadingsCsvParse m_result;
    std::vector<Column> m_columns;
    std::vector<std::string> m_names;
    char m_separator = ',';
    std::optional<DecimalMark> m_statedMark; // from a "# decimal_mark:" line before the header
    int m_statedLine = 0;
    DecimalMark m_mark = DecimalMark::Point;
    bool m_markKnown = true; // false: nothing decides, so a number like 1,250 is refused
};

bool isNumberColumn(Column c)
{
    return c == Column::Current || c == Column::Voltage || c == Column::UCurrent || c == Column::UVoltage;
}

bool isComment(std::string_view line)
{
    line = trimSpace(line);
    return !line.empty() && line.front() == '#';
}

// ';' or a tab when the header is separated by one (a spreadsheet saving decimal commas), else ','.
char separatorOf(std::string_view header)
{
    if (header.find(';') != std::string_view::npos)
        return ';';
    if (header.find('\t') != std::string_view::npos && header.find(',') == std::string_view::npos)
        return '\t';
    return ',';
}

// A comment line; a decimal-mark statement is taken only before the header.
bool Parser::statementLine(int line, std::string_view text, bool haveHeader)
{
    const DecimalMarkStatement statement = parseDecimalMarkComment(text);
    if (!statement.isStatement)
        return true;
    if (haveHeader) {
        error(line, "", "a decimal_mark comment must come before the header row");
        return false;
    }
    if (!statement.mark) {
        error(line, "", statement.problem);
        return false;
    }
    if (m_statedMark && *m_statedMark != *statement.mark) {
        error(line, "", "states the decimal mark '" + std::string(1, toChar(*statement.mark)) + "', line "
                            + std::to_string(m_statedLine) + " stated '" + std::string(1, toChar(*m_statedMark)) + "'");
        return false;
    }
    m_statedMark = statement.mark;
    m_statedLine = line;
    return true;
}

// After the header: the file's decimal mark, stated, fixed by a comma separator (the CSV
// contract), or shown by the numbers themselves; false when the file cannot be read at all.
bool Parser::settleDecimalMark(std::string_view rows, int firstLine)
{
    if (m_statedMark) {
        if (*m_statedMark == DecimalMark::Comma && m_separator == ',') {
            error(m_statedLine, "", "a decimal comma needs cells separated by ';' or tabs; this file's header is "
                                    "separated by ','");
            return false;
        }
        m_mark = *m_statedMark;
        m_result.decimalMark = m_mark;
        m_result.decimalMarkBasis = "stated on line " + std::to_string(m_statedLine);
        return true;
    }
    if (m_separator == ',') {
        m_result.decimalMarkBasis = "'.' in a comma-separated file";
        return true;
    }
    // The first number that can only be read one way decides; two that disagree refuse the file.
    std::optional<std::pair<int, std::string>> point, comma;
    std::vector<std::string_view> cells;
    std::vector<std::string> unquoted;
    for (int line = firstLine; !rows.empty() && !(point && comma); ++line) {
        const std::size_t end = rows.find('\n');
        const std::string_view text = rows.substr(0, end);
        rows = end == std::string_view::npos ? std::string_view() : rows.substr(end + 1);
        if (trimSpace(text).empty() || isComment(text) || !splitCells(text, m_separator, cells, unquoted))
            continue;
        for (std::size_t i = 0; i < cells.size() && i < m_columns.size(); ++i) {
            if (!isNumberColumn(m_columns[i]))
                continue;
            const MarkEvidence evidence = markEvidence(cells[i]);
            auto &first = evidence == MarkEvidence::Point ? point : comma;
            if ((evidence == MarkEvidence::Point || evidence == MarkEvidence::Comma) && !first)
                first = std::pair(line, printableText(cells[i], 40));
        }
    }
    if (point && comma) {
        m_result.errors.push_back(
            {"file", "line " + std::to_string(point->first) + " writes '" + point->second + "' with a decimal point, line "
                         + std::to_string(comma->first) + " '" + comma->second
                         + "' with a decimal comma; state the file's mark on a line '# decimal_mark: ,' (or '.') "
                           "before the header"});
        return false;
    }
    if (point || comma) {
        m_mark = comma ? DecimalMark::Comma : DecimalMark::Point;
        m_result.decimalMark = m_mark;
        const auto &[line, cell] = comma ? *comma : *point;
        m_result.decimalMarkBasis = "shown by '" + cell + "' on line " + std::to_string(line);
        return true;
    }
    m_markKnown = false;
    m_result.decimalMarkBasis = "not stated, and no number shows it";
    return true;
}

std::optional<double> Parser::readNumber(int line, const std::string &name, std::string_view cell)
{
    // The common cell, "0.4171" in a file with a decimal point, read at once: what
    // parseCsvNumber accepts for it, without its layers (a million rows hold millions of them).
    if (m_mark == DecimalMark::Point && m_markKnown && !cell.empty() && cell.front() != '+') {
        if (const std::optional<double> plain = readPlainDecimal(cell))
            return plain;
        double value = 0.0;
        const auto [end, problem] = std::from_chars(cell.data(), cell.data() + cell.size(), value);
        if (problem == std::errc() && end == cell.data() + cell.size() && std::isfinite(value))
            return value;
    }
    // The cell as a message quotes it, made only for a message (not for each of a million cells).
    const auto quote = [cell] { return printableText(cell, 40); };
    if (!m_markKnown && markEvidence(cell) == MarkEvidence::Ambiguous) {
        error(line, name, "'" + quote() + "' could have a thousands separator or a decimal mark, and nothing in the file "
                          "says which; state the file's mark on a line '# decimal_mark: ,' (or '.') before the header");
        return std::nullopt;
    }
    std::string problem;
    const auto value = parseCsvNumber(cell, m_mark, problem);
    if (!value)
        error(line, name, "'" + quote() + "' " + problem);
    return value;
}

bool Parser::parseHeader(int line, const std::vector<std::string_view> &cells)
{
    bool good = true;
    for (const std::string_view cell : cells) {
        const KnownColumn *match = nullptr;
        for (const auto &known : knownColumns)
            if (known.name == cell)
                match = &known;
        if (!match) {
            error(line, cell, "unknown column; expected current_a, voltage_v, u_current_a, u_voltage_v, step, "
                              "time_utc, flags, excluded, primary_voltage_v, primary_current_a, primary_power_w, "
                              "primary_power_factor, primary_reactive_power_var or u_ before a primary column");
            good = false;
            continue;
        }
        for (const auto &name : m_names)
            if (name == cell) {
                error(line, cell, "column appears twice");
                good = false;
            }
        m_columns.push_back(match->column);
        m_names.emplace_back(cell);
    }
    for (const char *required : {"current_a", "voltage_v"}) {
        bool present = false;
        for (const auto &name : m_names)
            present = present || name == required;
        if (!present) {
            error(line, required, "required column missing from the header (needs current_a,voltage_v)");
            good = false;
        }
    }
    for (Column c : m_columns) {
        m_result.hasCurrentUncertainty = m_result.hasCurrentUncertainty || c == Column::UCurrent;
        m_result.hasVoltageUncertainty = m_result.hasVoltageUncertainty || c == Column::UVoltage;
    }
    return good;
}

// A primary-side cell: blank means "not read"; a value is finite, zero or above (RMS values,
// power drawn), a power factor at most 1, an uncertainty above zero.
bool Parser::parsePrimaryCell(int line, const std::string &name, Column column, std::string_view cell, PrimaryReading &primary)
{
    if (cell.empty())
        return true;
    const auto value = readNumber(line, name, cell); // names the line and column itself when unreadable
    const bool isUncertainty = column >= Column::UPrimaryVoltage;
    if (!value)
        return false;
    if (isUncertainty ? !(*value > 0.0) : *value < 0.0) {
        error(line, name, std::string(isUncertainty ? "a standard uncertainty must be above zero" : "must be zero or above")
                              + ", got " + printableText(cell, 40));
        return false;
    }
    if (column == Column::PrimaryPowerFactor && *value > 1.0) {
        error(line, name, "a power factor is between 0 and 1, got " + printableText(cell, 40));
        return false;
    }
    if (!isUncertainty && *value > maxReadingValue) {
        error(line, name, "is beyond any bench reading (at most 1e6), got " + printableText(cell, 40));
        return false;
    }
    switch (column) {
    case Column::PrimaryVoltage: primary.voltageV = value; break;
    case Column::PrimaryCurrent: primary.currentA = value; break;
    case Column::PrimaryPower: primary.powerW = value; break;
    case Column::PrimaryPowerFactor: primary.powerFactor = value; break;
    case Column::PrimaryReactivePower: primary.reactivePowerVar = value; break;
    case Column::UPrimaryVoltage: primary.uVoltageV = value; break;
    case Column::UPrimaryCurrent: primary.uCurrentA = value; break;
    case Column::UPrimaryPower: primary.uPowerW = value; break;
    case Column::UPrimaryPowerFactor: primary.uPowerFactor = value; break;
    case Column::UPrimaryReactivePower: primary.uReactivePowerVar = value; break;
    default: break;
    }
    return true;
}

void Parser::parseRow(int line, const std::vector<std::string_view> &cells)
{
    if (cells.size() != m_columns.size()) {
        std::string rule = "has " + std::to_string(cells.size()) + " cells, the header has " + std::to_string(m_columns.size());
        if (m_separator == ',' && cells.size() > m_columns.size())
            rule += "; a number written with a comma, such as 1,250? Cells here are separated by ',', so numbers take "
                    "'.' and no thousands separator (1250 or 1.25); a file with decimal commas separates its cells "
                    "with ';' and may state '# decimal_mark: ,' before the header";
        error(line, "", std::move(rule));
        return;
    }
    Reading reading;
    bool good = true;
    for (std::size_t i = 0; i < cells.size(); ++i) {
        const std::string_view cell = cells[i];
        const std::string &name = m_names[i];
        // A cell quoted in a message: printable and short (a 10 MB cell is not echoed whole).
        const auto quote = [cell] { return printableText(cell, 40); };
        switch (m_columns[i]) {
        case Column::Current:
        case Column::Voltage: {
            const auto value = cell.empty() ? std::nullopt : readNumber(line, name, cell);
            if (cell.empty()) {
                error(line, name, "is empty; a number is required");
                good = false;
            } else if (!value) {
                good = false;
            } else if (*value < 0.0) {
                error(line, name, "must be zero or above (an RMS value), got " + quote());
                good = false;
            } else if (*value > maxReadingValue) {
                error(line, name, "is beyond any bench reading (at most 1e6 V or A), got " + quote());
                good = false;
            } else {
                (m_columns[i] == Column::Current ? reading.currentA : reading.voltageV) = *value;
            }
            break;
        }
        case Column::UCurrent:
        case Column::UVoltage: {
            if (cell.empty())
                break;
            const auto value = readNumber(line, name, cell);
            if (!value) {
                good = false;
            } else if (!(*value > 0.0)) {
                error(line, name, "a standard uncertainty must be above zero, got " + quote());
                good = false;
            } else {
                (m_columns[i] == Column::UCurrent ? reading.uCurrentA : reading.uVoltageV) = *value;
            }
            break;
        }
        case Column::Step: {
            if (cell.empty())
                break;
            int step = -1;
            const auto [end, ec] = std::from_chars(cell.data(), cell.data() + cell.size(), step);
            if (ec != std::errc() || end != cell.data() + cell.size() || step < 0) {
                error(line, name, "must be a whole number of 0 or more, got '" + quote() + "'");
                good = false;
            } else {
                reading.step = step;
            }
            break;
        }
        case Column::Time: reading.timeUtc = cell; break;
        case Column::Flags: {
            const auto flags = parseFlags(cell);
            if (!flags) {
                error(line, name, "unknown flag in '" + quote() + "'; flags are names joined by '|', e.g. unstable|outlier");
                good = false;
            } else {
                reading.flags = *flags;
            }
            break;
        }
        case Column::Provenance: break;
        case Column::PrimaryVoltage:
        case Column::PrimaryCurrent:
        case Column::PrimaryPower:
        case Column::PrimaryPowerFactor:
        case Column::PrimaryReactivePower:
        case Column::UPrimaryVoltage:
        case Column::UPrimaryCurrent:
        case Column::UPrimaryPower:
        case Column::UPrimaryPowerFactor:
        case Column::UPrimaryReactivePower:
            good = parsePrimaryCell(line, name, m_columns[i], cell, reading.primary) && good;
            break;
        case Column::Excluded: {
            const auto excluded = parseBool(cell);
            if (!excluded) {
                error(line, name, "must be true or false, got '" + quote() + "'");
                good = false;
            } else {
                reading.excluded = *excluded;
            }
            break;
        }
        }
    }
    if (good) {
        if (m_keepColumns)
            m_fitColumns.append(reading);
        else
            m_result.readings.push_back(std::move(reading));
        m_result.lineNumbers.push_back(line);
    }
}

ReadingsCsvParse Parser::run(std::string_view text)
{
    if (text.substr(0, 3) == "\xEF\xBB\xBF")
        text.remove_prefix(3);
    bool haveHeader = false;
    bool headerGood = false;
    int lineNumber = 0;
    std::vector<std::string_view> cells;
    std::vector<std::string> unquoted;
    // One reading per line at most: reserving for them all saves growing a large vector.
    // memchr, not std::count: the byte loop std::count compiles to at -O2 took half the
    // parser's own time on a 1e5-row file (perf annotate).
    std::size_t lines = 1;
    for (const char *at = text.data(), *end = text.data() + text.size();
         at < end && (at = static_cast<const char *>(std::memchr(at, '\n', static_cast<std::size_t>(end - at)))) != nullptr;
         ++at)
        ++lines;
    if (m_keepColumns)
        m_fitColumns.reserve(lines);
    else
        m_result.readings.reserve(lines);
    m_result.lineNumbers.reserve(lines);
    while (!text.empty()) {
        const std::size_t end = text.find('\n');
        std::string_view line = text.substr(0, end);
        text = end == std::string_view::npos ? std::string_view() : text.substr(end + 1);
        ++lineNumber;
        if (trimSpace(line).empty())
            continue;
        if (isComment(line)) {
            if (!statementLine(lineNumber, line, haveHeader) && !haveHeader)
                break;
            continue;
        }
        if (!haveHeader)
            m_separator = separatorOf(line);
        if (!splitCells(line, m_separator, cells, unquoted)) {
            error(lineNumber, "", "a double quote is not closed");
            continue;
        }
        if (!haveHeader) {
            haveHeader = true;
            headerGood = parseHeader(lineNumber, cells) && settleDecimalMark(text, lineNumber + 1);
            if (!headerGood)
                break;
            continue;
        }
        parseRow(lineNumber, cells);
    }
    if (!haveHeader && m_result.errors.empty())
        m_result.errors.push_back({"file", "is empty; expected a header row current_a,voltage_v"});
    else if (headerGood && m_result.lineNumbers.empty() && m_result.errors.empty())
        m_result.errors.push_back({"file", "has a header but no readings"});
    if (!m_result.errors.empty()) {
        m_result.readings.clear();
        m_fitColumns.clear();
        m_result.lineNumbers.clear();
    }
    return std::move(m_result);
}

} // namespace

ReadingsCsvParse parseReadingsCsv(std::string_view text)
{
    return Parser().run(text);
}

ReadingsCsvParse loadReadingsCsv(const std::string &path)
{
    const TextFileRead file = readTextFile(path, maxReadingsFileBytes);
    if (!file.text) {
        ReadingsCsvParse result;
        result.errors.push_back({"file", "'" + path + "' " + file.error});
        return result;
    }
    return parseReadingsCsv(*file.text);
}

ReadingColumnsCsvParse parseReadingColumnsCsv(std::string_view text)
{
    Parser parser(true);
    ReadingsCsvParse parsed = parser.run(text);
    ReadingColumnsCsvParse result;
    result.columns = parser.takeColumns();
    result.lineNumbers = std::move(parsed.lineNumbers);
    result.hasCurrentUncertainty = parsed.hasCurrentUncertainty;
    result.hasVoltageUncertainty = parsed.hasVoltageUncertainty;
    result.errors = std::move(parsed.errors);
    return result;
}

ReadingColumnsCsvParse loadReadingColumnsCsv(const std::string &path)
{
    const TextFileRead file = readTextFile(path, maxReadingsFileBytes);
    if (!file.text) {
        ReadingColumnsCsvParse result;
        result.errors.push_back({"file", "'" + path + "' " + file.error});
        return result;
    }
    return parseReadingColumnsCsv(*file.text);
}

} // namespace sagline
