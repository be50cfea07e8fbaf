// hedgeleaf: the command-line front end over the same core as the page.
//
//   hedgeleaf <command> FILE|- [--market SNAPSHOT] [--table | --csv]
//   hedgeleaf --version | --vocabulary | --help
//
// Exit codes: 0 done, 2 bad input (one line on stderr naming the field), 1 other failure.
#include "commands/market_reader.hpp"
#include "dispatch/command_table.hpp"
#include "dispatch/dispatch.hpp"
#include "table.hpp"

#include <algorithm>
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>
#include <string>

namespace {

using hedgeleaf::json;

int usage(std::ostream& out, int code) {
    out << "usage: hedgeleaf <command> FILE|- [--market SNAPSHOT] [--table | --csv]\n"
           "commands:";
    std::size_t width = 0;
    for (const auto& d : hedgeleaf::command_table()) {
        out << " " << d.name;
        width = std::max(width, d.name.size());
    }
    out << "\n";
    for (const auto& d : hedgeleaf::command_table())
        out << "  " << d.name << std::string(width + 2 - d.name.size(), ' ') << d.help << "\n";
    out << "  FILE is a trade document (JSON); - reads standard input.\n"
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
    std::ifstream in(path, std::ios::binary);
    if (!in) return false;
    std::ostringstream buf;
    buf << in.rdbuf();
    text = buf.str();
    return true;
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
    if (argc < 3 || argc > 6) return usage(std::cerr, 2);
    const std::string command = argv[1];
    const std::string path = argv[2];
    std::string format = "json";
    std::string market_path;
    for (int i = 3; i < argc; ++i) {
        const std::string flag = argv[i];
        if ((flag == "--table" || flag == "--csv") && format == "json") {
            format = flag.substr(2);
        } else if (flag == "--market" && market_path.empty() && i + 1 < argc) {
            market_path = argv[++i];
        } else {
            std::cerr << "hedgeleaf: unknown or repeated option " << flag
                      << " (use --market SNAPSHOT and one of --table or --csv)\n";
            return 2;
        }
    }
    std::string text, market_text;
    if (!read_input(path, text)) {
        std::cerr << "hedgeleaf: cannot read " << path << "\n";
        return 2;
    }
    if (!market_path.empty() && (market_path == "-" || !read_input(market_path, market_text))) {
        std::cerr << "hedgeleaf: cannot read the market snapshot " << market_path << "\n";
        return 2;
    }
    try {
        json document = hedgeleaf::parse_json_text(text);
        if (!market_path.empty())
            document = hedgeleaf::with_market_snapshot(document, hedgeleaf::parse_json_text(market_text));
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
        std::cerr << e.what() << "\n";  // the same "<field>: <problem>" line the page shows
        return 2;
    } catch (const std::bad_alloc&) {
        std::cerr << "hedgeleaf: out of memory (reduce lattice.steps or paths)\n";
        return 1;
    } catch (const std::exception& e) {
        std::cerr << "hedgeleaf: internal error: " << e.what() << "\n";
        return 1;
    }
}
