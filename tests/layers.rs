//! The house rule: a module imports only from the layers above it, and no
//! modules import each other in a circle.
//!
//! Every `crate::` and `super::` path in the code of every file under
//! `src/` (comments aside) is read, grouped paths (`crate::{a::x, b::y}`) included, and
//! resolved to the file it names. A path into a layer further down the flow
//! than the file's own fails, and so does a cycle among the files of one
//! layer (across layers the order already rules cycles out). Each failure
//! names the file, the line and the path.
//!
//! The checker is also run on planted sources (a base module importing the
//! state, two files importing each other) to show that it fails on them.

use std::collections::{BTreeMap, BTreeSet};
use std::path::Path;

/// The layers in the order data flows; the first is the top.
const LAYERS: &[&str] = &[
    "base",
    "properties",
    "fits",
    "sample",
    "medium",
    "speciation",
    "solve",
    "state",
    "flow",
    "decisions",
    "output",
    "sheet",
    "chart",
    "main",
];

/// A source file: its module path (`sample::water`; `sample` for
/// `sample/mod.rs`) and its text.
struct Source {
    module: String,
    text: String,
}

/// One `crate::` path found in the code.
struct Import {
    from: String,
    line: usize,
    path: String,
    text: String,
}

/// The module path of a file relative to `src/`.
fn module_of(relative: &str) -> String {
    let trimmed = relative.trim_end_matches(".rs");
    let trimmed = trimmed.trim_end_matches("/mod");
    trimmed.replace('/', "::")
}

/// The layer index of a module path, `None` for the crate root.
fn layer_of(module: &str) -> Option<usize> {
    let top = module.split("::").next()?;
    LAYERS.iter().position(|l| *l == top)
}

/// The text with comments blanked out (line numbers kept). String literals
/// are kept as they are: a `crate::` path inside one is rare enough to be
/// read as code, which errs on the strict side.
fn code_only(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    let mut chars = text.chars().peekable();
    let mut in_string = false;
    let mut block = 0usize;
    while let Some(c) = chars.next() {
        if block > 0 {
            if c == '*' && chars.peek() == Some(&'/') {
                chars.next();
                block -= 1;
            } else if c == '/' && chars.peek() == Some(&'*') {
                chars.next();
                block += 1;
            }
            out.push(if c == '\n' { '\n' } else { ' ' });
            continue;
        }
        if in_string {
            out.push(c);
            if c == '\\' {
                if let Some(n) = chars.next() {
                    out.push(n);
                }
            } else if c == '"' {
                in_string = false;
            }
            continue;
        }
        match c {
            '"' => {
                in_string = true;
                out.push(c);
            }
            '/' if chars.peek() == Some(&'/') => {
                for n in chars.by_ref() {
                    if n == '\n' {
                        out.push('\n');
                        break;
                    }
                }
            }
            '/' if chars.peek() == Some(&'*') => {
                chars.next();
                block = 1;
                out.push(' ');
            }
            _ => out.push(c),
        }
    }
    out
}

/// Expands `a::{b, c::{d, e}}` into `a::b`, `a::c::d`, `a::c::e`.
fn expand(path: &str) -> Vec<String> {
    let Some(open) = path.find('{') else {
        return vec![path.trim().to_string()];
    };
    let prefix = &path[..open];
    let inner = &path[open + 1..path.len().saturating_sub(1)];
    let mut parts = Vec::new();
    let (mut depth, mut start) = (0, 0);
    for (i, c) in inner.char_indices() {
        match c {
            '{' => depth += 1,
            '}' => depth -= 1,
            ',' if depth == 0 => {
                parts.push(&inner[start..i]);
                start = i + 1;
            }
            _ => {}
        }
    }
    parts.push(&inner[start..]);
    parts
        .into_iter()
        .map(str::trim)
        .filter(|p| !p.is_empty())
        .flat_map(|p| expand(&format!("{prefix}{p}")))
        .collect()
}

/// Every path in the code of `source` after `root::` (`root` is `crate`,
/// or `travertine` in the binary) or after `super::`, made absolute.
fn imports_of(source: &Source, root: &str) -> Vec<Import> {
    let mut found = paths_after(source, root, "");
    // `super` of `a::b::c` is `a::b` (of `a::b` in `a/b/mod.rs`, `a`).
    let mut parent: Vec<&str> = source.module.split("::").collect();
    parent.pop();
    let prefix = parent.join("::");
    let prefix = if prefix.is_empty() {
        String::new()
    } else {
        format!("{prefix}::")
    };
    // `use super::*` is the test module of a file taking in its own file.
    found.extend(
        paths_after(source, "super", &prefix)
            .into_iter()
            .filter(|i| !i.path.ends_with('*')),
    );
    found
}

/// Every path after `root::` in the code of `source`, with `prefix` before it.
fn paths_after(source: &Source, root: &str, prefix: &str) -> Vec<Import> {
    let code = code_only(&source.text);
    let lines: Vec<&str> = source.text.lines().collect();
    let marker = format!("{root}::");
    let mut found = Vec::new();
    let mut at = 0;
    while let Some(pos) = code[at..].find(&marker) {
        let start = at + pos;
        at = start + marker.len();
        // `root` must be a whole word.
        let before = code[..start].chars().next_back();
        if before.is_some_and(|c| c.is_alphanumeric() || c == '_') {
            continue;
        }
        let rest = &code[at..];
        let mut end = 0;
        let mut depth = 0;
        for (i, c) in rest.char_indices() {
            match c {
                '{' => depth += 1,
                '}' if depth > 0 => depth -= 1,
                c if depth > 0 || c.is_alphanumeric() || c == '_' || c == ':' => {}
                _ => {
                    end = i;
                    break;
                }
            }
            end = i + c.len_utf8();
        }
        let group = &rest[..end];
        let mut searched = 0;
        for path in expand(group.trim_end_matches(':')) {
            // The line of the path's last name within a group.
            let last = path.rsplit("::").next().unwrap_or("");
            let within = group[searched..].find(last).map_or(0, |i| searched + i);
            searched = within;
            let line = code[..at + within].matches('\n').count() + 1;
            found.push(Import {
                from: source.module.clone(),
                line,
                path: format!("{prefix}{path}"),
                text: lines.get(line - 1).unwrap_or(&"").trim().to_string(),
            });
        }
    }
    found
}

/// The file a path names: the longest module prefix, or where its module
/// re-exports the item (`pub use x::Item` in a `mod.rs`), that submodule.
fn resolve(path: &str, sources: &BTreeMap<String, Source>) -> Option<String> {
    let segments: Vec<&str> = path.split("::").filter(|s| !s.is_empty()).collect();
    let mut best = None;
    for n in 1..=segments.len() {
        let candidate = segments[..n].join("::");
        if sources.contains_key(&candidate) {
            best = Some((candidate, n));
        }
    }
    let (module, n) = best?;
    if let Some(item) = segments.get(n) {
        let text = &sources[&module].text;
        for line in text.lines().map(str::trim) {
            let Some(reexport) = line
                .strip_prefix("pub use ")
                .or_else(|| line.strip_prefix("pub(crate) use "))
            else {
                continue;
            };
            let reexport = reexport.trim_end_matches(';');
            for full in expand(reexport) {
                let names: Vec<&str> = full.split("::").collect();
                let last = names
                    .last()
                    .map(|l| l.split(" as ").last().unwrap_or(l).trim());
                if last == Some(*item) && names.len() > 1 && !full.starts_with("crate::") {
                    let sub = format!("{module}::{}", names[0]);
                    if sources.contains_key(&sub) {
                        return Some(sub);
                    }
                }
            }
        }
    }
    Some(module)
}

/// Every breach of the rule, as a readable line.
fn breaches(sources: &BTreeMap<String, Source>) -> (Vec<String>, usize) {
    let mut problems = Vec::new();
    let mut edges: BTreeMap<String, BTreeSet<String>> = BTreeMap::new();
    let mut count = 0;
    for source in sources.values() {
        let root = if source.module == "main" {
            "travertine"
        } else {
            "crate"
        };
        let Some(own) = layer_of(&source.module) else {
            continue;
        };
        for import in imports_of(source, root) {
            count += 1;
            let Some(target) = resolve(&import.path, sources) else {
                continue;
            };
            let Some(theirs) = layer_of(&target) else {
                continue;
            };
            if theirs > own {
                problems.push(format!(
                    "src/{}: line {}: `{}` reaches down the flow from layer `{}` to layer `{}`: {}",
                    import.from.replace("::", "/"),
                    import.line,
                    import.path,
                    LAYERS[own],
                    LAYERS[theirs],
                    import.text
                ));
            } else if theirs == own && target != import.from {
                edges.entry(import.from.clone()).or_default().insert(target);
            }
        }
    }
    // Cycles among the files of a layer: a depth-first search.
    let mut state: BTreeMap<&str, u8> = BTreeMap::new();
    let mut stack: Vec<&str> = Vec::new();
    fn visit<'a>(
        node: &'a str,
        edges: &'a BTreeMap<String, BTreeSet<String>>,
        state: &mut BTreeMap<&'a str, u8>,
        stack: &mut Vec<&'a str>,
        problems: &mut Vec<String>,
    ) {
        state.insert(node, 1);
        stack.push(node);
        for next in edges.get(node).into_iter().flatten() {
            match state.get(next.as_str()) {
                Some(1) => {
                    let from = stack.iter().position(|n| *n == next).unwrap_or(0);
                    let mut cycle: Vec<&str> = stack[from..].to_vec();
                    cycle.push(next);
                    problems.push(format!("a cycle of imports: {}", cycle.join(" -> ")));
                }
                Some(_) => {}
                None => visit(next, edges, state, stack, problems),
            }
        }
        stack.pop();
        state.insert(node, 2);
    }
    for node in edges.keys() {
        if !state.contains_key(node.as_str()) {
            visit(node, &edges, &mut state, &mut stack, &mut problems);
        }
    }
    (problems, count)
}

fn read_sources(dir: &Path, base: &Path, out: &mut BTreeMap<String, Source>) {
    let mut entries: Vec<_> = std::fs::read_dir(dir)
        .expect("src/ is readable")
        .flatten()
        .map(|e| e.path())
        .collect();
    entries.sort();
    for path in entries {
        if path.is_dir() {
            read_sources(&path, base, out);
        } else if path.extension().is_some_and(|e| e == "rs") {
            let relative = path
                .strip_prefix(base)
                .expect("under src/")
                .to_string_lossy()
                .replace('\\', "/");
            let module = module_of(&relative);
            let text = std::fs::read_to_string(&path).expect("a source file is readable");
            out.insert(module.clone(), Source { module, text });
        }
    }
}

fn planted(files: &[(&str, &str)]) -> BTreeMap<String, Source> {
    files
        .iter()
        .map(|(path, text)| {
            let module = module_of(path);
            (
                module.clone(),
                Source {
                    module,
                    text: text.to_string(),
                },
            )
        })
        .collect()
}

#[test]
fn every_import_points_up_the_flow_and_none_forms_a_cycle() {
    let src = Path::new(env!("CARGO_MANIFEST_DIR")).join("src");
    let mut sources = BTreeMap::new();
    read_sources(&src, &src, &mut sources);
    assert!(sources.len() > 40, "read only {} files", sources.len());
    for module in sources.keys() {
        assert!(
            module == "lib" || layer_of(module).is_some(),
            "src/{module} lies in no layer: add its folder to LAYERS, in the order of the flow"
        );
    }
    let (problems, count) = breaches(&sources);
    assert!(count > 200, "read only {count} crate paths");
    assert!(problems.is_empty(), "\n{}", problems.join("\n"));
}

#[test]
fn a_planted_import_down_the_flow_is_named_with_its_line() {
    let sources = planted(&[
        ("base/mod.rs", "pub mod warning;\n"),
        (
            "base/warning.rs",
            "//! Warnings.\n\n/// crate::state in a comment is not an import.\nuse crate::state::State;\n",
        ),
        ("state/mod.rs", "pub struct State;\n"),
    ]);
    let (problems, count) = breaches(&sources);
    assert_eq!(count, 1, "the comment is not read");
    assert_eq!(problems.len(), 1, "{problems:?}");
    assert!(
        problems[0].contains("src/base/warning: line 4"),
        "{}",
        problems[0]
    );
    assert!(
        problems[0].contains("use crate::state::State;"),
        "{}",
        problems[0]
    );
}

#[test]
fn a_planted_cycle_and_grouped_paths_are_found() {
    let sources = planted(&[
        (
            "sample/mod.rs",
            "pub mod a;\npub mod b;\npub use b::Thing;\n",
        ),
        (
            "sample/a.rs",
            "use crate::{base::units::Unit, sample::Thing};\n",
        ),
        (
            "sample/b.rs",
            "pub struct Thing;\nfn f() { crate::sample::a::g(); }\n",
        ),
        ("base/mod.rs", "pub mod units;\n"),
        ("base/units.rs", "pub struct Unit;\n"),
        (
            "fits/mod.rs",
            "use crate::{\n    base::units::Unit,\n    medium::{Constants, fresh::Basis},\n};\n",
        ),
        ("medium/mod.rs", "pub struct Constants;\n"),
    ]);
    let (problems, _) = breaches(&sources);
    let text = problems.join("\n");
    assert!(
        text.contains("a cycle of imports: sample::a -> sample::b -> sample::a"),
        "{text}"
    );
    assert!(
        text.contains("src/fits: line 3: `medium::Constants`"),
        "{text}"
    );
    assert!(
        text.contains("src/fits: line 3: `medium::fresh::Basis`"),
        "{text}"
    );
    assert_eq!(problems.len(), 3, "{text}");
}
