# sagline_set_warnings(target): the project's warning set; errors when SAGLINE_WERROR is on (CI).
function(sagline_set_warnings target)
    target_compile_options(${target} PRIVATE -Wall -Wextra -Wpedantic -Wshadow -Wconversion
                           -Wno-sign-conversion $<$<BOOL:${SAGLINE_WERROR}>:-Werror>)
endfunction()
