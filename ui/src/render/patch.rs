//! Which elements of a block of the calculator's markup changed between two drawings of it, so
//! that the page replaces only those. A model with hundreds of attachments has hundreds of rows
//! in its results (the inputs as modelled, the unit conversions); typing one value changes one
//! row of each and the frequencies, and replacing the whole block would have the browser parse,
//! style and lay out every row again on every answer.
//!
//! Both drawings are read as trees of elements (our own markup: every element closed by an end
//! tag or `/>`, text and attribute values escaped), compared from the top, and each element that
//! differs is replaced whole, unless its start tag is the same and it has no text beside its
//! children, in which case only the children that differ are (see `children` for rows that
//! came or went), when that is cheaper: each replacement costs the page a call into the
//! browser's parser, so an element with many small changes inside is replaced whole. An element is named by its place in document order under the block, which is
//! the order of `querySelectorAll("*")`; the page checks that the block holds as many elements as
//! the old drawing before it replaces anything, and draws the block whole otherwise. (It does not
//! check each target's tag: that cost the page's engine 1.5 KB of its budget, and the browser
//! reads this markup, which has nothing it would move or add, element for element as written.)

/// What to do to the drawn block to make it the new drawing.
#[derive(Clone, Debug, PartialEq)]
pub enum Plan {
    /// Nothing: the two drawings are the same.
    Same,
    /// Replace the block's whole content: the drawings differ at its top level, or a drawing
    /// could not be read as a tree of elements.
    Whole,
    /// Replace these elements.
    Patches {
        /// How many elements the old drawing has under the block, which the page checks
        /// against its own count before replacing anything.
        elements: usize,
        /// The elements to replace, none inside another.
        patches: Vec<Patch>,
    },
}

/// One element to replace.
#[derive(Clone, Debug, PartialEq)]
pub struct Patch {
    /// Its place among the block's elements in document order, from 0.
    pub index: usize,
    /// Its new markup, the element whole.
    pub html: String,
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

/// Adds the patches that make `a`'s children `b`'s, given the same shell; false when `a` itself
/// should be replaced instead (it has no child to patch; never so for the block). The children
/// alike at either end are kept; those between are patched pair by pair when as many came as
/// went (each pair's element replaced whole where that is cheaper than its parts), and otherwise
/// replaced together: the new ones are
/// written in place of the first old one (or, when none went, together with a kept neighbour),
/// and the other old ones replaced by nothing.
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
            let patched = same_shell(old, x, new, y) && children(old, x, new, y, patches);
            if !patched || patches.len() > mark + 1 && y.end - y.start < WHOLE_BELOW {
                patches.truncate(mark);
                patches.push(Patch { index: x.index, html: new[y.start..y.end].to_string() });
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
    patches.push(Patch { index, html: new[from..to].to_string() });
    for x in gone.iter().skip(1) {
        patches.push(Patch { index: x.index, html: String::new() });
    }
    true
}

/// An element whose new markup is shorter than this, bytes, is replaced whole rather than in
/// two or more parts: each replacement is a call into the browser that starts its HTML parser,
/// finds the element's place and invalidates its style, and Chromium's profile of the camera
/// boom's edits (one mass changed: 58 replacements of 7 KB in all, cells of the mode table and
/// lines of the frequency map) put 75 µs on each, most of it whatever the size. So a table's
/// rows that all changed go as one table body, a chart as one drawing, and a long list with one
/// row changed as that row. A round figure, not a fit.
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
