// hedgeleaf: the command-line front end over the same core as the page.
//
//   hedgeleaf <command> FILE|- [--market SNAPSHOT] [--table | --csv]
//   hedgeleaf compare FILE FILE... [--table | --csv]   (up to four trade files side by side)
//   hedgeleaf --version | --vocabulary | --help
//
// Exit codes: 0 done, 2 bad input (one line on stderr naming the field), 1 other failure.
#include "commands/market_reader.hpp"
#include "dispatch/command_table.hpp"
#include "dispatch/dispatch.hpp"
#include "table.hpp"

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>
#include <string>
#include <vector>

namespace {

using hedgeleaf::json;

// A request estimated at over two seconds says so before it starts, with what makes it long
// (the page shows progress and a Stop button instead). Bad input is left to the run to report.
void say_estimated_time(const std::string& command, const json& document) {
    try {
        const hedgeleaf::work_estimate w = hedgeleaf::find_command(command).estimate(document);
        const double seconds = w.node_updates / hedgeleaf::native_updates_per_second;
        if (!(seconds > 2)) return;
        std::ostringstream text;
        text.precision(seconds < 10 ? 2 : 3);
        text << seconds;
        std::cerr << "hedgeleaf: " << command << " will take about " << text.str() << " s on one core (" << w.what
                  << "); Ctrl-C stops it\n";
    } catch (const std::exception&) {}
}

int usage(std::ostream& out, int code) {
    out << "usage: hedgeleaf <command> FILE|- [--market SNAPSHOT] [--table | --csv]\n"
           "       hedgeleaf compare FILE FILE... [--table | --csv]\n"
           "commands:";
    std::size_t width = 0;
    for (const auto& d : hedgeleaf::command_table()) {
        out << " " << d.name;
        width = std::max(width, d.name.size());
    }
    out << "\n";
    for (const auto& d : hedgeleaf::command_table())
        out << "  " << d.name << std::string(width + 2 - d.name.size(), ' ') << d.help << "\n";
    out << "  FILE is a trade document (JSON); - reads standard input. compare also takes a comparison\n"
           "  document, or several trade files (each one alternative, in the order given).\n"
           "  --market SNAPSHOT prices the trade in a market snapshot file (docs/market.md); the trade then\n"
           "  carries no market of its own.\n"
           "  --table prints for a human, --csv prints the result's rows for a spreadsheet.\n"
           "  hedgeleaf --version prints the engine version.\n"
           "  hedgeleaf --vocabulary prints the words and limits the engine accepts (JSON).\n";
    return code;
}

bool read_input(const std::string& path, std::string& text) {
    if (path == "-") {
        text.assign(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
        return true;
    }
    std::error_code ignored;
    if (std::filesystem::is_directory(path, ignored)) return false;  // (read as empty text otherwise)
    std::ifstream in(path, std::ios::binary);
    if (!in) return false;
    std::ostringstream buf;
    buf << in.rdbuf();
    text = buf.str();
    return true;
}

/// The document to run: the one file's, or several trade files as one comparison.
json document_of(const std::vector<std::string>& paths, const std::vector<std::string>& texts) {
    if (texts.size() == 1) return hedgeleaf::parse_json_text(texts.front());
    json alternatives = json::array();
    for (std::size_t i = 0; i < texts.size(); ++i) {
        try {
            alternatives.push_back(hedgeleaf::parse_json_text(texts[i]));
        } catch (const hedgeleaf::input_error& e) {
            throw hedgeleaf::input_error("", paths[i] + ": " + e.what());
        }
    }
    return json{{hedgeleaf::comparison_key, {{"alternatives", alternatives}}}};
}

/// A refusal inside the comparison built from several files names the file, not the list entry:
/// "b.json: market.spot: ..." for "comparison.alternatives[1].market.spot: ...".
std::string with_file_names(const std::string& message, const std::vector<std::string>& paths) {
    if (paths.size() < 2) return message;
    const std::string list = std::string(hedgeleaf::comparison_key) + ".alternatives[";
    if (message.rfind(list, 0) != 0) return message;
    const std::size_t close = message.find(']', list.size());
    const std::size_t i = std::stoul(message.substr(list.size(), close - list.size()));
    if (i >= paths.size()) return message;
    std::string rest = message.substr(close + 1);
    if (rest.rfind(".", 0) == 0) rest = rest.substr(1);
    if (rest.rfind(": ", 0) == 0) rest = rest.substr(2);
    return paths[i] + ": " + rest;
}

}  // namespace

int main(int argc, char** argv) {
    if (argc == 2 && std::string(argv[1]) == "--version") {
        std::cout << "hedgeleaf " << hedgeleaf::engine_version() << "\n";
        return 0;
    }
    if (argc == 2 && std::string(argv[1]) == "--vocabulary") {
        std::cout << hedgeleaf::vocabulary().dump(2) << "\n";
        return 0;
    }
    if (argc == 2 && (std::string(argv[1]) == "--help" || std::string(argv[1]) == "-h")) return usage(std::cout, 0);
    if (argc < 3) return usage(std::cerr, 2);
    const std::string command = argv[1];
    std::vector<std::string> paths;
    std::string format = "json";
    std::string market_path;
    for (int i = 2; i < argc; ++i) {
        const std::string arg = argv[i];
        if ((arg == "--table" || arg == "--csv") && format == "json") {
            format = arg.substr(2);
        } else if (arg == "--market" && market_path.empty() && i + 1 < argc) {
            market_path = argv[++i];
        } else if (arg.size() > 1 && arg.rfind("--", 0) == 0) {
            std::cerr << "hedgeleaf: unknown or repeated option " << arg
                      << " (use --market SNAPSHOT and one of --table or --csv)\n";
            return 2;
        } else {
            paths.push_back(arg);
        }
    }
    if (paths.empty()) return usage(std::cerr, 2);
    if (paths.size() > 1 && command != "compare") {
        std::cerr << "hedgeleaf: " << command << " takes one file (compare takes several)\n";
        return 2;
    }
    if (!market_path.empty() && command == "compare") {
        std::cerr << "hedgeleaf: compare takes no --market (give each alternative its market)\n";
        return 2;
    }
    std::vector<std::string> texts;
    for (const auto& path : paths) {
        texts.emplace_back();
        if (!read_input(path, texts.back())) {
            std::cerr << "hedgeleaf: cannot read " << path << "\n";
            return 2;
        }
    }
    std::string market_text;
    if (!market_path.empty() && (market_path == "-" || !read_input(market_path, market_text))) {
        std::cerr << "hedgeleaf: cannot read the market snapshot " << market_path << "\n";
        return 2;
    }
    try {
        json document = document_of(paths, texts);
        if (!market_path.empty())
            document = hedgeleaf::with_market_snapshot(
                document, hedgeleaf::parse_json_text(market_text, hedgeleaf::market_snapshot_words));
        say_estimated_time(command, document);
        const json result = hedgeleaf::run_command(command, document);
        if (format == "table") {
            std::cout << hedgeleaf::cli::render_table(result);
        } else if (format == "csv") {
            const std::string csv = hedgeleaf::cli::render_csv(result);
            if (csv.empty()) {
                std::cerr << "hedgeleaf: the " << command << " result has no rows to write as CSV (use --table)\n";
                return 2;
            }
            std::cout << csv;
        } else {
            std::cout << result.dump(2, ' ', false, json::error_handler_t::replace) << "\n";
        }
        return 0;
    } catch (const hedgeleaf::input_error& e) {
        std::cerr << with_file_names(e.what(), paths) << "\n";  // the "<field>: <problem>" line the page shows
        return 2;
    } catch (const std::bad_alloc&) {
        std::cerr << "hedgeleaf: out of memory (reduce lattice.steps or paths)\n";
        return 1;
    } catch (const std::exception& e) {
        std::cerr << "hedgeleaf: internal error: " << e.what() << "\n";
        return 1;
    }
}
