// Hedgeleaf commands: strict JSON field reading (see json_read.hpp).
#include "commands/json_read.hpp"

#include "contract/limits.hpp"

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <functional>

namespace hedgeleaf {

namespace {
// Edit distance, for the did-you-mean hint on unknown fields.
std::size_t distance(const std::string& a, const std::string& b) {
    std::vector<std::size_t> row(b.size() + 1);
    for (std::size_t j = 0; j <= b.size(); ++j) row[j] = j;
    for (std::size_t i = 1; i <= a.size(); ++i) {
        std::size_t diag = row[0];
        row[0] = i;
        for (std::size_t j = 1; j <= b.size(); ++j) {
            const std::size_t up = row[j];
            row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
            diag = up;
        }
    }
    return row[b.size()];
}
}  // namespace

std::string describe(const json& value) {
    switch (value.type()) {
        case json::value_t::null: return "null";
        case json::value_t::boolean: return value.get<bool>() ? "true" : "false";
        case json::value_t::string: {
            const auto& s = value.get_ref<const std::string&>();
            std::string shown = s.size() > 40 ? shorten(s, 40) + "..." : s;
            return "string \"" + shown + "\"";
        }
        case json::value_t::array: return value.empty() ? "an empty list" : "a list";
        case json::value_t::object: return "an object";
        case json::value_t::number_integer:
        case json::value_t::number_unsigned:
        case json::value_t::number_float: return format_number(value.get<double>());
        default: return "an unreadable value";
    }
}

double as_number(const json& value, const std::string& path) {
    if (value.is_string()) {
        // A number sent as text ("48.2", "1e400"): say what is wrong with it.
        const auto& text = value.get_ref<const std::string&>();
        const bool decimal = !text.empty() && text.size() < 64 &&
                             text.find_first_not_of("0123456789+-.eE") == std::string::npos &&
                             text.find_first_of("0123456789") != std::string::npos;
        char* end = nullptr;
        const double x = decimal ? std::strtod(text.c_str(), &end) : 0.0;
        if (decimal && end == text.c_str() + text.size()) {
            if (!std::isfinite(x))
                fail(path, "must be a finite number, got " + describe(value) + ", too large to hold");
            fail(path, "must be a number, got " + describe(value) + " (write numbers without quotes)");
        }
    }
    if (!value.is_number()) fail(path, "must be a number, got " + describe(value));
    const double x = value.get<double>();
    if (!std::isfinite(x)) fail(path, "must be a finite number, got " + format_number(x));
    return x;
}

field_reader::field_reader(const json& object, std::string path) : object_(object), path_(std::move(path)) {
    if (!object_.is_object()) fail(path_, "must be an object {...}, got " + describe(object_));
    // One rule for null (docs/trade-file.md): it is never a value. A field is given or left out.
    for (auto it = object_.begin(); it != object_.end(); ++it)
        if (it->is_null())
            fail(child(it.key().size() > 60 ? shorten(it.key(), 60) + "..." : it.key()),
                 "is null; leave the field out to use its default, or give a value");
}

bool field_reader::has(const std::string& key) const { return object_.contains(key); }

const json& field_reader::raw(const std::string& key) {
    seen_.insert(key);
    if (!object_.contains(key)) {
        // A near miss among the keys given ("volatilty") is the likely cause; name it here,
        // because finish(), which would flag it as unknown, is never reached.
        for (auto it = object_.begin(); it != object_.end(); ++it)
            if (!seen_.count(it.key()) && it.key().size() <= 60 && distance(it.key(), key) < 3)
                fail(child(key), "is required but missing; \"" + it.key() + "\" looks like a misspelling of it");
        fail(child(key), "is required but missing");
    }
    return object_.at(key);
}

const json* field_reader::raw_optional(const std::string& key) {
    seen_.insert(key);
    if (!has(key)) return nullptr;
    return &object_.at(key);
}

double field_reader::number(const std::string& key) { return as_number(raw(key), child(key)); }

std::optional<double> field_reader::number_optional(const std::string& key) {
    const json* v = raw_optional(key);
    if (!v) return std::nullopt;
    return as_number(*v, child(key));
}

double field_reader::number_or(const std::string& key, double fallback) {
    return number_optional(key).value_or(fallback);
}

long long field_reader::integer_or(const std::string& key, long long fallback, long long lo, long long hi) {
    const json* v = raw_optional(key);
    if (!v) return fallback;
    const double x = as_number(*v, child(key));
    if (x != std::floor(x)) fail(child(key), "must be a whole number, got " + format_number(x));
    if (x < static_cast<double>(lo) || x > static_cast<double>(hi))
        fail(child(key),
             "must be between " + std::to_string(lo) + " and " + std::to_string(hi) + ", got " + format_number(x));
    return static_cast<long long>(x);
}

std::string field_reader::text(const std::string& key, std::size_t max_length) {
    const json& v = raw(key);
    if (!v.is_string()) fail(child(key), "must be text, got " + describe(v));
    const auto& s = v.get_ref<const std::string&>();
    if (s.size() > max_length)
        fail(child(key),
             "is too long (" + std::to_string(s.size()) + " characters, at most " + std::to_string(max_length) + ")");
    return s;
}

std::optional<std::string> field_reader::text_optional(const std::string& key, std::size_t max_length) {
    seen_.insert(key);
    if (!has(key)) return std::nullopt;
    return text(key, max_length);
}

bool field_reader::boolean_or(const std::string& key, bool fallback) {
    const json* v = raw_optional(key);
    if (!v) return fallback;
    if (!v->is_boolean()) fail(child(key), "must be true or false, got " + describe(*v));
    return v->get<bool>();
}

std::string nearest(const std::string& word, const std::vector<std::string>& candidates) {
    std::string best;
    std::size_t best_distance = 3;  // at most two edits away
    if (word.size() > 60) return best;
    for (const auto& c : candidates) {
        const std::size_t d = distance(word, c);
        if (d < best_distance) {
            best_distance = d;
            best = c;
        }
    }
    return best;
}

std::string field_reader::choice(const std::string& key, const std::vector<std::string>& choices) {
    const json& v = raw(key);
    std::string list;
    for (const auto& c : choices) list += (list.empty() ? "" : ", ") + c;
    if (!v.is_string()) fail(child(key), "must be one of " + list + ", got " + describe(v));
    const auto& s = v.get_ref<const std::string&>();
    if (std::find(choices.begin(), choices.end(), s) == choices.end()) {
        const std::string hint = nearest(s, choices);
        fail(child(key), "must be one of " + list + ", got " + describe(v) +
                             (hint.empty() ? std::string() : " (did you mean \"" + hint + "\"?)"));
    }
    return s;
}

std::string field_reader::choice_or(const std::string& key, const std::vector<std::string>& choices,
                                    const std::string& fallback) {
    seen_.insert(key);
    if (!has(key)) return fallback;
    return choice(key, choices);
}

void field_reader::finish() const {
    for (auto it = object_.begin(); it != object_.end(); ++it) {
        if (seen_.count(it.key())) continue;
        std::string key = it.key().size() > 60 ? shorten(it.key(), 60) + "..." : it.key();
        std::string hint;
        std::size_t best = 3;
        for (const auto& known : seen_) {
            const std::size_t d = distance(it.key(), known);
            if (d < best) {
                best = d;
                hint = known;
            }
        }
        fail(join_path(path_, key),
             "unknown field" + (hint.empty() ? std::string() : " (did you mean \"" + hint + "\"?)"));
    }
}

namespace {

// Where the parser is in the document, for naming a key given twice: one frame per open
// object (its keys so far and the key being read) or list (the index of the element).
class key_tracker {
public:
    /// False (and the path in `repeated`) when an object names the same key twice.
    bool operator()(int, json::parse_event_t event, json& parsed) {
        switch (event) {
            case json::parse_event_t::object_start: frames_.push_back({false, 0, {}, ""}); break;
            case json::parse_event_t::array_start: frames_.push_back({true, 0, {}, ""}); break;
            case json::parse_event_t::key: {
                frame& f = frames_.back();
                f.key = parsed.get<std::string>();
                if (!f.keys.insert(f.key).second && repeated.empty()) repeated = path();
                break;
            }
            case json::parse_event_t::object_end:
            case json::parse_event_t::array_end:
                frames_.pop_back();
                next_element();
                break;
            case json::parse_event_t::value: next_element(); break;
        }
        return true;
    }
    std::string repeated;  ///< path of the first key given twice, or ""

private:
    struct frame {
        bool list;
        std::size_t index;
        std::set<std::string> keys;
        std::string key;
    };
    void next_element() {
        if (!frames_.empty() && frames_.back().list) ++frames_.back().index;
    }
    std::string path() const {
        std::string out;
        for (const frame& f : frames_) {
            const std::string key = f.key.size() > 60 ? shorten(f.key, 60) + "..." : f.key;
            out = f.list ? index_path(out, f.index) : join_path(out, key);
        }
        return out;
    }
    std::vector<frame> frames_;
};

}  // namespace

json parse_json_text(const std::string& text, const json_text_words& words) {
    const std::string whole = words.path;
    const std::string document = words.document, json_name = words.json_name;
    if (text.size() > max_document_bytes)
        fail(whole, "the " + document + " is " + std::to_string(text.size()) + " bytes, at most " +
                        std::to_string(max_document_bytes));
    // nlohmann reports empty input as an error at character 1; say what it is.
    if (text.find_first_not_of(" \t\r\n") == std::string::npos)
        fail(whole, "not a valid " + json_name + " (empty input)");
    // Copying and printing a JSON value recurse once per level: a document nested
    // thousands deep would overflow the stack (found by a hand-made 150,000-level
    // object: a crash natively, "maximum call stack size exceeded" in the module).
    // A trade is a few levels deep; refuse deep nesting before building anything.
    int depth = 0;
    bool in_string = false, escaped = false;
    for (const char c : text) {
        if (in_string) {
            if (escaped)
                escaped = false;
            else if (c == '\\')
                escaped = true;
            else if (c == '"')
                in_string = false;
        } else if (c == '"') {
            in_string = true;
        } else if (c == '{' || c == '[') {
            if (++depth > max_document_depth)
                fail(whole, "not a valid " + document + " (nested more than " + std::to_string(max_document_depth) +
                                " levels deep; " + words.one + " needs fewer than 10)");
        } else if (c == '}' || c == ']') {
            --depth;
        }
    }
    key_tracker keys;
    json doc = json::parse(text, std::ref(keys), false);
    if (!doc.is_discarded() && !keys.repeated.empty())
        fail(whole.empty() || keys.repeated[0] == '[' ? whole + keys.repeated : join_path(whole, keys.repeated),
             "is given twice in the same object; give each field once (RFC 8259 section 4, RFC 7493 "
             "section 2.3: names within an object must be unique)");
    if (doc.is_discarded()) {
        try {
            const json unused = json::parse(text);
            (void)unused;
        } catch (const json::parse_error& e) {
            fail(whole, "not a valid " + json_name + " (" +
                            (e.byte > 0 ? "near character " + std::to_string(e.byte) : "empty input") + ")");
        } catch (const json::exception&) {
            // e.g. out_of_range 406 for 1e400: found by tests/fuzz, was an "internal error".
            fail(whole, "not a valid " + json_name + " (a number is too large to read)");
        }
        fail(whole, "not a valid " + json_name);
    }
    return doc;
}

void require_positive(double value, const std::string& path) {
    if (!(value > 0)) fail_bound(path, value, ">", 0);
}
void require_non_negative(double value, const std::string& path) {
    if (!(value >= 0)) fail_bound(path, value, ">=", 0);
}
void require_at_most(double value, double limit, const std::string& path) {
    if (!(value <= limit)) fail_bound(path, value, "<=", limit);
}
void require_at_least(double value, double limit, const std::string& path) {
    if (!(value >= limit)) fail_bound(path, value, ">=", limit);
}

namespace {
// Zero, negative and too large read as they always have ("must be > 0", "must be <= 5"); a
// positive value below the floor names the whole range and why it is there.
void require_between(double value, double lo, double hi, const std::string& path, const std::string& why) {
    require_positive(value, path);
    require_at_most(value, hi, path);
    if (!(value >= lo))
        fail(path, "must be between " + format_number(lo) + " and " + format_number(hi) + why + ", got " +
                       format_number(value));
}
}  // namespace

void require_price_level(double value, const std::string& path) {
    require_between(value, min_price_level, max_price_level, path,
                    " (outside that range a price level is a typo, not a trade)");
}
void require_volatility(double value, const std::string& path) {
    require_between(value, min_volatility, max_volatility, path,
                    " (" + format_number(min_volatility * 100) + " % to " + format_number(max_volatility * 100) +
                        " % a year, as a decimal)");
}
void require_tick(double tick, double spot, const std::string& path) {
    require_between(tick, spot * min_tick_fraction, spot, path,
                    " (from " + format_number(min_tick_fraction) + " of spot " + format_number(spot) + " to spot)");
}

}  // namespace hedgeleaf
