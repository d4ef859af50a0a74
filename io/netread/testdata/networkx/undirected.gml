graph [
  node [
    id 0
    label "flow&#38;temp 0"
    group "boiler house"
  ]
  node [
    id 1
    label "valve 1"
    group "boiler house"
  ]
  node [
    id 2
    label "pump 2"
    group "pump station"
  ]
  node [
    id 3
    label "tank 3"
    group "north &#38; east"
  ]
  node [
    id 4
    label "valve 4"
    group "pump station"
  ]
  node [
    id 5
    label "F&#252;llstand 5"
    group "north &#38; east"
  ]
  node [
    id 6
    label "tank 6"
    group "boiler house"
  ]
  node [
    id 7
    label "flow&#38;temp 7"
    group "north &#38; east"
  ]
  node [
    id 8
    label "flow&#38;temp 8"
    group "north &#38; east"
  ]
  node [
    id 9
    label "valve 9"
    group "north &#38; east"
  ]
  node [
    id 10
    label "flow&#38;temp 10"
    group "boiler house"
  ]
  node [
    id 11
    label "pump 11"
    group "pump station"
  ]
  node [
    id 12
    label "pump 12"
    group "pump station"
  ]
  node [
    id 13
    label "F&#252;llstand 13"
    group "boiler house"
  ]
  node [
    id 14
    label "tank 14"
    group "north &#38; east"
  ]
  node [
    id 15
    label "tank 15"
    group "pump station"
  ]
  node [
    id 16
    label "pump 16"
    group "boiler house"
  ]
  node [
    id 17
    label "pump 17"
    group "pump station"
  ]
  node [
    id 18
    label "flow&#38;temp 18"
    group "boiler house"
  ]
  node [
    id 19
    label "pump 19"
    group "pump station"
  ]
  node [
    id 20
    label "F&#252;llstand 20"
    group "north &#38; east"
  ]
  node [
    id 21
    label "pump 21"
    group "boiler house"
  ]
  node [
    id 22
    label "tank 22"
    group "north &#38; east"
  ]
  node [
    id 23
    label "tank 23"
    group "north &#38; east"
  ]
  node [
    id 24
    label "valve 24"
    group "pump station"
  ]
  edge [
    source 0
    target 19
    weight -1.5
  ]
  edge [
    source 0
    target 23
    weight 3.0
  ]
  edge [
    source 0
    target 24
    weight 0.5
  ]
  edge [
    source 0
    target 8
    weight 3.0
  ]
  edge [
    source 0
    target 4
    weight 0.5
  ]
  edge [
    source 1
    target 9
    weight 0.5
  ]
  edge [
    source 1
    target 4
    weight 0.5
  ]
  edge [
    source 2
    target 18
    weight 0.5
  ]
  edge [
    source 2
    target 5
    weight 2.0
  ]
  edge [
    source 2
    target 15
    weight -1.5
  ]
  edge [
    source 2
    target 11
    weight 2.0
  ]
  edge [
    source 2
    target 13
    weight -1.5
  ]
  edge [
    source 3
    target 11
    weight 3.0
  ]
  edge [
    source 3
    target 18
    weight -1.5
  ]
  edge [
    source 3
    target 9
    weight -1.5
  ]
  edge [
    source 4
    target 17
    weight -1.5
  ]
  edge [
    source 4
    target 7
    weight 3.0
  ]
  edge [
    source 4
    target 20
    weight 0.5
  ]
  edge [
    source 4
    target 14
    weight 3.0
  ]
  edge [
    source 5
    target 22
    weight 3.0
  ]
  edge [
    source 6
    target 22
    weight 0.5
  ]
  edge [
    source 6
    target 15
    weight 2.0
  ]
  edge [
    source 6
    target 20
    weight 3.0
  ]
  edge [
    source 7
    target 18
    weight 0.5
  ]
  edge [
    source 7
    target 17
    weight -1.5
  ]
  edge [
    source 8
    target 15
    weight 0.5
  ]
  edge [
    source 8
    target 21
    weight 1.0
  ]
  edge [
    source 8
    target 18
    weight 0.5
  ]
  edge [
    source 9
    target 20
    weight -1.5
  ]
  edge [
    source 10
    target 21
    weight 3.0
  ]
  edge [
    source 10
    target 22
    weight -1.5
  ]
  edge [
    source 11
    target 19
    weight 2.0
  ]
  edge [
    source 11
    target 17
    weight 0.5
  ]
  edge [
    source 12
    target 20
    weight 2.0
  ]
  edge [
    source 12
    target 16
    weight 2.0
  ]
  edge [
    source 12
    target 22
    weight 1.0
  ]
  edge [
    source 12
    target 13
    weight 3.0
  ]
  edge [
    source 12
    target 18
    weight 1.0
  ]
  edge [
    source 13
    target 24
    weight 3.0
  ]
  edge [
    source 13
    target 16
    weight 1.0
  ]
  edge [
    source 13
    target 18
    weight 2.0
  ]
  edge [
    source 15
    target 20
    weight -1.5
  ]
  edge [
    source 15
    target 17
    weight -1.5
  ]
  edge [
    source 17
    target 18
    weight 1.0
  ]
  edge [
    source 18
    target 24
    weight 2.0
  ]
  edge [
    source 18
    target 23
    weight -1.5
  ]
  edge [
    source 19
    target 23
    weight 2.0
  ]
  edge [
    source 19
    target 21
    weight 1.0
  ]
  edge [
    source 20
    target 22
    weight -1.5
  ]
  edge [
    source 21
    target 24
    weight 1.0
  ]
]
