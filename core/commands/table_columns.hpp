// Hedgeleaf commands: a result's table, described once as named columns.
//
// A result with rows (hedge dates, simulated frequencies, profile spots) lists its
// columns in order ("columns", which --table and --csv follow) and gives each row
// the same keys in the same order; one list of {name, value} serves both.
#pragma once

#include "commands/json_read.hpp"

#include <optional>
#include <vector>

namespace hedgeleaf {

/// A number, or null where there is none (unbounded, or not given).
inline json number_or_null(const std::optional<double>& x) { return x ? json(*x) : json(nullptr); }

/// One column: its name and a number of the row, or how to write a value that is not one.
template <class Row>
struct column {
    column(const char* name, double Row::*number) : name(name), number(number) {}
    column(const char* name, json (*write)(const Row&)) : name(name), write(write) {}
    json value(const Row& row) const { return write ? write(row) : json(row.*number); }

    const char* name;
    double Row::*number = nullptr;
    json (*write)(const Row&) = nullptr;
};

/// The column names, in order.
template <class Row>
json column_names(const std::vector<column<Row>>& columns) {
    json names = json::array();
    for (const auto& c : columns) names.push_back(c.name);
    return names;
}

/// One row as an object with a key per column, in column order.
template <class Row>
json row_object(const std::vector<column<Row>>& columns, const Row& row) {
    json out = json::object();
    for (const auto& c : columns) out[c.name] = c.value(row);
    return out;
}

/// Every row.
template <class Row>
json row_objects(const std::vector<column<Row>>& columns, const std::vector<Row>& rows) {
    json out = json::array();
    for (const auto& row : rows) out.push_back(row_object(columns, row));
    return out;
}

}  // namespace hedgeleaf
