//! Which elements of a block of the calculator's markup changed between two drawings of it, so
//! that the page replaces only those. A model with hundreds of attachments has hundreds of rows
//! in its results (the inputs as modelled, the unit conversions); typing one value changes one
//! row of each and the frequencies, and replacing the whole block would have the browser parse,
//! style and lay out every row again on every answer.
//!
//! Both drawings are read as trees of elements (our own markup: every element closed, text and
//! attribute values escaped, no element without an end tag or `/>`), compared from the top, and each element that differs is replaced
//! whole, unless its start tag and the text around its children are the same, in which case only
//! the children that differ are (or the element whole, when most of its children changed: one
//! replacement is then cheaper than many). An element is named by its place in document order
//! under the block, which is the order of `querySelectorAll("*")`; the page checks the count and
//! each target's tag before it replaces anything, and draws the block whole otherwise.

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

/// When more children than this changed, and more than half of them, the parent is replaced
/// whole.
const FEW: usize = 4;

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

/// Whether two elements have the same start tag, the same number of children and the same text
/// around them, so that only their children can differ.
fn same_shell(old: &str, a: &Node, new: &str, b: &Node) -> bool {
    if old[a.start..a.open_end] != new[b.start..b.open_end] || a.children.len() != b.children.len() {
        return false;
    }
    // The text before each child, and after the last.
    let (mut x, mut y) = (a.open_end, b.open_end);
    for (c, d) in a.children.iter().zip(&b.children) {
        if old[x..c.start] != new[y..d.start] {
            return false;
        }
        (x, y) = (c.end, d.end);
    }
    old[x..a.close_start] == new[y..b.close_start]
}

/// Adds the patches that make `a`'s children `b`'s, given the same shell; false when `a` itself
/// should be replaced instead (most of its children changed). Never false for the block.
fn children(old: &str, a: &Node, new: &str, b: &Node, patches: &mut Vec<Patch>) -> bool {
    let pairs = || a.children.iter().zip(&b.children);
    let differ = |x: &Node, y: &Node| old[x.start..x.end] != new[y.start..y.end];
    let changed = pairs().filter(|(x, y)| differ(x, y)).count();
    let block = a.tag.0 == a.tag.1;
    if !block && changed > FEW && 2 * changed > a.children.len() {
        return false;
    }
    for (x, y) in pairs() {
        if differ(x, y) && !(same_shell(old, x, new, y) && children(old, x, new, y, patches)) {
            patches.push(Patch { index: x.index, html: new[y.start..y.end].to_string() });
        }
    }
    true
}

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
        let end = tag_end(bytes, start)?;
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

/// Where the tag at `start` ends (just past its `>`), skipping quoted attribute values.
fn tag_end(bytes: &[u8], start: usize) -> Option<usize> {
    let mut quote = 0;
    for (i, &b) in bytes.iter().enumerate().skip(start + 1) {
        if quote != 0 {
            if b == quote {
                quote = 0;
            }
        } else if b == b'"' || b == b'\'' {
            quote = b;
        } else if b == b'>' {
            return Some(i + 1);
        }
    }
    None
}

#[cfg(test)]
mod tests;
