//! What changed between two drawings of a block of the calculator's markup, as the fewest and
//! cheapest changes to the drawn block. A model with hundreds of attachments has hundreds of rows
//! in its results (the inputs as modelled, the unit conversions), and typing one value changes
//! every frequency, margin and line of the plot: replacing the elements that changed would have
//! the browser parse, style and lay out all of them again on every answer.
//!
//! Both drawings are read as trees of elements (our own markup: every element closed by an end
//! tag or `/>`, text and attribute values escaped) and compared from the top. Where an element
//! differs but keeps its tag name, it is kept and changed in place: its attributes that differ
//! are set or removed, its text is set where it holds text only, and its children are compared
//! in turn where it holds elements only (see `children` for rows that came or went). Setting a
//! text or an attribute starts no parser and leaves the element's style as it was, unless a rule
//! reads that attribute. An element whose tag name changed, or which holds text beside elements,
//! is replaced whole. An element is named by its place in document order under the block, which
//! is the order of `querySelectorAll("*")`; the page checks that the block holds as many elements
//! as the old drawing before it changes anything, and draws the block whole otherwise. (It does
//! not check each target's tag: that cost the page's engine 1.5 KB of its budget, and the browser
//! reads this markup, which has nothing it would move or add, element for element as written.)

/// What to do to the drawn block to make it the new drawing.
#[derive(Clone, Debug, PartialEq)]
pub enum Plan {
    /// Nothing: the two drawings are the same.
    Same,
    /// Replace the block's whole content: the drawings differ at its top level, or a drawing
    /// could not be read as a tree of elements.
    Whole,
    /// Change these elements.
    Patches {
        /// How many elements the old drawing has under the block, which the page checks
        /// against its own count before changing anything.
        elements: usize,
        /// The changes, none inside an element that another replaces.
        patches: Vec<Patch>,
    },
}

/// One change to one element.
#[derive(Clone, Debug, PartialEq)]
pub struct Patch {
    /// The element's place among the block's elements in document order, from 0.
    pub index: usize,
    /// What to do to it.
    pub edit: Edit,
}

/// What to do to an element.
#[derive(Clone, Debug, PartialEq)]
pub enum Edit {
    /// Replace it whole by this markup (one element, several, or none).
    Replace(String),
    /// Make its content this text (unescaped): it held text only, and holds text only.
    Text(String),
    /// Set this attribute to this value (unescaped).
    Set(String, String),
    /// Remove this attribute.
    Remove(String),
}

impl Patch {
    fn replace(index: usize, html: &str) -> Patch {
        Patch { index, edit: Edit::Replace(html.to_string()) }
    }
}

/// An element of a drawing: where it lies in the text, and its children.
#[derive(Debug)]
struct Node {
    /// Where its tag name lies in the text (empty for the block).
    tag: (usize, usize),
    /// Document-order place under the block (the block itself is not counted).
    index: usize,
    /// From its `<` to the end of its start tag.
    start: usize,
    open_end: usize,
    /// Where its end tag starts, and where the element ends (both `open_end` for a void or
    /// self-closed element).
    close_start: usize,
    end: usize,
    children: Vec<Node>,
}

/// A drawing of a block, read once as a tree of elements: the next drawing is compared with it.
#[derive(Debug)]
pub struct Drawing {
    text: String,
    /// The tree and its number of elements; `None` when the text is not well formed.
    tree: Option<(Node, usize)>,
}

impl Drawing {
    /// Reads a drawing.
    pub fn new(text: String) -> Drawing {
        let tree = parse(&text);
        Drawing { text, tree }
    }

    /// The drawing's markup.
    pub fn text(&self) -> &str {
        &self.text
    }
}

/// The plan that turns the drawing `old` into `new`.
pub fn plan(old: &Drawing, new: &Drawing) -> Plan {
    if old.text == new.text {
        return Plan::Same;
    }
    let (Some((old_tree, elements)), Some((new_tree, _))) = (&old.tree, &new.tree) else {
        return Plan::Whole;
    };
    let (old, new) = (old.text.as_str(), new.text.as_str());
    let mut patches = Vec::new();
    if !same_shell(old, old_tree, new, new_tree) {
        return Plan::Whole;
    }
    children(old, old_tree, new, new_tree, &mut patches);
    Plan::Patches { elements: *elements, patches }
}

/// Whether two elements have the same start tag and no text between their children (none
/// before the first or after the last either), so that their children can be patched.
fn same_shell(old: &str, a: &Node, new: &str, b: &Node) -> bool {
    old[a.start..a.open_end] == new[b.start..b.open_end] && bare(a) && bare(b)
}

/// Whether an element's children fill it with no text between them.
fn bare(n: &Node) -> bool {
    let mut at = n.open_end;
    for c in &n.children {
        if c.start != at {
            return false;
        }
        at = c.end;
    }
    at == n.close_start
}

/// Adds the patches that make `a`'s children `b`'s, given that neither holds text beside its
/// children; false when `a` itself should be replaced instead (it has no child to patch; never
/// so for the block). The children alike at either end are kept; those between are changed pair
/// by pair when as many came as went (in place where they can be, see `in_place`; whole where
/// that is cheaper than several replacements inside), and otherwise replaced together: the new
/// ones are written in place of the first old one (or, when none went, together with a kept
/// neighbour), and the other old ones replaced by nothing.
fn children(old: &str, a: &Node, new: &str, b: &Node, patches: &mut Vec<Patch>) -> bool {
    let (xs, ys) = (&a.children, &b.children);
    let same = |i: usize, j: usize| old[xs[i].start..xs[i].end] == new[ys[j].start..ys[j].end];
    let shortest = xs.len().min(ys.len());
    let mut head = 0;
    while head < shortest && same(head, head) {
        head += 1;
    }
    let mut tail = 0;
    while head + tail < shortest && same(xs.len() - 1 - tail, ys.len() - 1 - tail) {
        tail += 1;
    }
    let (gone, came) = (&xs[head..xs.len() - tail], &ys[head..ys.len() - tail]);
    if xs.is_empty() {
        return false;
    }
    if gone.len() == came.len() {
        for (x, y) in gone.iter().zip(came) {
            if old[x.start..x.end] == new[y.start..y.end] {
                continue;
            }
            let mark = patches.len();
            let changed = in_place(old, x, new, y, patches);
            let replaced = patches[mark..].iter().filter(|p| matches!(p.edit, Edit::Replace(_))).count();
            if !changed || replaced > 1 && y.end - y.start < WHOLE_BELOW {
                patches.truncate(mark);
                patches.push(Patch::replace(x.index, &new[y.start..y.end]));
            }
        }
        return true;
    }
    // The new children's text, with the kept neighbour they are written with when none went
    // (the one before them, or else the one after).
    let (from, to) = match (came.first(), came.last()) {
        (Some(first), Some(last)) => (first.start, last.end),
        _ => (0, 0),
    };
    let (index, from, to) = match gone.first() {
        Some(first) => (first.index, from, to),
        None if head > 0 => (xs[head - 1].index, ys[head - 1].start, to),
        None => (xs[head].index, from, ys[head + came.len()].end),
    };
    patches.push(Patch::replace(index, &new[from..to]));
    for x in gone.iter().skip(1) {
        patches.push(Patch::replace(x.index, ""));
    }
    true
}

/// Adds the changes that make element `a` element `b` in place; false when `a` should be
/// replaced whole instead: its tag name changed, or it holds text beside elements and that
/// changed, or an attribute or a text could not be read.
fn in_place(old: &str, a: &Node, new: &str, b: &Node, patches: &mut Vec<Patch>) -> bool {
    if old[a.tag.0..a.tag.1] != new[b.tag.0..b.tag.1] {
        return false;
    }
    if old[a.start..a.open_end] != new[b.start..b.open_end] {
        let (Some(was), Some(now)) =
            (attributes(&old[a.tag.1..a.open_end]), attributes(&new[b.tag.1..b.open_end]))
        else {
            return false;
        };
        for &(name, value) in &now {
            if !was.contains(&(name, value)) {
                let Some(value) = unescape(value) else { return false };
                patches.push(Patch { index: a.index, edit: Edit::Set(name.to_string(), value) });
            }
        }
        for &(name, _) in &was {
            if !now.iter().any(|&(n, _)| n == name) {
                patches.push(Patch { index: a.index, edit: Edit::Remove(name.to_string()) });
            }
        }
    }
    let (was, now) = (&old[a.open_end..a.close_start], &new[b.open_end..b.close_start]);
    if was == now {
        return true;
    }
    if a.children.is_empty() && b.children.is_empty() {
        let Some(text) = unescape(now) else { return false };
        patches.push(Patch { index: a.index, edit: Edit::Text(text) });
        return true;
    }
    (bare(a) && bare(b) || same_gaps(old, a, new, b)) && children(old, a, new, b, patches)
}

/// Whether two elements hold as many children, with the same text (or none) between them and
/// at either end, so that their children can be changed pair by pair and the text left as it is.
fn same_gaps(old: &str, a: &Node, new: &str, b: &Node) -> bool {
    // The text before child `i` (after the last child for `i` = their number).
    let gap = |n: &Node, i: usize| {
        let from = if i == 0 { n.open_end } else { n.children[i - 1].end };
        (from, n.children.get(i).map_or(n.close_start, |c| c.start))
    };
    a.children.len() == b.children.len()
        && (0..=a.children.len()).all(|i| {
            let ((p, q), (r, t)) = (gap(a, i), gap(b, i));
            old[p..q] == new[r..t]
        })
}

/// The attributes of a start tag, from just after its name to its end (`>` or `/>`), as
/// (name, value as written); a bare name has the empty value. `None` for anything our markup
/// never writes.
fn attributes(tag: &str) -> Option<Vec<(&str, &str)>> {
    let mut out = Vec::new();
    let mut rest = tag.strip_suffix('>')?;
    rest = rest.strip_suffix('/').unwrap_or(rest);
    loop {
        rest = rest.trim_start();
        if rest.is_empty() {
            return Some(out);
        }
        let name_end = rest.find(|c: char| c == '=' || c.is_ascii_whitespace()).unwrap_or(rest.len());
        let name = &rest[..name_end];
        if name.is_empty()
            || !name.bytes().all(|c| c.is_ascii_alphanumeric() || c == b'-' || c == b':' || c == b'_')
        {
            return None;
        }
        rest = &rest[name_end..];
        let Some(after) = rest.strip_prefix('=') else {
            out.push((name, ""));
            continue;
        };
        let quote = after.chars().next().filter(|&q| q == '"' || q == '\'')?;
        let close = after[1..].find(quote)?;
        out.push((name, &after[1..1 + close]));
        rest = &after[2 + close..];
    }
}

/// Text or an attribute value as the browser reads it: the escapes [`super::escape`] writes
/// undone. `None` for any other reference (our markup has none), so that the element is
/// replaced and the browser reads it instead.
fn unescape(raw: &str) -> Option<String> {
    let mut out = String::with_capacity(raw.len());
    let mut rest = raw;
    while let Some(at) = rest.find('&') {
        out.push_str(&rest[..at]);
        rest = &rest[at..];
        let (c, len) = [("&amp;", '&'), ("&lt;", '<'), ("&gt;", '>'), ("&quot;", '"'), ("&#39;", '\'')]
            .into_iter()
            .find(|(e, _)| rest.starts_with(e))
            .map(|(e, c)| (c, e.len()))?;
        out.push(c);
        rest = &rest[len..];
    }
    out.push_str(rest);
    Some(out)
}

/// An element whose new markup is shorter than this, bytes, is replaced whole rather than by two
/// or more replacements inside it: each replacement is a call into the browser that starts its
/// HTML parser, finds the element's place and invalidates its style, and Chromium's profile of
/// the camera boom's edits (58 replacements of 7 KB in all) put 75 µs on each, most of it
/// whatever the size. Texts and attributes set in place do not count: they start no parser.
/// A round figure, not a fit.
const WHOLE_BELOW: usize = 8_000;

/// Reads a drawing as a tree under an unnamed block; with the number of elements. `None` when
/// it is not well formed as our markup always is: every element closed by an end tag or `/>`
/// (the results hold no element without one), no comment.
fn parse(text: &str) -> Option<(Node, usize)> {
    let bytes = text.as_bytes();
    let mut stack = vec![Node {
        tag: (0, 0),
        index: usize::MAX,
        start: 0,
        open_end: 0,
        close_start: 0,
        end: 0,
        children: Vec::new(),
    }];
    let mut count = 0;
    let mut at = 0;
    while at < bytes.len() {
        if bytes[at] != b'<' {
            at += 1;
            continue;
        }
        let start = at;
        // Our markup escapes `>` in attribute values as in text, so the first `>` ends the tag.
        let end = start + 1 + text[start..].find('>')?;
        let next = *bytes.get(start + 1)?;
        if next == b'/' {
            let mut node = stack.pop()?;
            if stack.is_empty() || bytes[node.tag.0..node.tag.1] != bytes[start + 2..end - 1] {
                return None;
            }
            node.close_start = start;
            node.end = end;
            stack.last_mut()?.children.push(node);
        } else if next.is_ascii_alphabetic() {
            let mut name_end = start + 1;
            while bytes[name_end].is_ascii_alphanumeric() {
                name_end += 1;
            }
            let node = Node {
                tag: (start + 1, name_end),
                index: count,
                start,
                open_end: end,
                close_start: end,
                end,
                children: Vec::new(),
            };
            count += 1;
            if bytes[end - 2] == b'/' {
                stack.last_mut()?.children.push(node);
            } else {
                stack.push(node);
            }
        } else {
            // A comment, a doctype or a `<` that starts no tag: none is in our markup.
            return None;
        }
        at = end;
    }
    let mut root = stack.pop()?;
    if !stack.is_empty() {
        return None;
    }
    root.close_start = text.len();
    root.end = text.len();
    Some((root, count))
}

#[cfg(test)]
mod tests;
