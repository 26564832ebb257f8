#include "CliCommands.h"

#include <iostream>

namespace sagline::cli {

int runPlan(const Arguments &)
{
    std::cerr << "sagline-cli plan: not built yet\n";
    return exitRuntimeFailure;
}

} // namespace sagline::cli
