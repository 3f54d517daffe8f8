//! A small JSON Schema checker for the subset `docs/result.schema.json` uses: `type`, `required`,
//! `properties`, `additionalProperties: false`, `items`, `enum`, `const`, `anyOf`, local `$ref`, and
//! the one `pattern` of the schema (64 lowercase hex digits). Anything else in the schema is an error,
//! so the checker cannot silently ignore a rule.

use serde_json::Value;

/// Errors found, as `path: problem` lines.
pub fn validate(schema: &Value, value: &Value) -> Vec<String> {
    let mut errors = Vec::new();
    check(schema, schema, value, "$", &mut errors);
    errors
}

fn type_ok(t: &str, v: &Value) -> bool {
    match t {
        "object" => v.is_object(),
        "array" => v.is_array(),
        "string" => v.is_string(),
        "number" => v.is_number(),
        "integer" => v.is_u64() || v.is_i64(),
        "boolean" => v.is_boolean(),
        "null" => v.is_null(),
        other => panic!("schema uses an unsupported type {other}"),
    }
}

fn check(root: &Value, s: &Value, v: &Value, path: &str, errors: &mut Vec<String>) {
    let s = s.as_object().expect("schema nodes are objects");
    for key in s.keys() {
        let known = [
            "$schema",
            "$id",
            "title",
            "type",
            "required",
            "properties",
            "additionalProperties",
            "items",
            "enum",
            "const",
            "anyOf",
            "$ref",
            "$defs",
            "pattern",
            "minimum",
        ];
        assert!(
            known.contains(&key.as_str()),
            "schema keyword {key} is not supported by the checker"
        );
    }
    if let Some(r) = s.get("$ref") {
        let name = r
            .as_str()
            .unwrap()
            .strip_prefix("#/$defs/")
            .expect("local $ref");
        check(root, &root["$defs"][name], v, path, errors);
        return;
    }
    if let Some(any) = s.get("anyOf") {
        let ok = any.as_array().unwrap().iter().any(|alt| {
            let mut e = Vec::new();
            check(root, alt, v, path, &mut e);
            e.is_empty()
        });
        if !ok {
            errors.push(format!("{path}: matches none of anyOf"));
        }
        return;
    }
    if let Some(t) = s.get("type").and_then(|t| t.as_str()) {
        if !type_ok(t, v) {
            errors.push(format!("{path}: expected {t}, got {v}"));
            return;
        }
    }
    if let Some(c) = s.get("const") {
        if c != v {
            errors.push(format!("{path}: expected {c}, got {v}"));
        }
    }
    if let Some(e) = s.get("enum") {
        if !e.as_array().unwrap().contains(v) {
            errors.push(format!("{path}: {v} not in {e}"));
        }
    }
    if let Some(m) = s.get("minimum") {
        if v.as_f64().unwrap_or(0.0) < m.as_f64().unwrap() {
            errors.push(format!("{path}: {v} below {m}"));
        }
    }
    if let Some(p) = s.get("pattern") {
        assert_eq!(p, "^[0-9a-f]{64}$", "the checker knows one pattern only");
        let t = v.as_str().unwrap_or("");
        if t.len() != 64
            || !t
                .chars()
                .all(|c| c.is_ascii_hexdigit() && !c.is_ascii_uppercase())
        {
            errors.push(format!("{path}: {t} is not 64 lowercase hex digits"));
        }
    }
    if let Some(obj) = v.as_object() {
        let props = s.get("properties").and_then(|p| p.as_object());
        if let Some(req) = s.get("required") {
            for r in req.as_array().unwrap() {
                if !obj.contains_key(r.as_str().unwrap()) {
                    errors.push(format!("{path}: missing {r}"));
                }
            }
        }
        for (k, x) in obj {
            match props.and_then(|p| p.get(k)) {
                Some(sub) => check(root, sub, x, &format!("{path}.{k}"), errors),
                None => {
                    if s.get("additionalProperties") == Some(&Value::Bool(false)) {
                        errors.push(format!("{path}: unexpected field {k}"));
                    }
                }
            }
        }
    }
    if let (Some(items), Some(a)) = (s.get("items"), v.as_array()) {
        for (i, x) in a.iter().enumerate() {
            check(root, items, x, &format!("{path}[{i}]"), errors);
        }
    }
}
