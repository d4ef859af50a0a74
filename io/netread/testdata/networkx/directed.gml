graph [
  directed 1
  node [
    id 0
    label "F&#252;llstand 0"
    group "boiler house"
  ]
  node [
    id 1
    label "flow&#38;temp 1"
    group "north &#38; east"
  ]
  node [
    id 2
    label "F&#252;llstand 2"
    group "pump station"
  ]
  node [
    id 3
    label "F&#252;llstand 3"
    group "pump station"
  ]
  node [
    id 4
    label "flow&#38;temp 4"
    group "boiler house"
  ]
  node [
    id 5
    label "flow&#38;temp 5"
    group "north &#38; east"
  ]
  node [
    id 6
    label "valve 6"
    group "boiler house"
  ]
  node [
    id 7
    label "valve 7"
    group "pump station"
  ]
  node [
    id 8
    label "flow&#38;temp 8"
    group "north &#38; east"
  ]
  node [
    id 9
    label "F&#252;llstand 9"
    group "pump station"
  ]
  node [
    id 10
    label "flow&#38;temp 10"
    group "pump station"
  ]
  node [
    id 11
    label "valve 11"
    group "north &#38; east"
  ]
  node [
    id 12
    label "pump 12"
    group "boiler house"
  ]
  node [
    id 13
    label "F&#252;llstand 13"
    group "north &#38; east"
  ]
  node [
    id 14
    label "tank 14"
    group "pump station"
  ]
  node [
    id 15
    label "valve 15"
    group "pump station"
  ]
  node [
    id 16
    label "pump 16"
    group "boiler house"
  ]
  node [
    id 17
    label "flow&#38;temp 17"
    group "north &#38; east"
  ]
  node [
    id 18
    label "pump 18"
    group "pump station"
  ]
  node [
    id 19
    label "flow&#38;temp 19"
    group "boiler house"
  ]
  node [
    id 20
    label "F&#252;llstand 20"
    group "boiler house"
  ]
  node [
    id 21
    label "F&#252;llstand 21"
    group "north &#38; east"
  ]
  node [
    id 22
    label "flow&#38;temp 22"
    group "boiler house"
  ]
  node [
    id 23
    label "valve 23"
    group "pump station"
  ]
  node [
    id 24
    label "flow&#38;temp 24"
    group "boiler house"
  ]
  node [
    id 25
    label "pump 25"
    group "pump station"
  ]
  node [
    id 26
    label "flow&#38;temp 26"
    group "pump station"
  ]
  node [
    id 27
    label "pump 27"
    group "boiler house"
  ]
  node [
    id 28
    label "pump 28"
    group "boiler house"
  ]
  node [
    id 29
    label "pump 29"
    group "north &#38; east"
  ]
  node [
    id 30
    label "valve 30"
    group "boiler house"
  ]
  node [
    id 31
    label "valve 31"
    group "boiler house"
  ]
  node [
    id 32
    label "flow&#38;temp 32"
    group "boiler house"
  ]
  node [
    id 33
    label "pump 33"
    group "boiler house"
  ]
  node [
    id 34
    label "F&#252;llstand 34"
    group "pump station"
  ]
  node [
    id 35
    label "tank 35"
    group "pump station"
  ]
  node [
    id 36
    label "F&#252;llstand 36"
    group "north &#38; east"
  ]
  node [
    id 37
    label "flow&#38;temp 37"
    group "pump station"
  ]
  node [
    id 38
    label "valve 38"
    group "pump station"
  ]
  node [
    id 39
    label "flow&#38;temp 39"
    group "boiler house"
  ]
  node [
    id 40
    label "spare tank"
    group "north &#38; east"
  ]
  node [
    id 41
    label "spare valve"
    group "north &#38; east"
  ]
  edge [
    source 0
    target 31
    weight 1.0
  ]
  edge [
    source 0
    target 9
    weight 2.0
  ]
  edge [
    source 0
    target 36
    weight 2.0
  ]
  edge [
    source 0
    target 0
    weight 0.5
  ]
  edge [
    source 1
    target 17
    weight 2.0
  ]
  edge [
    source 2
    target 5
    weight 2.0
  ]
  edge [
    source 2
    target 35
    weight 0.5
  ]
  edge [
    source 2
    target 4
    weight -1.5
  ]
  edge [
    source 3
    target 36
    weight 0.5
  ]
  edge [
    source 3
    target 14
    weight 1.0
  ]
  edge [
    source 3
    target 19
    weight 1.0
  ]
  edge [
    source 3
    target 13
    weight 0.5
  ]
  edge [
    source 3
    target 6
    weight 0.5
  ]
  edge [
    source 4
    target 34
    weight 0.5
  ]
  edge [
    source 4
    target 15
    weight -1.5
  ]
  edge [
    source 4
    target 13
    weight -1.5
  ]
  edge [
    source 5
    target 35
    weight 1.0
  ]
  edge [
    source 5
    target 36
    weight 3.0
  ]
  edge [
    source 5
    target 17
    weight 1.0
  ]
  edge [
    source 5
    target 10
    weight -1.5
  ]
  edge [
    source 5
    target 16
    weight 3.0
  ]
  edge [
    source 5
    target 14
    weight 1.0
  ]
  edge [
    source 6
    target 23
    weight 1.0
  ]
  edge [
    source 6
    target 37
    weight -1.5
  ]
  edge [
    source 6
    target 30
    weight -1.5
  ]
  edge [
    source 6
    target 14
    weight 0.5
  ]
  edge [
    source 7
    target 32
    weight -1.5
  ]
  edge [
    source 7
    target 31
    weight -1.5
  ]
  edge [
    source 8
    target 18
    weight 1.0
  ]
  edge [
    source 8
    target 27
    weight 0.5
  ]
  edge [
    source 8
    target 32
    weight 2.0
  ]
  edge [
    source 9
    target 5
    weight 3.0
  ]
  edge [
    source 9
    target 34
    weight 2.0
  ]
  edge [
    source 9
    target 16
    weight 0.5
  ]
  edge [
    source 9
    target 6
    weight 1.0
  ]
  edge [
    source 10
    target 39
    weight 1.0
  ]
  edge [
    source 10
    target 7
    weight -1.5
  ]
  edge [
    source 10
    target 22
    weight 3.0
  ]
  edge [
    source 11
    target 15
    weight 3.0
  ]
  edge [
    source 11
    target 9
    weight 0.5
  ]
  edge [
    source 12
    target 4
    weight 0.5
  ]
  edge [
    source 12
    target 38
    weight 1.0
  ]
  edge [
    source 13
    target 28
    weight 1.0
  ]
  edge [
    source 13
    target 33
    weight -1.5
  ]
  edge [
    source 14
    target 37
    weight 2.0
  ]
  edge [
    source 14
    target 34
    weight 0.5
  ]
  edge [
    source 14
    target 12
    weight 3.0
  ]
  edge [
    source 15
    target 25
    weight 2.0
  ]
  edge [
    source 16
    target 18
    weight 2.0
  ]
  edge [
    source 18
    target 24
    weight -1.5
  ]
  edge [
    source 18
    target 8
    weight 0.5
  ]
  edge [
    source 19
    target 15
    weight 0.5
  ]
  edge [
    source 19
    target 33
    weight 0.5
  ]
  edge [
    source 19
    target 5
    weight 1.0
  ]
  edge [
    source 20
    target 9
    weight 3.0
  ]
  edge [
    source 20
    target 21
    weight 1.0
  ]
  edge [
    source 21
    target 9
    weight 0.5
  ]
  edge [
    source 21
    target 38
    weight 3.0
  ]
  edge [
    source 21
    target 16
    weight 2.0
  ]
  edge [
    source 21
    target 14
    weight 2.0
  ]
  edge [
    source 22
    target 38
    weight 3.0
  ]
  edge [
    source 22
    target 1
    weight -1.5
  ]
  edge [
    source 22
    target 28
    weight 1.0
  ]
  edge [
    source 22
    target 23
    weight 3.0
  ]
  edge [
    source 23
    target 6
    weight -1.5
  ]
  edge [
    source 23
    target 39
    weight 3.0
  ]
  edge [
    source 23
    target 30
    weight 1.0
  ]
  edge [
    source 23
    target 9
    weight -1.5
  ]
  edge [
    source 24
    target 14
    weight 1.0
  ]
  edge [
    source 25
    target 3
    weight 1.0
  ]
  edge [
    source 25
    target 31
    weight 2.0
  ]
  edge [
    source 26
    target 9
    weight 1.0
  ]
  edge [
    source 26
    target 10
    weight 3.0
  ]
  edge [
    source 26
    target 22
    weight 1.0
  ]
  edge [
    source 26
    target 34
    weight 1.0
  ]
  edge [
    source 27
    target 26
    weight 1.0
  ]
  edge [
    source 27
    target 3
    weight 3.0
  ]
  edge [
    source 27
    target 20
    weight 1.0
  ]
  edge [
    source 28
    target 18
    weight -1.5
  ]
  edge [
    source 28
    target 25
    weight -1.5
  ]
  edge [
    source 29
    target 37
    weight 3.0
  ]
  edge [
    source 29
    target 23
    weight 0.5
  ]
  edge [
    source 29
    target 4
    weight -1.5
  ]
  edge [
    source 29
    target 22
    weight 0.5
  ]
  edge [
    source 29
    target 35
    weight 0.5
  ]
  edge [
    source 30
    target 4
    weight 0.5
  ]
  edge [
    source 30
    target 10
    weight 0.5
  ]
  edge [
    source 30
    target 16
    weight 3.0
  ]
  edge [
    source 30
    target 12
    weight 2.0
  ]
  edge [
    source 31
    target 34
    weight 1.0
  ]
  edge [
    source 31
    target 21
    weight -1.5
  ]
  edge [
    source 31
    target 26
    weight 2.0
  ]
  edge [
    source 31
    target 37
    weight -1.5
  ]
  edge [
    source 31
    target 29
    weight 3.0
  ]
  edge [
    source 32
    target 13
    weight -1.5
  ]
  edge [
    source 33
    target 1
    weight 2.0
  ]
  edge [
    source 33
    target 19
    weight 3.0
  ]
  edge [
    source 33
    target 23
    weight 1.0
  ]
  edge [
    source 33
    target 31
    weight 0.5
  ]
  edge [
    source 34
    target 7
    weight 1.0
  ]
  edge [
    source 34
    target 1
    weight 1.0
  ]
  edge [
    source 34
    target 32
    weight -1.5
  ]
  edge [
    source 35
    target 11
    weight 3.0
  ]
  edge [
    source 35
    target 4
    weight 3.0
  ]
  edge [
    source 35
    target 36
    weight 3.0
  ]
  edge [
    source 35
    target 17
    weight 0.5
  ]
  edge [
    source 36
    target 7
    weight 2.0
  ]
  edge [
    source 36
    target 19
    weight 1.0
  ]
  edge [
    source 36
    target 12
    weight 1.0
  ]
  edge [
    source 36
    target 3
    weight 0.5
  ]
  edge [
    source 36
    target 28
    weight 0.5
  ]
  edge [
    source 36
    target 20
    weight 2.0
  ]
  edge [
    source 37
    target 3
    weight -1.5
  ]
  edge [
    source 37
    target 25
    weight -1.5
  ]
  edge [
    source 37
    target 11
    weight 1.0
  ]
  edge [
    source 38
    target 4
    weight 0.5
  ]
  edge [
    source 39
    target 13
    weight 0.5
  ]
  edge [
    source 39
    target 3
    weight 1.0
  ]
  edge [
    source 39
    target 1
    weight 2.0
  ]
  edge [
    source 39
    target 24
    weight 2.0
  ]
  edge [
    source 39
    target 12
    weight 3.0
  ]
]
