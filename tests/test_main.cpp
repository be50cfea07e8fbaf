// Catch2 entry point for the Hedgeleaf test binary.
#define CATCH_CONFIG_MAIN
#include <catch2/catch.hpp>
