#include "SqliteStatement.h"

#include <sqlite3.h>

#include <cmath>
#include <limits>
#include <utility>

namespace sagline {

SqliteStatement::~SqliteStatement()
{
    finalize();
}

SqliteStatement::SqliteStatement(SqliteStatement &&other) noexcept
    : m_stmt(std::exchange(other.m_stmt, nullptr)), m_bindError(std::exchange(other.m_bindError, 0))
{
}

SqliteStatement &SqliteStatement::operator=(SqliteStatement &&other) noexcept
{
    if (this != &other) {
        finalize();
        m_stmt = std::exchange(other.m_stmt, nullptr);
        m_bindError = std::exchange(other.m_bindError, 0);
    }
    return *this;
}

void SqliteStatement::finalize() noexcept
{
    if (m_stmt != nullptr)
        sqlite3_finalize(m_stmt); // its code repeats the last step's error, already handled there
    m_stmt = nullptr;
}

int SqliteStatement::prepare(sqlite3 *db, std::string_view sql)
{
    finalize();
    m_bindError = 0;
    if (sql.size() > static_cast<std::size_t>(std::numeric_limits<int>::max()))
        return SQLITE_TOOBIG;
    const int rc = sqlite3_prepare_v2(db, sql.data(), static_cast<int>(sql.size()), &m_stmt, nullptr);
    if (rc != SQLITE_OK)
        finalize();
    else if (m_stmt == nullptr)
        return SQLITE_MISUSE; // empty SQL
    return rc;
}

void SqliteStatement::noteBind(int rc)
{
    if (rc != SQLITE_OK && m_bindError == 0)
        m_bindError = rc;
}

SqliteStatement &SqliteStatement::bind(int index, double value)
{
    if (!std::isfinite(value))
        return bindNull(index);
    noteBind(m_stmt ? sqlite3_bind_double(m_stmt, index, value) : SQLITE_MISUSE);
    return *this;
}

SqliteStatement &SqliteStatement::bind(int index, std::int64_t value)
{
    noteBind(m_stmt ? sqlite3_bind_int64(m_stmt, index, value) : SQLITE_MISUSE);
    return *this;
}

SqliteStatement &SqliteStatement::bind(int index, std::string_view text)
{
    if (!m_stmt) {
        noteBind(SQLITE_MISUSE);
        return *this;
    }
    // SQLITE_TRANSIENT: SQLite copies the bytes, so the caller's buffer may go away.
    noteBind(sqlite3_bind_text64(m_stmt, index, text.data(), text.size(), SQLITE_TRANSIENT, SQLITE_UTF8));
    return *this;
}

SqliteStatement &SqliteStatement::bindUncopied(int index, std::string_view text)
{
    if (!m_stmt) {
        noteBind(SQLITE_MISUSE);
        return *this;
    }
    noteBind(sqlite3_bind_text64(m_stmt, index, text.data(), text.size(), SQLITE_STATIC, SQLITE_UTF8));
    return *this;
}

SqliteStatement &SqliteStatement::bind(int index, const std::optional<double> &value)
{
    return value ? bind(index, *value) : bindNull(index);
}

SqliteStatement &SqliteStatement::bindNull(int index)
{
    noteBind(m_stmt ? sqlite3_bind_null(m_stmt, index) : SQLITE_MISUSE);
    return *this;
}

int SqliteStatement::step()
{
    if (!m_stmt)
        return SQLITE_MISUSE;
    if (m_bindError != 0)
        return m_bindError;
    return sqlite3_step(m_stmt);
}

void SqliteStatement::reset()
{
    if (!m_stmt)
        return;
    // sqlite3_reset repeats the last step's error code, which the caller has already handled.
    sqlite3_reset(m_stmt);
    sqlite3_clear_bindings(m_stmt);
    m_bindError = 0;
}

void SqliteStatement::resetKeepingBindings()
{
    if (!m_stmt)
        return;
    sqlite3_reset(m_stmt); // its code repeats the last step's, already handled
}

bool SqliteStatement::isNull(int column) const
{
    return sqlite3_column_type(m_stmt, column) == SQLITE_NULL;
}

int SqliteStatement::columnType(int column) const
{
    return sqlite3_column_type(m_stmt, column);
}

double SqliteStatement::columnDouble(int column) const
{
    return sqlite3_column_double(m_stmt, column);
}

std::int64_t SqliteStatement::columnInt64(int column) const
{
    return sqlite3_column_int64(m_stmt, column);
}

std::string SqliteStatement::columnText(int column) const
{
    const unsigned char *text = sqlite3_column_text(m_stmt, column);
    if (text == nullptr)
        return {};
    const int bytes = sqlite3_column_bytes(m_stmt, column);
    return std::string(reinterpret_cast<const char *>(text), static_cast<std::size_t>(bytes));
}

std::string_view SqliteStatement::columnTextView(int column) const
{
    const unsigned char *text = sqlite3_column_text(m_stmt, column);
    if (text == nullptr)
        return {};
    return {reinterpret_cast<const char *>(text), static_cast<std::size_t>(sqlite3_column_bytes(m_stmt, column))};
}

std::optional<double> SqliteStatement::columnOptionalDouble(int column) const
{
    if (isNull(column))
        return std::nullopt;
    return columnDouble(column);
}

} // namespace sagline
