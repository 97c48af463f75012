//! A plant's own fault-finding procedure file as loaded and validated
//! (`Procedure::from_json`), then listed on Find fault (`view::fault::symptoms`).
//!
//! Invariant: a file that is refused names a field; a file that is accepted is a procedure
//! a technician can always finish: its start and every branch name a step, an evaluating
//! step branches on each outcome its evaluation can give (or has `otherwise`), a step that
//! only measures has its next step, every path
//! from the start reaches a conclusion without passing a step twice, and every step lies
//! on some path from the start.
#![no_main]

use libfuzzer_sys::fuzz_target;
use loopside::diagnose::{Procedure, StepKind};
use std::collections::BTreeSet;

fuzz_target!(|input: &[u8]| {
    let Ok(text) = std::str::from_utf8(input) else {
        return;
    };
    let p = match Procedure::from_json(text) {
        Ok(p) => p,
        Err(e) => {
            assert!(!e.field.is_empty() && !e.reason.is_empty(), "{e:?}");
            return;
        }
    };
    assert!(
        p.step(&p.start).is_some(),
        "start {} is not a step",
        p.start
    );
    for s in &p.steps {
        for t in s.targets() {
            assert!(p.step(t).is_some(), "step {} goes to missing {t}", s.id);
        }
        match &s.kind {
            StepKind::Measure {
                evaluate: Some(e), ..
            } => {
                for o in e.outcomes() {
                    assert!(
                        s.next_for(o).is_some(),
                        "step {} has no branch for {o}",
                        s.id
                    );
                }
            }
            StepKind::Measure { evaluate: None, .. } => {
                assert!(
                    s.next_for("otherwise").is_some(),
                    "step {} has no next step",
                    s.id
                );
            }
            _ => {}
        }
    }
    // Every path ends at a conclusion without a repeat: walk all paths (the steps form a
    // graph without loops, so the walk ends), counting steps seen.
    let mut seen = BTreeSet::new();
    let mut stack = vec![(p.start.as_str(), 0usize)];
    let mut walked = 0usize;
    while let Some((id, depth)) = stack.pop() {
        walked += 1;
        if walked > 100_000 {
            break; // Wide graphs have many paths; the depth bound below still applies.
        }
        assert!(
            depth < p.steps.len(),
            "a path from the start passes a step twice"
        );
        let step = p.step(id).expect("checked above");
        seen.insert(id);
        match &step.kind {
            StepKind::Conclusion { .. } => assert!(step.targets().is_empty()),
            _ => {
                assert!(!step.targets().is_empty(), "step {id} leads nowhere");
                stack.extend(step.targets().into_iter().map(|t| (t, depth + 1)));
            }
        }
    }
    if walked <= 100_000 {
        assert_eq!(seen.len(), p.steps.len(), "a step cannot be reached");
    }
    let listed = loopside::view::fault::symptoms(std::slice::from_ref(&p));
    assert!(
        !listed.is_empty(),
        "an accepted procedure is offered on Find fault"
    );
});
