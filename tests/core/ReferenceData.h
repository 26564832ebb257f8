// Loads the numeric reference datasets in tests/data (a header row, then comma-separated numbers).
#pragma once

#include <fstream>
#include <sstream>
#include <string>
#include <vector>

namespace sagline::test {

// Columns of a numeric CSV file under SAGLINE_TEST_DATA_DIR; empty on any problem.
inline std::vector<std::vector<double>> loadColumns(const std::string &name)
{
    std::ifstream in(std::string(SAGLINE_TEST_DATA_DIR) + "/" + name);
    std::vector<std::vector<double>> columns;
    std::string line;
    if (!std::getline(in, line))
        return {};
    while (std::getline(in, line)) {
        if (line.empty() || line == "\r")
            continue;
        std::stringstream cells(line);
        std::string cell;
        std::size_t column = 0;
        while (std::getline(cells, cell, ',')) {
            if (columns.size() <= column)
                columns.resize(column + 1);
            columns[column++].push_back(std::stod(cell));
        }
    }
    return columns;
}

} // namespace sagline::test
