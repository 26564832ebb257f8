# sagline_add_layer(<target> [PUBLIC libs...] [PRIVATE libs...] [INCLUDE dirs...])
# One layer's static library: every .c/.cpp in the calling folder (its .h listed too, for IDEs),
# globbed with CONFIGURE_DEPENDS so a new file needs no CMake edit. The folder and INCLUDE are
# its public include path; PUBLIC libraries pass on to its users. A folder with no sources yet
# gives an INTERFACE library, so the layers above it still configure.
function(sagline_add_layer name)
    cmake_parse_arguments(PARSE_ARGV 1 arg "" "" "PUBLIC;PRIVATE;INCLUDE")
    file(GLOB sources CONFIGURE_DEPENDS ${CMAKE_CURRENT_SOURCE_DIR}/*.cpp ${CMAKE_CURRENT_SOURCE_DIR}/*.c)
    file(GLOB headers CONFIGURE_DEPENDS ${CMAKE_CURRENT_SOURCE_DIR}/*.h)
    if(NOT sources)
        add_library(${name} INTERFACE)
        target_include_directories(${name} INTERFACE ${CMAKE_CURRENT_SOURCE_DIR} ${arg_INCLUDE})
        target_link_libraries(${name} INTERFACE ${arg_PUBLIC})
        return()
    endif()
    add_library(${name} STATIC ${sources} ${headers})
    target_include_directories(${name} PUBLIC ${CMAKE_CURRENT_SOURCE_DIR} ${arg_INCLUDE})
    target_link_libraries(${name} PUBLIC ${arg_PUBLIC})
    if(arg_PRIVATE)
        target_link_libraries(${name} PRIVATE ${arg_PRIVATE})
    endif()
    sagline_set_warnings(${name})
endfunction()
