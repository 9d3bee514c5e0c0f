"""Read-only mappings for table rows and prepared jobs.

Hand-written: the standard library has a read-only view (``types.MappingProxyType``) but no
read-only mapping that is still a ``dict`` for ``json.dumps`` and C-speed lookups.
"""
from __future__ import annotations

__all__ = ["FrozenDict", "freeze", "thaw"]


class FrozenDict(dict):
    """A ``dict`` that refuses changes after it is made.

    Examples
    --------
    >>> d = FrozenDict(a=1)
    >>> d["a"], dict(d, b=2)
    (1, {'a': 1, 'b': 2})
    >>> d["a"] = 2
    Traceback (most recent call last):
    ...
    TypeError: this mapping is read-only
    """

    __slots__ = ()

    def _refuse(self, *args, **kwargs):
        raise TypeError("this mapping is read-only")

    __setitem__ = __delitem__ = __ior__ = _refuse
    clear = pop = popitem = setdefault = update = _refuse

    def __copy__(self):
        return self

    def __deepcopy__(self, memo):
        return self

    def __reduce__(self):
        return (FrozenDict, (dict(self),))


def freeze(obj):
    """A read-only copy of JSON-shaped data: dicts become ``FrozenDict``, lists become tuples.

    Examples
    --------
    >>> freeze({"a": [1, {"b": 2}]})
    {'a': (1, {'b': 2})}
    """
    if isinstance(obj, dict):
        return FrozenDict({k: freeze(v) for k, v in obj.items()})
    if isinstance(obj, (list, tuple)):
        return tuple(freeze(v) for v in obj)
    return obj


def thaw(obj):
    """A plain, changeable copy of frozen data: mappings become dicts, tuples become lists.

    Examples
    --------
    >>> thaw(freeze({"a": [1, 2]}))
    {'a': [1, 2]}
    """
    if isinstance(obj, dict):
        return {k: thaw(v) for k, v in obj.items()}
    if isinstance(obj, (list, tuple)):
        return [thaw(v) for v in obj]
    return obj
