graph [
  directed 1
  multigraph 1
  node [
    id 0
    label "a"
    group "boiler house"
  ]
  node [
    id 1
    label "b"
    group "pump station"
  ]
  node [
    id 2
    label "c"
    group "boiler house"
  ]
  node [
    id 3
    label "d"
    group "north &#38; east"
  ]
  edge [
    source 0
    target 1
    key 0
    weight 2.0
  ]
  edge [
    source 0
    target 1
    key 1
    weight 1.0
  ]
  edge [
    source 1
    target 2
    key 0
    weight 1.0
  ]
  edge [
    source 2
    target 0
    key 0
    weight 1.0
  ]
  edge [
    source 2
    target 0
    key 1
    weight -1.5
  ]
  edge [
    source 2
    target 0
    key 2
    weight 2.0
  ]
  edge [
    source 3
    target 3
    key 0
    weight 0.5
  ]
]
