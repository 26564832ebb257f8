# Version and git commit of the build, written into a generated header for --version.
find_package(Git QUIET)
set(SAGLINE_GIT_COMMIT "unknown")
if(GIT_FOUND)
    execute_process(COMMAND ${GIT_EXECUTABLE} rev-parse --short=12 HEAD
                    WORKING_DIRECTORY ${CMAKE_SOURCE_DIR}
                    OUTPUT_VARIABLE _commit OUTPUT_STRIP_TRAILING_WHITESPACE
                    RESULT_VARIABLE _rc ERROR_QUIET)
    if(_rc EQUAL 0 AND _commit)
        set(SAGLINE_GIT_COMMIT "${_commit}")
    endif()
endif()
configure_file(${CMAKE_SOURCE_DIR}/core/BuildInfo.h.in ${CMAKE_BINARY_DIR}/generated/BuildInfo.h @ONLY)
