"""Model: the declarations of a job and of a result, and the prepared (read-only) job.

* ``schema``: the field-definition machinery (Field, Record, ListOf, Variants, validate);
* ``job``: THE job model, every field with label, unit, default, limits and help;
* ``job_rules``: ``validate_job``, the structure checked against the job model and the rules that
  span fields; ``gear_constants``, the gear valve fitted to its measured points;
* ``fluid``: a fluid record resolved from its preset and the user's values;
* ``result``: THE result declaration, every key with kind, unit, nullability, label and help;
* ``prepared``: ``prepare(job)``, the validated job with the part tables' data filled in,
  frozen, that every stage reads and none edits.
"""
